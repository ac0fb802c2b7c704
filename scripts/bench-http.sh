#!/usr/bin/env bash
# HTTP benchmark of `pressmark serve`, measured from outside with wrk and curl:
#   (a) cold start: launch of `serve` to the first 200 from /health/ready
#   (b) peak throughput of GET /health and of a one-item POST predict, and their ratio
#   (c) p50/p99 of predict paced at half the predict peak of (b) (its pause calibrated by a short run first)
#   (d) one 1,000-item predict request
#   (e) the server's resident memory during and after (b)
#   (f) with --shadow: one-item predict peak with a shadow candidate scoring a fraction 0.2 of the
#       requests, between two runs without one, in the same server
# It trains a bundle on invented listing titles, publishes it as 20 versions (v1..v20) into a
# temporary SQLite store, activates v20 and serves that store. It prints a Markdown table (and
# writes it to --out FILE) with the wrk command lines. Slow numbers never fail it; a broken set-up
# (no wrk, a server that does not start, a request that does not answer 200) does.
#
# Usage: scripts/bench-http.sh [--quick] [--shadow] [--out FILE] [--no-pin]
#   --quick   3 s per measurement and 1 s warm-ups (under a minute in all); the default is 15 s and 10 s
#   --shadow  also measure (f); the candidate is v19, the same bundle under another tag, so it costs what the active one does
#   --no-pin  do not pin the server and wrk to separate cores with taskset
# Environment: JAVA_OPTS for the server JVM; BENCH_THREADS, BENCH_CONNECTIONS (default 2 and 16);
#   BENCH_WARMUP (default 20s): the warm-up before each peak run; longer on a slow machine, where the JIT needs it.
set -euo pipefail
root="$(cd "$(dirname "$0")/.." && pwd)"
jar="$root/server/target/pressmark.jar"

