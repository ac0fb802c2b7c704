#!/usr/bin/env bash
# Soak run of `pressmark serve`: a real server on an SQLite store holding two published versions,
# driven with one-item predicts at half its measured peak for a long time, while the other version
# is activated through PUT /models/{name}/active every 5 s. The run is cut into windows (30 s each;
# a third of the run when it is shorter than 90 s); each window is one wrk run, which gives that
# window's p50/p99 and errors, and at its end the heap after a full collection is read (jcmd GC.run,
# then the used sizes of jstat -gc).
#
# Passes when:
#   - no request failed: no non-2xx answer and no socket error in any window, and every activation
#     answered 200;
#   - the last window's p99 is at most P99_FACTOR (3) times the first window's, plus P99_SLACK_MS
#     (5 ms), the slack because a p99 of one or two milliseconds doubles on one descheduling of a
#     shared core;
#   - the heap after a full collection at the end is at most HEAP_FACTOR (1.5) times the one after
#     the first window, plus HEAP_SLACK_MIB (16 MiB).
# Prints a Markdown table (and writes it to --out FILE); exits 1 when a check fails.
#
# Usage: scripts/soak.sh [--seconds N] [--out FILE]     (default 600 s; CI runs --seconds 30)
# Environment: JAVA_OPTS for the server JVM; SOAK_CONNECTIONS (default 16), SOAK_THREADS (2).
set -euo pipefail
root="$(cd "$(dirname "$0")/.." && pwd)"
jar="$root/server/target/pressmark.jar"

