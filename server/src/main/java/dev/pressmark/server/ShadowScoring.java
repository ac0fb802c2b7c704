package dev.pressmark.server;

import dev.pressmark.core.bundle.Bundle;
import dev.pressmark.core.bundle.Prediction;
import dev.pressmark.store.BundleStore;
import dev.pressmark.store.Shadow;
import dev.pressmark.store.ShadowReport;
import dev.pressmark.store.ShadowStatus;
import dev.pressmark.store.ShadowSummary;
import java.net.InetAddress;
import java.net.UnknownHostException;
import java.time.Instant;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.HexFormat;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.concurrent.ConcurrentHashMap;
import java.util.concurrent.ThreadLocalRandom;
import org.slf4j.Logger;
import org.slf4j.LoggerFactory;

/**
 * Scores the shadow candidates beside the active versions on this server. The shadows
 * themselves live in the store, so a change made through any replica or with
 * {@code pressmark shadow} reaches every server: a daemon thread reads them every
 * {@link #POLL_MS} and starts or finishes runs to match, and writes this replica's snapshot of
 * each run to the store every {@link #SAVE_MS} and once more when a run ends or the server stops.
 *
 * <p>The sampling decision is made per request on the request thread ({@link ThreadLocalRandom},
 * no lock); the candidate scores a sampled request's items on the traffic tap's worker. Only
 * requests that the run's active version answered are compared; when the active version
 * changes the store stops the shadow (see {@link BundleStore#activate}), and the requests in
 * between, answered by a version the run does not compare, are skipped.
 */
final class ShadowScoring implements TrafficTap.Listener, AutoCloseable {

    /** How often the store's shadows are read: a change made elsewhere is seen within about 1 s. */
    static final long POLL_MS = 1_000;
    /** How often each run's snapshot is written to the store. */
    static final long SAVE_MS = 3_000;

    private static final Logger LOG = LoggerFactory.getLogger(ShadowScoring.class);

    /** One run on this server. The tally is guarded by the run's lock. */
    private static final class Run {
        final Shadow shadow;
        final LiveVersion candidate;
        final String active;
        final ShadowSummary.Tally tally;
        boolean changedSinceSave = true;

        Run(Shadow shadow, LiveVersion candidate, String active) {
            this.shadow = shadow;
            this.candidate = candidate;
            this.active = active;
            this.tally = new ShadowSummary.Tally(active, shadow.tag());
        }

        synchronized ShadowSummary summary() {
            return tally.summary();
        }
    }

    private final BundleStore store;
    private final LiveModels live;
    private final Metrics metrics;
    private final int maxTokensPerField;
    private final String replica;
    private final ConcurrentHashMap<String, Run> runs = new ConcurrentHashMap<>();
    private final Map<String, String> loadFailuresLogged = new ConcurrentHashMap<>();
    private final Thread poller;
    private volatile boolean stopped;

    ShadowScoring(BundleStore store, LiveModels live, Metrics metrics, int maxTokensPerField, Supervisor supervisor) {
        this.store = store;
        this.live = live;
        this.metrics = metrics;
        this.maxTokensPerField = maxTokensPerField;
        this.replica = replicaName();
        this.poller = supervisor.thread("pressmark-shadow", this::poll);
    }

    void start() {
        poller.start();
    }

    /** This server's name in the reports: host, process id and a random part, so two servers in one process differ. */
    private static String replicaName() {
        String host;
        try {
            host = InetAddress.getLocalHost().getHostName();
        } catch (UnknownHostException e) {
            host = "unknown-host";
        }
        byte[] random = new byte[3];
        ThreadLocalRandom.current().nextBytes(random);
        String name = host + "-" + ProcessHandle.current().pid() + "-" + HexFormat.of().formatHex(random);
        return name.length() > 200 ? name.substring(name.length() - 200) : name;
    }

    String replica() {
        return replica;
    }

    // ---- the request path and the tap's worker ----

    @Override
    public boolean wants(String model) {
        return runs.containsKey(model);
    }

    @Override
    public boolean accept(String model) {
        Run run = runs.get(model);
        return run != null && (run.shadow.fraction() >= 1.0 || ThreadLocalRandom.current().nextDouble() < run.shadow.fraction());
    }

    @Override
    public void onDropped(String model, int items) {
        Run run = runs.get(model);
        if (run != null) {
            synchronized (run) {
                run.tally.dropped(items);
                run.changedSinceSave = true;
            }
            metrics.shadowDropped(model, run.shadow.tag(), items);
        }
    }

    @Override
    public void onPredict(String model, String tag, Bundle served, List<Map<String, String>> items, List<Prediction> results) {
        Run run = runs.get(model);
        if (run == null || !tag.equals(run.active)) {
            return;
        }
        List<Prediction> candidate = run.candidate.bundle().predict(items, maxTokensPerField);
        synchronized (run) {
            for (int i = 0; i < results.size(); i++) {
                Prediction a = results.get(i);
                Prediction c = candidate.get(i);
                if (a.probabilities() != null && c.probabilities() != null) {
                    double mine = a.probabilities().getOrDefault(a.label(), 0.0);
                    double theirs = c.probabilities().getOrDefault(a.label(), 0.0);
                    run.tally.add(a.label(), c.label(), theirs - mine, ShadowSummary.PROBABILITY);
                } else {
                    run.tally.add(a.label(), c.label(), c.score() - a.score(), ShadowSummary.SCORE);
                }
            }
            run.changedSinceSave = true;
        }
        metrics.shadowSamples(model, run.shadow.tag(), results.size());
    }

