// The pressmark console. Reads the JSON endpoints with the tokens the person types in, builds every
// node with createElement and textContent (nothing is parsed from strings except the server's own
// SVG charts, through DOMParser as XML), and keeps tokens in sessionStorage only.
'use strict';

(function () {
  const KEY_METRICS = ['accuracy', 'f1'];
  const METRIC_NAMES = {
    accuracy: 'accuracy', balanced_accuracy: 'balanced accuracy', sensitivity: 'sensitivity', specificity: 'specificity',
    precision: 'precision', npv: 'NPV', f1: 'F1', mcc: 'MCC', kappa: 'kappa', roc_auc: 'ROC AUC', pr_auc: 'PR AUC'
  };
  const EXPLAIN_DELAY_MS = 250;
  const EXPLAIN_FEATURES = 8;
  const CHART_FEATURES = 8;
  const SAME = 0.0005;
  const MINUS = '\u2212';

  const state = { models: [], model: null, detail: null, versions: [], details: new Map(), chosen: null, explainSeq: 0 };

  // ---- small DOM helpers -------------------------------------------------------------------
  const $ = (id) => document.getElementById(id);

  function el(tag, attrs, ...children) {
    const node = document.createElement(tag);
    for (const [name, value] of Object.entries(attrs || {})) {
      if (value === null || value === undefined || value === false) continue;
      if (name === 'class') node.className = value;
      else if (name === 'text') node.textContent = value;
      else if (name.startsWith('on')) node.addEventListener(name.slice(2), value);
      else node.setAttribute(name, value === true ? '' : String(value));
    }
    for (const child of children) {
      if (child === null || child === undefined) continue;
      node.append(child instanceof Node ? child : document.createTextNode(String(child)));
    }
    return node;
  }

  function fixed(value, digits) {
    return typeof value === 'number' && isFinite(value) ? value.toFixed(digits) : '–';
  }

  function signed(value, digits) {
    const text = Math.abs(value).toFixed(digits);
    return (value < 0 ? MINUS : '+') + text;
  }

  function notice(text, kind) {
    const box = $('notice');
    box.textContent = text;
    box.className = 'notice' + (kind ? ' ' + kind : '');
    box.hidden = !text;
  }

  // ---- tokens -------------------------------------------------------------------------------
  const tokens = {
    get(kind) { return sessionStorage.getItem('pressmark.' + kind + '-token'); },
    set(kind, value) { sessionStorage.setItem('pressmark.' + kind + '-token', value); updateForget(); },
    clear(kind) { sessionStorage.removeItem('pressmark.' + kind + '-token'); updateForget(); }
  };

  function updateForget() {
    $('forget-tokens').hidden = !(tokens.get('admin') || tokens.get('reader'));
  }

  let pendingAsk = null;

  /** Asks for a token in the dialog; resolves to the token, or null when the person cancels. */
  function askToken(kind, why) {
    if (pendingAsk) return pendingAsk;
    const dialog = $('token-dialog');
    const input = $('token-input');
    $('token-title').textContent = kind === 'admin' ? 'Admin token' : 'Reader token';
    $('token-why').textContent = why;
    input.value = '';
    pendingAsk = new Promise((resolve) => {
      const form = $('token-form');
      const cancel = $('token-cancel');
      function finish(value) {
        form.removeEventListener('submit', onSubmit);
        cancel.removeEventListener('click', onCancel);
        dialog.removeEventListener('cancel', onCancel);
        if (dialog.open) dialog.close();
        pendingAsk = null;
        resolve(value);
      }
      function onSubmit(event) {
        event.preventDefault();
        const value = input.value.trim();
        if (!value) return;
        tokens.set(kind, value);
        finish(value);
      }
      function onCancel(event) {
        event.preventDefault();
        finish(null);
      }
      form.addEventListener('submit', onSubmit);
      cancel.addEventListener('click', onCancel);
      dialog.addEventListener('cancel', onCancel);
    });
    dialog.showModal();
    input.focus();
    return pendingAsk;
  }

  class ApiError extends Error {
    constructor(status, message) { super(message); this.status = status; }
  }

  class Cancelled extends Error {}

  /**
   * One request to the service. Admin requests carry the admin token (asked for once); reading
   * requests carry the reader token when the server wants one. A 401 asks again, once.
   */
  async function api(method, path, { body, admin = false, as = 'json' } = {}) {
    const kind = admin ? 'admin' : 'reader';
    let token = admin ? tokens.get('admin') : (tokens.get('reader') || tokens.get('admin'));
    if (!token && (admin || document.body.dataset.readerToken === 'required')) {
      token = await askToken(kind, admin ? 'Changing the active version needs the admin token.'
        : 'This service needs the reader token (or the admin token) to read its models.');
      if (!token) throw new Cancelled();
    }
    for (let attempt = 0; ; attempt++) {
      const headers = { Accept: as === 'json' ? 'application/json' : 'image/svg+xml' };
      if (token) headers.Authorization = 'Bearer ' + token;
      if (body !== undefined) headers['Content-Type'] = 'application/json';
      const response = await fetch(path, { method, headers, body: body === undefined ? undefined : JSON.stringify(body) });
      if (response.status === 401 && attempt === 0) {
        tokens.clear(kind);
        token = await askToken(kind, 'The service did not accept that token' + (token ? '' : ' (none was given)') + '. Try again.');
        if (!token) throw new Cancelled();
        continue;
      }
      if (!response.ok) {
        let detail = response.status + ' ' + response.statusText;
        try {
          const problem = await response.json();
          detail = problem.detail || problem.title || detail;
        } catch (ignored) {
          // Not a problem detail; the status line says enough.
        }
        throw new ApiError(response.status, detail);
      }
      return as === 'json' ? response.json() : response.text();
    }
  }

  function failed(error) {
    if (error instanceof Cancelled) {
      notice('Cancelled: no token given.', 'warn');
      return;
    }
    notice(error.message || String(error), 'error');
  }

  // ---- health ------------------------------------------------------------------------------
  async function loadHealth() {
    const box = $('health');
    try {
      const response = await fetch('/health/ready', { headers: { Accept: 'application/json' } });
      const body = await response.json();
      box.textContent = body.status === 'ready' ? 'service ready' : 'service not ready';
      box.className = 'health ' + (body.status === 'ready' ? 'ok' : 'bad');
    } catch (error) {
      box.textContent = 'service unreachable';
      box.className = 'health bad';
    }
  }

  // ---- models ------------------------------------------------------------------------------
  async function loadModels() {
    const body = await api('GET', '/models');
    state.models = body.models;
    const list = $('models');
    list.replaceChildren();
    $('models-empty').hidden = state.models.length > 0;
    for (const model of state.models) {
      const current = state.model === model.name;
      const button = el('button', {
        type: 'button', class: 'model-card' + (current ? ' current' : ''), 'aria-pressed': current ? 'true' : 'false',
        'data-model': model.name, onclick: () => selectModel(model.name)
      },
      el('span', { class: 'model-title', text: model.name }),
      el('span', { class: 'model-meta' },
        model.active ? el('span', { class: 'badge active', text: 'active ' + model.active.tag }) : el('span', { class: 'badge', text: 'no active version' }),
        el('span', { class: 'muted', text: model.versions + (model.versions === 1 ? ' version' : ' versions') })));
      list.append(el('li', {}, button));
    }
    if (!state.model && state.models.length > 0) {
      await selectModel(state.models[0].name);
    }
  }

  async function selectModel(name) {
    const changed = state.model !== name;
    state.model = name;
    if (changed) {
      state.chosen = null;
      state.details = new Map();
    }
    for (const card of document.querySelectorAll('.model-card')) {
      const current = card.dataset.model === name;
      card.classList.toggle('current', current);
      card.setAttribute('aria-pressed', current ? 'true' : 'false');
    }
    $('model-view').hidden = false;
    $('model-name').textContent = name;
    await loadVersions();
    if (changed) buildScoreFields();
    explainSoon(0);
  }

  async function loadVersions() {
    const name = state.model;
    const listing = await api('GET', '/models/' + encodeURIComponent(name) + '/versions');
    state.versions = listing.versions;
    // The list carries no metrics; each version's own metadata does. Versions are immutable, so fetch each once.
    await Promise.all(state.versions.filter((v) => !state.details.has(v.tag)).map(async (v) => {
      state.details.set(v.tag, await api('GET', '/models/' + encodeURIComponent(name) + '/versions/' + encodeURIComponent(v.tag)));
    }));
    const active = state.versions.find((v) => v.active);
    state.detail = active ? state.details.get(active.tag) : null;
    if (!state.chosen || !state.details.has(state.chosen)) {
      state.chosen = active ? active.tag : (state.versions[0] && state.versions[0].tag);
    }
    renderVersions();
    renderComparison();
    renderSearch();
    renderCharts();
    loadDrift();
  }

  // ---- drift -------------------------------------------------------------------------------
  const DRIFT_WORDS = { ok: 'ok', watch: 'watch', drift: 'drift' };

  async function loadDrift() {
    const name = state.model;
    const list = $('drift');
    const badge = $('drift-status');
    if (!state.versions.some((v) => v.active)) {
      $('drift-version').textContent = name;
      badge.textContent = 'no active version';
      badge.className = 'badge';
      list.replaceChildren();
      return;
    }
    try {
      const body = await api('GET', '/models/' + encodeURIComponent(name) + '/drift');
      if (state.model !== name) return;
      renderDrift(body);
    } catch (error) {
      badge.textContent = 'unavailable';
      badge.className = 'badge';
      list.replaceChildren(el('dd', { class: 'error-text', text: error instanceof Cancelled ? 'No token given.' : error.message }));
    }
  }

  function renderDrift(body) {
    $('drift-version').textContent = body.model + ' ' + body.version;
    const badge = $('drift-status');
    badge.textContent = body.status ? DRIFT_WORDS[body.status] || body.status : 'no traffic yet';
    badge.className = 'badge' + (body.status ? ' ' + body.status : '');
    const rows = [
      ['items in window', String(body.window_items)],
      ['stability index', fixed(body.psi, 3)],
      ['unknown tokens, live', body.unknown_rate.live === null ? '–' : (100 * body.unknown_rate.live).toFixed(1) + ' %'],
      ['unknown tokens, training', (100 * body.unknown_rate.training).toFixed(1) + ' %'],
      ['tokens per item', body.length ? fixed(body.length.live.mean, 1) + ' live, ' + fixed(body.length.training.mean, 1) + ' training' : '–']
    ];
    $('drift').replaceChildren(...rows.flatMap(([term, value]) => [el('dt', { text: term }), el('dd', { text: value })]));
  }

  function renderVersions() {
    const body = document.querySelector('#versions tbody');
    body.replaceChildren();
    for (const v of state.versions) {
      const test = (state.details.get(v.tag).metrics || {}).test || {};
      const chosen = v.tag === state.chosen;
      const row = el('tr', { class: (v.active ? 'is-active' : '') + (chosen ? ' is-chosen' : ''), 'data-tag': v.tag },
        el('th', { scope: 'row', class: 'tag' }, el('code', { text: v.tag }),
          v.active ? el('span', { class: 'badge active', text: '\u25CF active' }) : (v.retired ? el('span', { class: 'badge', text: 'retired' }) : null)),
        el('td', { 'data-label': 'created' }, el('time', {
          datetime: v.created_at, title: v.created_at, text: v.created_at.replace('T', ' ').replace(/:\d\d(\.\d+)?Z$/, '')
        })),
        el('td', { 'data-label': 'sha256', class: 'sha' }, el('code', { title: v.sha256, text: v.sha256.slice(0, 10) })),
        ...KEY_METRICS.map((m) => el('td', { class: 'num', 'data-label': METRIC_NAMES[m], text: fixed(test[m], 3) })),
        el('td', { class: 'actions' },
          el('button', {
            type: 'button', class: 'quiet small', 'aria-pressed': chosen ? 'true' : 'false',
            'aria-label': 'Show ' + v.tag + ': metrics and charts', onclick: () => choose(v.tag), text: chosen ? 'Shown' : 'Show'
          }),
          v.active || v.retired ? null : el('button', {
            type: 'button', class: 'small', 'aria-label': 'Activate ' + v.tag, onclick: () => activate(v.tag), text: 'Activate'
          })));
      body.append(row);
    }
    $('rollback').disabled = !state.versions.some((v) => v.active) || state.versions.length < 2;
  }

  function choose(tag) {
    state.chosen = tag;
    renderVersions();
    renderComparison();
    renderSearch();
    renderCharts();
  }

  // The candidates of the search that chose the shown version's settings, the chosen one marked.
  function renderSearch() {
    const detail = state.details.get(state.chosen);
    const search = detail && detail.search;
    $('search-section').hidden = !search;
    const head = document.querySelector('#search thead tr');
    const body = document.querySelector('#search tbody');
    head.replaceChildren();
    body.replaceChildren();
    if (!search) return;
    const candidates = search.candidates || [];
    const keys = candidates.length > 0 ? Object.keys(candidates[0].settings || {}) : [];
    $('search-hint').textContent = candidates.length + ' candidates scored by cross-validation on the training part; pick '
      + search.pick + '; the chosen one (\u2713) was trained on the whole training part.';
    head.append(el('th', { scope: 'col', text: '#' }));
    for (const key of keys) head.append(el('th', { scope: 'col', text: key }));
    head.append(el('th', { scope: 'col', class: 'num', text: (METRIC_NAMES[search.metric] || search.metric) + ' (cv)' }));
    head.append(el('th', { scope: 'col', class: 'num', text: '\u00B1 s.e.' }));
    candidates.forEach((candidate, i) => {
      const chosen = i === search.chosen;
      const row = el('tr', chosen ? { class: 'chosen' } : {},
        el('th', { scope: 'row', text: (chosen ? '\u2713 ' : '') + (i + 1) }));
      for (const key of keys) {
        const value = (candidate.settings || {})[key];
        row.append(el('td', { text: typeof value === 'string' ? value : JSON.stringify(value) }));
      }
      row.append(el('td', { class: 'num', text: fixed((candidate.cv || {}).mean, 4) }));
      row.append(el('td', { class: 'num', text: fixed((candidate.cv || {}).std_err, 4) }));
      body.append(row);
    });
  }

  function renderComparison() {
    const active = state.versions.find((v) => v.active);
    const chosen = state.details.get(state.chosen);
    const head = document.querySelector('#comparison thead tr');
    const body = document.querySelector('#comparison tbody');
    head.replaceChildren();
    body.replaceChildren();
    if (!chosen) return;
    const base = active ? state.details.get(active.tag) : null;
    const comparing = base && base.tag !== chosen.tag;
    $('compare-title').textContent = comparing ? chosen.tag + ' against the active ' + base.tag : chosen.tag + (base ? ' (active)' : '');
    $('compare-hint').textContent = comparing
      ? 'Differences are the shown version minus the active one; higher is better for every metric here.'
      : 'Choose Show on another version to set its metrics beside the active one\u2019s.';
    head.append(el('th', { scope: 'col', text: 'metric' }));
    if (comparing) head.append(el('th', { scope: 'col', class: 'num', text: base.tag + ' (active)' }));
    head.append(el('th', { scope: 'col', class: 'num', text: chosen.tag }));
    if (comparing) head.append(el('th', { scope: 'col', class: 'num', text: 'difference' }));
    const test = (chosen.metrics || {}).test || {};
    const baseTest = comparing ? ((base.metrics || {}).test || {}) : {};
    for (const key of Object.keys(test)) {
      const row = el('tr', {}, el('th', { scope: 'row', text: METRIC_NAMES[key] || key.replace(/_/g, ' ') }));
      if (comparing) row.append(el('td', { class: 'num', text: fixed(baseTest[key], 3) }));
      row.append(el('td', { class: 'num', text: fixed(test[key], 3) }));
      if (comparing) row.append(difference(test[key], baseTest[key]));
      body.append(row);
    }
  }

  function difference(value, base) {
    if (typeof value !== 'number' || typeof base !== 'number') return el('td', { class: 'num', text: '–' });
    const delta = value - base;
    if (Math.abs(delta) < SAME) return el('td', { class: 'num same' }, el('span', { text: '= same' }));
    const better = delta > 0;
    return el('td', { class: 'num ' + (better ? 'better' : 'worse') },
      el('span', { 'aria-hidden': 'true', text: better ? '\u25B2 ' : '\u25BC ' }),
      signed(delta, 3) + ' ' + (better ? 'better' : 'worse'));
  }

  // ---- charts ------------------------------------------------------------------------------
  async function renderCharts() {
    const tag = state.chosen;
    const detail = state.details.get(tag);
    if (!detail) return;
    for (const span of document.querySelectorAll('.chart-tag')) span.textContent = tag;
    const base = '/console/models/' + encodeURIComponent(state.model) + '/versions/' + encodeURIComponent(tag) + '/charts.svg';
    const features = $('features');
    features.replaceChildren();
    const boxes = detail.labels.map((label) => {
      const box = el('div', { class: 'chart-box' });
      features.append(el('figure', { class: 'feature-chart' }, el('figcaption', { text: 'towards ' + label }), box));
      return [box, base + '?kind=features&count=' + CHART_FEATURES + '&label=' + encodeURIComponent(label)];
    });
    boxes.unshift([$('confusion'), base + '?kind=confusion']);
    await Promise.all(boxes.map(([box, url]) => showSvg(box, url, tag)));
  }

  async function showSvg(box, url, tag) {
    box.replaceChildren(el('p', { class: 'muted small', text: 'loading…' }));
    try {
      const text = await api('GET', url, { as: 'text' });
      if (state.chosen !== tag) return;
      const doc = new DOMParser().parseFromString(text, 'image/svg+xml');
      const root = doc.documentElement;
      if (root.namespaceURI !== 'http://www.w3.org/2000/svg' || doc.getElementsByTagName('parsererror').length > 0) {
        throw new Error('the chart is not SVG');
      }
      box.replaceChildren(document.importNode(root, true));
    } catch (error) {
      box.replaceChildren(el('p', { class: 'muted small', text: 'no chart: ' + (error.message || error) }));
    }
  }

  // ---- activation --------------------------------------------------------------------------
  async function activate(tag) {
    await changeActive('PUT', '/models/' + encodeURIComponent(state.model) + '/active', { tag }, 'activated ' + tag);
  }

  async function rollback() {
    await changeActive('POST', '/models/' + encodeURIComponent(state.model) + '/rollback', undefined, 'rolled back');
  }

  async function changeActive(method, path, body, what) {
    const buttons = document.querySelectorAll('#versions button, #rollback');
    buttons.forEach((b) => { b.disabled = true; });
    try {
      const result = await api(method, path, { body, admin: true });
      notice(state.model + ': ' + what + '; ' + result.tag + ' is active' + (result.serving ? ', serving ' + result.serving : '') + '.', 'ok');
      state.chosen = result.tag;
      await loadModels();
      await loadVersions();
      explainSoon(0);
    } catch (error) {
      failed(error);
      renderVersions();
    }
  }

  // ---- score a text ------------------------------------------------------------------------
  function buildScoreFields() {
    const fields = $('score-fields');
    fields.replaceChildren();
    const names = (state.detail && state.detail.input_fields) || [];
    for (const name of names) {
      const id = 'score-' + name.replace(/[^A-Za-z0-9_-]/g, '_');
      fields.append(el('label', { for: id, text: name }),
        el('input', { id, type: 'text', class: 'score-input', 'data-field': name, spellcheck: 'false', placeholder: 'e.g. Quorubwick service kit 3/4in',
          oninput: () => explainSoon(EXPLAIN_DELAY_MS) }));
    }
    $('score-result').replaceChildren();
  }

  let explainTimer = null;

  function explainSoon(delayMs) {
    clearTimeout(explainTimer);
    explainTimer = setTimeout(explain, delayMs);
  }

  async function explain() {
    const inputs = [...document.querySelectorAll('.score-input')];
    const item = {};
    let any = false;
    for (const input of inputs) {
      item[input.dataset.field] = input.value;
      any = any || input.value.trim() !== '';
    }
    const out = $('score-result');
    if (!any || !state.model) {
      out.replaceChildren();
      return;
    }
    const seq = ++state.explainSeq;
    try {
      const body = await api('POST', '/models/' + encodeURIComponent(state.model) + '/explain?k=' + EXPLAIN_FEATURES, { body: { items: [item] } });
      if (seq !== state.explainSeq) return;
      renderExplanation(body, inputs.length === 1 ? inputs[0].dataset.field + ':' : null);
    } catch (error) {
      if (seq !== state.explainSeq) return;
      out.replaceChildren(el('p', { class: 'error-text', text: error instanceof Cancelled ? 'No token given.' : error.message }));
    }
  }

  /** Shades of the accent colour for the stacked bar, largest share first; the rest share the palest. */
  const SHADES = 6;

  function percent(p) {
    return (100 * p).toFixed(1) + ' %';
  }

  /**
   * The label probabilities as one stacked bar, largest share first, and a legend in the same order:
   * each label's shade, name and probability.
   */
  function shares(result) {
    const entries = Object.entries(result.probabilities).sort((a, b) => b[1] - a[1] || a[0].localeCompare(b[0]));
    const bar = el('div', { id: 'score-bar', class: 'score-bar', role: 'img',
      'aria-label': 'label shares: ' + entries.map(([label, p]) => label + ' ' + percent(p)).join(', ') });
    const legend = el('ol', { id: 'score-legend', class: 'score-legend', 'aria-label': 'probability of each label, largest first' });
    entries.forEach(([label, p], i) => {
      const shade = 'shade-' + Math.min(i, SHADES - 1);
      const segment = el('span', { class: 'segment ' + shade, title: label + ' ' + percent(p), 'data-label': label });
      segment.style.flexGrow = String(p);
      bar.append(segment);
      legend.append(el('li', { class: label === result.label ? 'chosen' : '', 'data-label': label },
        el('span', { class: 'swatch ' + shade, 'aria-hidden': 'true' }),
        el('span', { class: 'legend-label', text: label }),
        el('span', { class: 'num', text: percent(p) })));
    });
    return { bar, legend };
  }

  function pushes(result, prefix) {
    const chips = el('ul', { id: 'score-subwords', class: 'subwords', 'aria-label': 'subwords that moved the score' });
    for (const c of result.contributions) {
      const positive = c.contribution >= 0;
      const token = prefix && c.feature.startsWith(prefix) ? c.feature.slice(prefix.length) : c.feature;
      chips.append(el('li', {
        class: 'chip ' + (positive ? 'pos' : 'neg'),
        title: (positive ? 'pushed towards ' : 'pushed away from ') + result.label
      },
      el('span', { class: 'sign', 'aria-label': positive ? 'towards' : 'away from', text: positive ? '+' : MINUS }),
      el('code', { text: token }),
      el('span', { class: 'num', text: fixed(Math.abs(c.contribution), 2) })));
    }
    const part = [el('h3', { class: 'small-heading', text: 'What pushed it' }),
      el('p', { class: 'muted small', text: '+ towards ' + result.label + ', ' + MINUS + ' away from it, by how much.' }),
      result.contributions.length ? chips : el('p', { class: 'muted', text: 'No known subword in this text.' })];
    if (result.unknown_tokens > 0) {
      const n = result.unknown_tokens;
      part.push(el('p', { class: 'muted small', text: n + (n === 1 ? ' token' : ' tokens') + ' the vocabulary could not cover.' }));
    }
    return part;
  }

  function renderExplanation(body, prefix) {
    const result = body.results[0];
    const parts = [el('p', { class: 'prediction' },
      el('span', { class: 'muted', text: 'Scored as ' }),
      el('strong', { id: 'score-label', class: 'label', text: result.label }),
      el('span', { class: 'muted', text: ' by ' + body.model + ' ' + body.version }))];
    const grid = el('div', { class: 'score-grid' });
    if (result.probabilities) {
      const { bar, legend } = shares(result);
      parts.push(bar);
      grid.append(el('div', { class: 'score-part' }, el('h3', { class: 'small-heading', text: 'Label shares' }), legend));
    }
    grid.append(el('div', { class: 'score-part' }, ...pushes(result, prefix)));
    parts.push(grid);
    $('score-result').replaceChildren(...parts);
  }

  // ---- start -------------------------------------------------------------------------------
  function start() {
    updateForget();
    $('forget-tokens').addEventListener('click', () => {
      tokens.clear('admin');
      tokens.clear('reader');
      notice('Tokens forgotten.', 'ok');
    });
    $('rollback').addEventListener('click', rollback);
    $('drift-refresh').addEventListener('click', () => { if (state.model) loadDrift(); });
    $('score-form').addEventListener('submit', (event) => { event.preventDefault(); explainSoon(0); });
    loadHealth();
    loadModels().catch(failed);
  }

  if (document.readyState === 'loading') document.addEventListener('DOMContentLoaded', start);
  else start();
})();