quick=0
out=""
pin=1
shadow=0
SHADOW_FRACTION=0.2
while [ $# -gt 0 ]; do
  case "$1" in
    --quick) quick=1 ;;
    --out) out="${2:?--out needs a file}"; shift; case "$out" in /*) ;; *) out="$PWD/$out" ;; esac ;;
    --no-pin) pin=0 ;;
    --shadow) shadow=1 ;;
    -h|--help) sed -n '2,20p' "$0" | sed 's/^# \{0,1\}//'; exit 0 ;;
    *) echo "bench-http: unknown argument $1 (see --help)" >&2; exit 2 ;;
  esac
  shift
done
# quick mode trains on fewer rows: the model has the same vocabulary and feature sizes, and training is most of its time
if [ "$quick" = 1 ]; then duration=3s; warmup=1s; rows=5000; else duration=15s; warmup="${BENCH_WARMUP:-20s}"; rows=20000; fi
threads="${BENCH_THREADS:-2}"
# 16: enough to keep the server busy, and below its default bound of 20 model requests at once (beyond it a
# request is answered 503 by design, which wrk would count as a failure).
connections="${BENCH_CONNECTIONS:-16}"
BATCH_ITEMS=1000
VERSIONS=20

die() { echo "bench-http: $*" >&2; exit 1; }
command -v wrk >/dev/null 2>&1 || die "wrk is not installed (Debian package wrk)"
command -v curl >/dev/null 2>&1 || die "curl is not installed"
if [ ! -f "$jar" ]; then
  echo "bench-http: building $jar" >&2
  (cd "$root" && mvn -q -B package -DskipTests) >&2
fi

# Server and wrk share the machine's cores; with two or more, each gets its own, so that neither
# steals the other's time slices in the middle of a measurement.
server_cpu=""
client_cpu=""
if [ "$pin" = 1 ] && command -v taskset >/dev/null 2>&1 && [ "$(nproc)" -ge 2 ]; then
  server_cpu=0
  client_cpu=1
fi
client_cmd() { if [ -n "$client_cpu" ]; then taskset -c "$client_cpu" "$@"; else "$@"; fi; }

work="$(mktemp -d)"
server_pid=""
sampler=""
# $1: how many tenths of a second to wait for a clean exit before SIGKILL (default 100).
stop_server() {
  local tenths="${1:-100}"
  if [ -n "$server_pid" ] && kill -0 "$server_pid" 2>/dev/null; then
    kill "$server_pid" 2>/dev/null || true
    local i
    for i in $(seq "$tenths"); do kill -0 "$server_pid" 2>/dev/null || break; sleep 0.1; done
    kill -0 "$server_pid" 2>/dev/null && kill -9 "$server_pid" 2>/dev/null
    wait "$server_pid" 2>/dev/null || true
  fi
  server_pid=""
}
cleanup() {
  if [ -n "$sampler" ]; then kill "$sampler" 2>/dev/null || true; fi
  stop_server
  rm -rf "$work"
}
trap cleanup EXIT

now_us() { local t="$EPOCHREALTIME"; echo "${t/./}"; }

# Starts `serve` on a free port, writes its stdout/stderr to $work/$1.out/.log, sets server_pid
# and port; returns once the port is known.
start_server() {
  local name="$1"
  shift
  port=""
  # a plain command, not a function, in the background: $! is then the JVM itself (taskset and env exec it)
  local launch=(env "$@" java ${JAVA_OPTS:-} -jar "$jar" serve --port 0 --store "sqlite:$work/store.db")
  if [ -n "$server_cpu" ]; then launch=(taskset -c "$server_cpu" "${launch[@]}"); fi
  # made here, not by the background redirect, so that await_ready never reads a file not there yet
  : > "$work/$name.out"
  : > "$work/$name.log"
  "${launch[@]}" > "$work/$name.out" 2> "$work/$name.log" &
  server_pid=$!
}

# Polls every 10 ms until /health/ready answers 200; fails after 60 s or if the server died.
await_ready() {
  local name="$1" deadline=$(( $(now_us) + 60000000 )) code
  while [ "$(now_us)" -lt "$deadline" ]; do
    kill -0 "$server_pid" 2>/dev/null || { tail -20 "$work/$name.log" >&2; die "the server stopped during start-up"; }
    if [ -z "$port" ]; then
      port="$(sed -n 's|^serving on http://127\.0\.0\.1:\([0-9]*\).*|\1|p' "$work/$name.out")"
    fi
    if [ -n "$port" ]; then
      code="$(curl -s -o /dev/null -w '%{http_code}' --max-time 1 "http://127.0.0.1:$port/health/ready" || true)"
      [ "$code" = 200 ] && return 0
    fi
    sleep 0.01
  done
  tail -20 "$work/$name.log" >&2
  die "/health/ready did not answer 200 within 60 s"
}

# --- data, bundle, store -----------------------------------------------------------------
cd "$work"
echo "bench-http: training a bundle on $rows invented listings in $work" >&2
# one run of the generator: the first rows train, the last ones are the request bodies' titles,
# which the model never saw
java -cp "$jar" dev.pressmark.demo.ListingTitles $((rows + BATCH_ITEMS)) --csv > all.csv
head -n $((rows + 1)) all.csv > listings.csv
cp "$root/scripts/bench-train.yaml" train.yaml
java -jar "$jar" train --config train.yaml --out routing.pmb > train.out 2>&1 || { cat train.out >&2; die "training failed"; }

# Request bodies, from the CSV rows past the training set: unquote the title, then quote it for JSON.
json_items() { sed 's/\\/\\\\/g; s/"/\\"/g' | awk 'BEGIN { printf "{\"items\":[" } NR > 1 { printf "," } { printf "{\"title\":\"%s\"}", $0 } END { printf "]}" }'; }
tail -n "$BATCH_ITEMS" all.csv | sed -E 's/\r$//; s/^"(.*)",[^,"]*$/\1/; s/""/"/g' > titles.txt
head -n 1 titles.txt | json_items > one.json
json_items < titles.txt > batch.json

# Publishing through one warm server is quicker than 20 command-line JVMs, and uses the same store code.
token="bench-$RANDOM$RANDOM$RANDOM"
# The set-up server also records the class-data archive that the cold start measures with (as ./pressmark does).
archive="$work/pressmark.jsa"
plain_opts="${JAVA_OPTS:-}"
JAVA_OPTS="$plain_opts -XX:ArchiveClassesAtExit=$archive -Xlog:cds=off -Xlog:cds+dynamic=off"
start_server setup PRESSMARK_ADMIN_TOKEN="$token"
await_ready setup
for i in $(seq 1 "$VERSIONS"); do
  curl -sf -o /dev/null -X PUT -H "Authorization: Bearer $token" -H "Content-Type: application/octet-stream" \
    --data-binary @routing.pmb "http://127.0.0.1:$port/models/routing/versions/v$i" || die "publishing v$i failed"
done
curl -sf -o /dev/null -X PUT -H "Authorization: Bearer $token" -H "Content-Type: application/json" \
  --data '{"tag":"v'"$VERSIONS"'"}' "http://127.0.0.1:$port/models/routing/active" || die "activating v$VERSIONS failed"
# The JVM writes the class-data archive as it exits, which takes many seconds on a loaded machine:
# give it a minute rather than killing it half-way and measuring without an archive.
stop_server 600

# --- (a) cold start ------------------------------------------------------------------------
echo "bench-http: (a) cold start" >&2
[ -f "$archive" ] || die "the set-up server wrote no class-data archive"
# Three starts each, without and with the archive; the median of each.
# not in a subshell: start_server's server_pid and port must reach this shell
cold_start() {
  local t0
  t0="$(now_us)"
  start_server serve PRESSMARK_ADMIN_TOKEN=
  await_ready serve
  runs+=("$(( ($(now_us) - t0) / 1000 ))")
}
median3() { printf '%s\n' "$@" | sort -n | sed -n 2p; }
# Starts use the whole machine (no wrk runs then); only the load runs pin the server to its core.
pinned_cpu="$server_cpu"
server_cpu=""
runs=()
JAVA_OPTS="$plain_opts"
for i in 1 2 3; do cold_start; stop_server; done
cold_ms="$(median3 "${runs[@]}")"
cold_runs="${runs[*]}"
runs=()
JAVA_OPTS="$plain_opts -XX:SharedArchiveFile=$archive -Xlog:cds=off -Xlog:cds+dynamic=off"
for i in 1 2 3; do cold_start; stop_server; done
server_cpu="$pinned_cpu"
# the server for the load runs: the archive, pinned (its start is not measured)
start_server serve PRESSMARK_ADMIN_TOKEN=
await_ready serve
cold_cds_ms="$(median3 "${runs[@]}")"
cold_cds_runs="${runs[*]}"
base="http://127.0.0.1:$port"
answer="$(curl -s -w '\n%{http_code}' -H "Content-Type: application/json" --data-binary @one.json "$base/models/routing/predict")"
[ "${answer##*$'\n'}" = 200 ] || die "a one-item predict did not answer 200: $answer"
case "$answer" in *'"version":"v'"$VERSIONS"'"'*) ;; *) die "predict did not name v$VERSIONS: $answer" ;; esac
batch_answer="$(curl -s -o /dev/null -w '%{http_code}' -H "Content-Type: application/json" --data-binary @batch.json "$base/models/routing/predict")"
[ "$batch_answer" = 200 ] || die "a $BATCH_ITEMS-item predict answered $batch_answer"

# --- wrk helpers ---------------------------------------------------------------------------
commands=()
# Runs wrk with the given arguments into $work/$1.txt; fails on non-2xx answers (a set-up fault).
run_wrk() {
  local name="$1"
  shift
  client_cmd wrk "$@" > "$work/$name.txt" 2>&1 || { cat "$work/$name.txt" >&2; die "wrk failed ($name)"; }
  if grep -q 'Non-2xx or 3xx responses' "$work/$name.txt"; then
    cat "$work/$name.txt" >&2
    die "wrk saw answers other than 2xx ($name)"
  fi
}
# Keeps a wrk command line for the report, with the paths shortened to what a reader would type.
record() { local line="wrk $*"; line="${line//$root\//}"; commands+=("${line//$work\//}"); }
rps() { awk '/^Requests\/sec:/ { printf "%.0f", $2 }' "$work/$1.txt"; }
# One percentile of wrk's --latency distribution, in ms.
pct() {
  awk -v p="$2%" '$1 == p {
      v = $2; unit = v; sub(/[0-9.]+/, "", unit); sub(/[a-z]+$/, "", v)
      f = (unit == "us") ? 0.001 : (unit == "ms") ? 1 : (unit == "s") ? 1000 : (unit == "m") ? 60000 : -1
      printf "%.3f", v * f }' "$work/$1.txt"
}
# wrk prints the line only when there were errors.
socket_errors() { local e; e="$(sed -n 's/^ *Socket errors: //p' "$work/$1.txt")"; echo "${e:-none}"; }

rss_kb() { awk -v k="$2:" '$1 == k { print $2 }' "/proc/$1/status" 2>/dev/null || echo 0; }
# Samples the server's VmRSS every 200 ms while wrk runs; the largest goes to $work/rss-max.
sample_rss() {
  local max=0 v
  while [ ! -f "$work/rss-stop" ] && kill -0 "$server_pid" 2>/dev/null; do
    v="$(rss_kb "$server_pid" VmRSS)"
    [ "${v:-0}" -gt "$max" ] && max="$v" && echo "$max" > "$work/rss-max"
    sleep 0.2
  done
}

common=(-t"$threads" -c"$connections" --latency)
predict_url="$base/models/routing/predict"

# --- (b) peak throughput -------------------------------------------------------------------
echo "bench-http: (b) peak throughput, $duration each after a $warmup warm-up" >&2
rm -f "$work/rss-stop"
echo 0 > "$work/rss-max"
sample_rss &
sampler=$!
run_wrk warm-health "${common[@]}" -d"$warmup" "$base/health"
run_wrk warm-predict "${common[@]}" -d"$warmup" -s "$root/scripts/wrk-post-json.lua" "$predict_url" -- "$work/one.json"
run_wrk health "${common[@]}" -d"$duration" "$base/health"
record "${common[@]}" -d"$duration" "$base/health"
run_wrk predict "${common[@]}" -d"$duration" -s "$root/scripts/wrk-post-json.lua" "$predict_url" -- "$work/one.json"
record "${common[@]}" -d"$duration" -s "$root/scripts/wrk-post-json.lua" "$predict_url" -- "$work/one.json"
touch "$work/rss-stop"
wait "$sampler"
sampler=""
rss_during_kb="$(cat "$work/rss-max")"
rss_after_kb="$(rss_kb "$server_pid" VmRSS)"
hwm_after_kb="$(rss_kb "$server_pid" VmHWM)"
health_rps="$(rps health)"
predict_rps="$(rps predict)"
[ -n "$health_rps" ] && [ -n "$predict_rps" ] && [ "$health_rps" -gt 0 ] || die "cannot read Requests/sec from wrk"
ratio="$(awk -v a="$predict_rps" -v b="$health_rps" 'BEGIN { printf "%.2f", a / b }')"

# --- (c) latency at half the predict peak --------------------------------------------------
target_rps=$(( predict_rps > 1 ? predict_rps / 2 : 1 ))
# Each connection sends one request per (pause + latency), so pauses of connections/target alone
# fall short of the target by the latency. A short calibration run at that pause measures the
# shortfall; the measured run then pauses less by it: rate = c / (p + L), so from the achieved
# rate r1 at pause p1, L = c/r1 - p1, and the pause for the target is c/target - L.
first_pause_ms="$(awk -v c="$connections" -v r="$target_rps" 'BEGIN { printf "%.3f", c * 1000 / r }')"
if [ "$quick" = 1 ]; then calibration=1s; else calibration=5s; fi
run_wrk paced-calibration "${common[@]}" -d"$calibration" -s "$root/scripts/wrk-post-json-paced.lua" "$predict_url" -- "$work/one.json" "$first_pause_ms"
calibration_rps="$(rps paced-calibration)"
# never below 0.05 ms: were the latency alone longer than the target's spacing, no pause would reach it
pause_ms="$(awk -v c="$connections" -v r="$target_rps" -v r1="$calibration_rps" -v p1="$first_pause_ms" \
  'BEGIN { p = (r1 > 0) ? c * 1000 / r - (c * 1000 / r1 - p1) : p1; if (p < 0.05) p = 0.05; printf "%.3f", p }')"
echo "bench-http: (c) predict paced at $target_rps requests/s (mean pause $pause_ms ms per connection; $first_pause_ms ms gave $calibration_rps requests/s in $calibration)" >&2
run_wrk paced "${common[@]}" -d"$duration" -s "$root/scripts/wrk-post-json-paced.lua" "$predict_url" -- "$work/one.json" "$pause_ms"
record "${common[@]}" -d"$duration" -s "$root/scripts/wrk-post-json-paced.lua" "$predict_url" -- "$work/one.json" "$pause_ms"
paced_rps="$(rps paced)"

# --- (d) a 1,000-item batch ----------------------------------------------------------------
echo "bench-http: (d) $BATCH_ITEMS-item requests on one connection" >&2
run_wrk warm-batch -t1 -c1 --latency -d"$warmup" -s "$root/scripts/wrk-post-json.lua" "$predict_url" -- "$work/batch.json"
log_mark="$(wc -l < "$work/serve.log")"
run_wrk batch -t1 -c1 --latency -d"$duration" -s "$root/scripts/wrk-post-json.lua" "$predict_url" -- "$work/batch.json"
record -t1 -c1 --latency -d"$duration" -s "$root/scripts/wrk-post-json.lua" "$predict_url" -- "$work/batch.json"
# The access log (logger dev.pressmark.access, one line per request with ms=), when the server
# writes one, gives the server's own time; else wrk's latency on one connection stands in for it.
tail -n +"$((log_mark + 1))" "$work/serve.log" | grep 'dev\.pressmark\.access' | grep -o ' ms=[0-9.]*' | cut -d= -f2 | sort -n > "$work/batch-ms" || true
if [ -s "$work/batch-ms" ]; then
  n="$(wc -l < "$work/batch-ms")"
  batch_p50="$(awk -v n="$n" 'NR == int((n + 1) / 2) { print; exit }' "$work/batch-ms")"
  batch_p99="$(awk -v n="$n" 'NR == int(n * 0.99 + 0.999) { print; exit }' "$work/batch-ms")"
  batch_source="server time from the access log (ms=), $n requests"
else
  batch_p50="$(pct batch 50)"
  batch_p99="$(pct batch 99)"
  batch_source="wrk latency on 1 connection (no access log in the server's output)"
fi

# --- (f) shadow scoring --------------------------------------------------------------------
shadow_rows=""
if [ "$shadow" = 1 ]; then
  echo "bench-http: (f) predict peak without, with (fraction $SHADOW_FRACTION) and again without a shadow candidate" >&2
  store_url="sqlite:$work/store.db"
  run_wrk shadow-off-1 "${common[@]}" -d"$duration" -s "$root/scripts/wrk-post-json.lua" "$predict_url" -- "$work/one.json"
  java -jar "$jar" shadow routing "v$((VERSIONS - 1))" --fraction "$SHADOW_FRACTION" --store "$store_url" > "$work/shadow-start.out" 2>&1 \
    || { cat "$work/shadow-start.out" >&2; die "starting the shadow failed"; }
  # the server reads the store's shadows every second
  deadline=$(( $(now_us) + 10000000 ))
  until curl -sf "$base/models/routing/shadow" | grep -q '"running":true'; do
    [ "$(now_us)" -lt "$deadline" ] || die "the server did not take up the shadow within 10 s"
    sleep 0.2
  done
  run_wrk shadow-warm "${common[@]}" -d"$warmup" -s "$root/scripts/wrk-post-json.lua" "$predict_url" -- "$work/one.json"
  run_wrk shadow-on "${common[@]}" -d"$duration" -s "$root/scripts/wrk-post-json.lua" "$predict_url" -- "$work/one.json"
  record "${common[@]}" -d"$duration" -s "$root/scripts/wrk-post-json.lua" "$predict_url" -- "$work/one.json" "  # with the shadow running"
  shadow_report="$(curl -sf "$base/models/routing/shadow")" || die "GET /models/routing/shadow failed"
  java -jar "$jar" shadow routing --stop --store "$store_url" > "$work/shadow-stop.out" 2>&1 \
    || { cat "$work/shadow-stop.out" >&2; die "stopping the shadow failed"; }
  deadline=$(( $(now_us) + 10000000 ))
  until curl -sf "$base/models/routing/shadow" | grep -q '"running":false'; do
    [ "$(now_us)" -lt "$deadline" ] || die "the server did not stop the shadow within 10 s"
    sleep 0.2
  done
  run_wrk shadow-off-2 "${common[@]}" -d"$duration" -s "$root/scripts/wrk-post-json.lua" "$predict_url" -- "$work/one.json"
  json_number() { printf '%s' "$shadow_report" | grep -o "\"$1\":[0-9.eE+-]*" | head -n 1 | cut -d: -f2; }
  off1="$(rps shadow-off-1)"; on="$(rps shadow-on)"; off2="$(rps shadow-off-2)"
  shadow_ratio="$(awk -v on="$on" -v a="$off1" -v b="$off2" 'BEGIN { printf "%.2f", on / ((a + b) / 2) }')"
  shadow_rows="| (f) POST predict, 1 item, peak without a shadow, before / after | $off1 / $off2 req/s | |
| (f) the same with a shadow candidate on a fraction $SHADOW_FRACTION | $on req/s | |
| (f) with / without (mean of before and after) | $shadow_ratio | |
| (f) shadow samples / dropped when measured | $(json_number samples) / $(json_number dropped) items | |"
fi
stop_server

# --- report --------------------------------------------------------------------------------
mb() { awk -v k="$1" 'BEGIN { printf "%.0f MiB", k / 1024 }'; }
if [ -n "$server_cpu" ]; then
  pinning="server on CPU $server_cpu, wrk on CPU $client_cpu (taskset)"
else
  pinning="not pinned"
fi
report="$(cat <<EOF
## pressmark HTTP benchmark ($( [ "$quick" = 1 ] && echo quick || echo full ) mode)

$(date -u +%Y-%m-%dT%H:%M:%SZ), commit $(git -C "$root" rev-parse --short HEAD 2>/dev/null || echo unknown), $(nproc) cores, $(java -version 2>&1 | sed -n 1p), $(wrk --version 2>&1 | sed -n 1p | cut -d' ' -f1-2).
Store: SQLite, $VERSIONS versions of one bundle, v$VERSIONS active. Pinning (load runs only): $pinning.
wrk: $threads threads, $connections connections, $duration per run after a $warmup warm-up; JAVA_OPTS: ${plain_opts:-(none)} (plus the archive options where named).

| measure | value | goal |
|---|---|---|
| (a) cold start: launch to first 200 from /health/ready, median of 3 ($cold_runs ms) | $cold_ms ms | < 2000 ms |
| (a) the same with the class-data archive that \`./pressmark serve\` records and uses ($cold_cds_runs ms) | $cold_cds_ms ms | < 2000 ms |
| (b) GET /health peak | $health_rps req/s | |
| (b) POST predict, 1 item, peak | $predict_rps req/s | |
| (b) predict / health | $ratio | >= 0.7 |
| (c) predict paced at half the peak: achieved rate | $paced_rps req/s (target $target_rps; mean pause $pause_ms ms per connection, calibrated: $first_pause_ms ms gave $calibration_rps req/s) | |
| (c) p50 / p99 at that rate | $(pct paced 50) / $(pct paced 99) ms | p99 < 5 ms |
| (d) $BATCH_ITEMS-item predict, p50 / p99 | $batch_p50 / $batch_p99 ms | < 20 ms |
| (e) server VmRSS, largest during (b) | $(mb "$rss_during_kb") | |
| (e) server VmRSS / VmHWM after (b) | $(mb "$rss_after_kb") / $(mb "$hwm_after_kb") | |
${shadow_rows}

(d) is $batch_source. Socket errors: health $(socket_errors health); predict $(socket_errors predict); paced $(socket_errors paced); batch $(socket_errors batch).

\`\`\`
$(printf '%s\n' "${commands[@]}")
\`\`\`
EOF
)"
echo "$report"
if [ -n "$out" ]; then
  printf '%s\n' "$report" > "$out"
fi