    // ---- following the store ----

    private void poll() {
        long lastSave = System.nanoTime();
        while (!stopped) {
            try {
                Thread.sleep(POLL_MS);
                sync();
                if (System.nanoTime() - lastSave >= SAVE_MS * 1_000_000) {
                    saveAll(false);
                    lastSave = System.nanoTime();
                }
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
                return;
            } catch (RuntimeException e) {
                // the store may be briefly unreachable; the next round tries again
                LOG.warn("following the store's shadows failed: {}", e.getMessage());
            }
        }
    }

    /** Brings this server's runs in line with the store's shadows now. */
    synchronized void sync() {
        Map<String, Shadow> wanted = new HashMap<>();
        for (Shadow shadow : store.shadows()) {
            wanted.put(shadow.model(), shadow);
        }
        for (Run run : new ArrayList<>(runs.values())) {
            Shadow want = wanted.get(run.shadow.model());
            if (want == null || !want.startedAt().equals(run.shadow.startedAt())) {
                finish(run);
            }
        }
        for (Shadow shadow : wanted.values()) {
            if (!runs.containsKey(shadow.model())) {
                begin(shadow);
            }
        }
    }

    private void begin(Shadow shadow) {
        Optional<LiveVersion> active = live.active(shadow.model());
        if (active.isEmpty()) {
            // activated a moment ago and not loaded yet: load it now, so that a shadow started over HTTP runs when the answer says so
            live.refresh(shadow.model());
            active = live.active(shadow.model());
        }
        if (active.isEmpty() || active.get().tag().equals(shadow.tag())) {
            return; // nothing to compare with yet, or the candidate serves already: the store will stop this shadow
        }
        LiveVersion candidate;
        try {
            candidate = live.named(shadow.model(), shadow.tag());
        } catch (RuntimeException e) {
            String key = shadow.model() + " " + shadow.tag() + " " + shadow.startedAt();
            if (!key.equals(loadFailuresLogged.put(shadow.model(), key))) {
                LOG.warn("cannot load the shadow candidate {} {}: {}", shadow.model(), shadow.tag(), e.getMessage());
            }
            return;
        }
        loadFailuresLogged.remove(shadow.model());
        runs.put(shadow.model(), new Run(shadow, candidate, active.get().tag()));
        LOG.info("shadowing {} {} against {} on a fraction {} of requests", shadow.model(), shadow.tag(), active.get().tag(), shadow.fraction());
    }

    private void finish(Run run) {
        runs.remove(run.shadow.model(), run);
        save(run, true);
        LOG.info("stopped shadowing {} {}", run.shadow.model(), run.shadow.tag());
    }

    private void saveAll(boolean always) {
        for (Run run : runs.values()) {
            save(run, always);
        }
    }

    private void save(Run run, boolean always) {
        ShadowSummary summary;
        synchronized (run) {
            if (!always && !run.changedSinceSave) {
                return;
            }
            summary = run.tally.summary();
            run.changedSinceSave = false;
        }
        try {
            store.saveShadowReport(new ShadowReport(run.shadow.model(), run.shadow.tag(), replica, run.shadow.startedAt(), Instant.now(), summary));
        } catch (RuntimeException e) {
            synchronized (run) {
                run.changedSinceSave = true;
            }
            LOG.warn("cannot save the shadow report of {} {}: {}", run.shadow.model(), run.shadow.tag(), e.getMessage());
        }
    }

    /**
     * The model's newest run as every replica reported it to the store, with this server's own
     * snapshot taken now in place of what it last wrote.
     */
    Optional<ShadowStatus> status(String model, Optional<String> tag) {
        Optional<Shadow> running = store.shadow(model).filter(s -> tag.isEmpty() || s.tag().equals(tag.get()));
        List<ShadowReport> reports = new ArrayList<>(store.shadowReports(model, tag));
        Run local = runs.get(model);
        if (local != null && running.isPresent() && local.shadow.startedAt().equals(running.get().startedAt())) {
            reports.removeIf(r -> r.replica().equals(replica) && r.runStartedAt().equals(local.shadow.startedAt()));
            reports.add(new ShadowReport(model, local.shadow.tag(), replica, local.shadow.startedAt(), Instant.now(), local.summary()));
        }
        String activeTag = live.active(model).map(LiveVersion::tag).orElse("");
        return ShadowStatus.of(model, running, reports, activeTag);
    }

    @Override
    public void close() {
        stopped = true;
        poller.interrupt();
        try {
            poller.join(POLL_MS * 2);
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
        }
        saveAll(true);
    }
}