seconds=600
out=""
while [ $# -gt 0 ]; do
  case "$1" in
    --seconds) seconds="${2:?--seconds needs a number}"; shift ;;
    --out) out="${2:?--out needs a file}"; shift; case "$out" in /*) ;; *) out="$PWD/$out" ;; esac ;;
    -h|--help) sed -n '2,20p' "$0" | sed 's/^# \{0,1\}//'; exit 0 ;;
    *) echo "soak: unknown argument $1 (see --help)" >&2; exit 2 ;;
  esac
  shift
done
case "$seconds" in ''|*[!0-9]*) echo "soak: --seconds must be a whole number of seconds, was $seconds" >&2; exit 2 ;; esac
[ "$seconds" -ge 15 ] || { echo "soak: --seconds must be at least 15, was $seconds" >&2; exit 2; }

P99_FACTOR=3
P99_SLACK_MS=5
HEAP_FACTOR=1.5
HEAP_SLACK_MIB=16
ACTIVATE_EVERY_S=5
PEAK_S=5
ROWS=5000
if [ "$seconds" -ge 90 ]; then window=30; else window=$(( seconds / 3 )); fi
windows=$(( seconds / window ))
connections="${SOAK_CONNECTIONS:-16}"
threads="${SOAK_THREADS:-2}"

die() { echo "soak: $*" >&2; exit 1; }
for tool in wrk curl jcmd jstat; do
  command -v "$tool" >/dev/null 2>&1 || die "$tool is not installed"
done
if [ ! -f "$jar" ]; then
  echo "soak: building $jar" >&2
  (cd "$root" && mvn -q -B package -DskipTests) >&2
fi

work="$(mktemp -d)"
server_pid=""
activator=""
cleanup() {
  if [ -n "$activator" ]; then kill "$activator" 2>/dev/null || true; wait "$activator" 2>/dev/null || true; fi
  if [ -n "$server_pid" ] && kill -0 "$server_pid" 2>/dev/null; then
    kill "$server_pid" 2>/dev/null || true
    for _ in $(seq 100); do kill -0 "$server_pid" 2>/dev/null || break; sleep 0.1; done
    kill -0 "$server_pid" 2>/dev/null && kill -9 "$server_pid" 2>/dev/null
    wait "$server_pid" 2>/dev/null || true
  fi
  rm -rf "$work"
}
trap cleanup EXIT
cd "$work"

# --- two versions ----------------------------------------------------------------------------
echo "soak: training two bundles on $ROWS invented listings in $work" >&2
java -cp "$jar" dev.pressmark.demo.ListingTitles $((ROWS + 1)) --csv > all.csv
head -n $((ROWS + 1)) all.csv > listings.csv
for c in 1.0 0.5; do
  cat > "train-$c.yaml" <<YAML
name: routing
data: {file: listings.csv, text: [title], label: department}
tokenizer: {kind: wordpiece, vocab_size: 1500}
features: {max_tokens: 800, weighting: tf, scaling: l2}
classifier: {kind: linear-svm, c: $c, probabilities: platt}
evaluation: {folds: 2}
YAML
  java -jar "$jar" train --config "train-$c.yaml" --out "routing-$c.pmb" > "train-$c.out" 2>&1 || { cat "train-$c.out" >&2; die "training failed"; }
done
store="sqlite:$work/store.db"
java -jar "$jar" publish routing-1.0.pmb --name routing --tag v1 --activate --store "$store" > /dev/null || die "publishing v1 failed"
java -jar "$jar" publish routing-0.5.pmb --name routing --tag v2 --store "$store" > /dev/null || die "publishing v2 failed"
title="$(sed -n '$p' all.csv | sed -E 's/\r$//; s/^"(.*)",[^,"]*$/\1/; s/""/"/g; s/\\/\\\\/g; s/"/\\"/g')"
printf '{"items":[{"title":"%s"}]}' "$title" > one.json

# --- server ----------------------------------------------------------------------------------
token="soak-$RANDOM$RANDOM$RANDOM"
# the access log would be one line per request for the whole run: off; wrk measures latency
PRESSMARK_ADMIN_TOKEN="$token" java ${JAVA_OPTS:-} -jar "$jar" serve --port 0 --store "$store" --no-access-log \
  > serve.out 2> serve.log &
server_pid=$!
port=""
for _ in $(seq 600); do
  kill -0 "$server_pid" 2>/dev/null || { tail -20 serve.log >&2; die "the server stopped during start-up"; }
  [ -n "$port" ] || port="$(sed -n 's|^serving on http://127\.0\.0\.1:\([0-9]*\).*|\1|p' serve.out)"
  if [ -n "$port" ] && [ "$(curl -s -o /dev/null -w '%{http_code}' --max-time 1 "http://127.0.0.1:$port/health/ready" || true)" = 200 ]; then
    break
  fi
  sleep 0.1
done
[ -n "$port" ] || die "the server printed no port within 60 s"
base="http://127.0.0.1:$port"
predict_url="$base/models/routing/predict"

run_wrk() {
  local name="$1"
  shift
  wrk -t"$threads" -c"$connections" --latency "$@" > "$name.txt" 2>&1 || { cat "$name.txt" >&2; die "wrk failed ($name)"; }
}
rps() { awk '/^Requests\/sec:/ { printf "%.0f", $2 }' "$1.txt"; }
requests() { awk '/requests in/ { print $1 }' "$1.txt"; }
pct() {
  awk -v p="$2%" '$1 == p {
      v = $2; unit = v; sub(/[0-9.]+/, "", unit); sub(/[a-z]+$/, "", v)
      f = (unit == "us") ? 0.001 : (unit == "ms") ? 1 : (unit == "s") ? 1000 : (unit == "m") ? 60000 : -1
      printf "%.2f", v * f }' "$1.txt"
}
# non-2xx answers plus socket errors (connect, read, write, timeout) of one wrk run
failures() {
  awk '/Non-2xx or 3xx responses:/ { n += $NF }
       /Socket errors:/ { gsub(/,/, ""); for (i = 1; i <= NF; i++) if ($i ~ /^[0-9]+$/) n += $i }
       END { print n + 0 }' "$1.txt"
}
# used heap in MiB after a full collection: survivor, eden and old spaces of jstat -gc
heap_after_gc_mib() {
  jcmd "$server_pid" GC.run > /dev/null
  jstat -gc "$server_pid" | awk 'NR == 1 { for (i = 1; i <= NF; i++) col[$i] = i }
      NR == 2 { printf "%.1f", ($col["S0U"] + $col["S1U"] + $col["EU"] + $col["OU"]) / 1024 }'
}

# --- peak, then half of it -------------------------------------------------------------------
echo "soak: finding the peak ($PEAK_S s, also the warm-up)" >&2
run_wrk peak -d"${PEAK_S}s" -s "$root/scripts/wrk-post-json.lua" "$predict_url" -- "$work/one.json"
peak="$(rps peak)"
[ -n "$peak" ] && [ "$peak" -gt 1 ] || die "cannot read the peak rate from wrk"
target=$(( peak / 2 ))
pause_ms="$(awk -v c="$connections" -v r="$target" 'BEGIN { printf "%.3f", c * 1000 / r }')"

# --- activations every 5 s -------------------------------------------------------------------
: > activations.txt
(
  tag=v2
  while :; do
    sleep "$ACTIVATE_EVERY_S"
    code="$(curl -s -o /dev/null -w '%{http_code}' --max-time 30 -X PUT -H "Authorization: Bearer $token" \
      -H "Content-Type: application/json" --data '{"tag":"'"$tag"'"}' "$base/models/routing/active" || echo 000)"
    echo "$(date +%s) $tag $code" >> activations.txt
    if [ "$tag" = v2 ]; then tag=v1; else tag=v2; fi
  done
) &
activator=$!

# --- windows ---------------------------------------------------------------------------------
echo "soak: $seconds s at $target requests/s (half the peak of $peak), $windows windows of $window s, activating every $ACTIVATE_EVERY_S s" >&2
rows=()
first_p99=""; last_p99=""; first_heap=""; last_heap=""; total_failures=0; total_requests=0
for w in $(seq 1 "$windows"); do
  run_wrk "w$w" -d"${window}s" -s "$root/scripts/wrk-post-json-paced.lua" "$predict_url" -- "$work/one.json" "$pause_ms"
  heap="$(heap_after_gc_mib)"
  p99="$(pct "w$w" 99)"
  f="$(failures "w$w")"
  n="$(requests "w$w")"
  total_failures=$(( total_failures + f ))
  total_requests=$(( total_requests + n ))
  [ -n "$first_p99" ] || { first_p99="$p99"; first_heap="$heap"; }
  last_p99="$p99"; last_heap="$heap"
  rows+=("| $w | $(( w * window )) | $n | $(rps "w$w") | $(pct "w$w" 50) | $p99 | $f | $heap |")
  echo "soak: window $w/$windows: p99 $p99 ms, $f failed, heap after GC $heap MiB" >&2
done
kill "$activator" 2>/dev/null || true
wait "$activator" 2>/dev/null || true
activator=""
activations="$(wc -l < activations.txt)"
failed_activations="$(awk '$3 != 200' activations.txt | wc -l)"
serving="$(curl -s "$base/health/ready")"

# --- verdict ---------------------------------------------------------------------------------
verdict=pass
reasons=()
if [ "$total_failures" -ne 0 ]; then verdict=fail; reasons+=("$total_failures requests failed"); fi
if [ "$failed_activations" -ne 0 ]; then verdict=fail; reasons+=("$failed_activations of $activations activations failed"); fi
if [ "$activations" -lt 1 ]; then verdict=fail; reasons+=("no activation was made"); fi
p99_bound="$(awk -v a="$first_p99" -v f="$P99_FACTOR" -v s="$P99_SLACK_MS" 'BEGIN { printf "%.2f", a * f + s }')"
if awk -v l="$last_p99" -v b="$p99_bound" 'BEGIN { exit !(l > b) }'; then verdict=fail; reasons+=("last p99 $last_p99 ms > $p99_bound ms"); fi
heap_bound="$(awk -v a="$first_heap" -v f="$HEAP_FACTOR" -v s="$HEAP_SLACK_MIB" 'BEGIN { printf "%.1f", a * f + s }')"
if awk -v l="$last_heap" -v b="$heap_bound" 'BEGIN { exit !(l > b) }'; then verdict=fail; reasons+=("heap after GC $last_heap MiB > $heap_bound MiB"); fi

report="$work/report.md"
{
  echo "## Soak: $seconds s, $(date -u +%Y-%m-%dT%H:%MZ)"
  echo
  echo "Machine: $(nproc) cores, load average $(cut -d' ' -f1-3 /proc/loadavg), $(java -version 2>&1 | sed -n 1p)."
  echo "Peak $peak requests/s (wrk, $PEAK_S s, $connections connections); driven at $target requests/s"
  echo "(\`wrk -t$threads -c$connections --latency -d${window}s -s scripts/wrk-post-json-paced.lua URL -- one.json $pause_ms\` per window);"
  echo "$activations activations (v1/v2 alternating, every $ACTIVATE_EVERY_S s), $failed_activations failed."
  echo
  echo "| window | end (s) | requests | req/s | p50 (ms) | p99 (ms) | failed | heap after GC (MiB) |"
  echo "|---|---|---|---|---|---|---|---|"
  printf '%s\n' "${rows[@]}"
  echo
  echo "Checks: failed requests $total_failures of $total_requests (must be 0); last p99 $last_p99 ms <= $p99_bound ms"
  echo "($P99_FACTOR x first + $P99_SLACK_MS ms); heap after GC $last_heap MiB <= $heap_bound MiB ($HEAP_FACTOR x first + $HEAP_SLACK_MIB MiB)."
  echo "Result: **$verdict**${reasons:+ (${reasons[*]})}."
} > "$report"
cat "$report"
if [ -n "$out" ]; then cp "$report" "$out"; fi
case "$serving" in *'"status":"ready"'*) ;; *) echo "soak: /health/ready at the end: $serving" >&2; verdict=fail ;; esac
[ "$verdict" = pass ] || exit 1
