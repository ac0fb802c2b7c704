#!/usr/bin/env bash
# Scoring 1,000,000 invented listing titles with the demo's v2 model (WordPiece subwords, Platt
# probabilities): `pressmark predict --data` on one machine against the Spark job in local mode on
# the same rows, bundle and CSV, each timed end to end (JVM start included). A run of the Spark job
# on one row gives its fixed cost (JVM, Spark session, store), reported beside it. Prints a Markdown
# table; the rows per second per core are what docs/benchmarks.md records with the machine's load.
#
#   scripts/bench-spark.sh [ROWS]        # default 1000000
set -euo pipefail
root="$(cd "$(dirname "$0")/.." && pwd)"
rows="${1:-1000000}"
work="$(mktemp -d)"
trap 'rm -rf "$work"' EXIT
cd "$root"
mvn -q -B package -pl server,spark -am -DskipTests dependency:build-classpath \
    -Dmdep.includeScope=provided -Dmdep.outputFile="$work/spark.classpath" >&2
cli="$root/server/target/pressmark.jar"
job="$root/spark/target/pressmark-spark.jar"
cp="$job:$(cat "$work/spark.classpath")"
# the JVM options Spark's launcher adds (spark/pom.xml, spark.jvm.options)
opts=$(sed -n 's:.*<spark.jvm.options>\(.*\)</spark.jvm.options>.*:\1:p' spark/pom.xml)
store="sqlite:$work/pressmark.db"

cd "$work"
java -cp "$cli" dev.pressmark.demo.ListingTitles 15000 --csv > listings.csv
cat > train.yaml <<'YAML'
name: routing
data: {file: listings.csv, text: [title], label: department}
split: {test_fraction: 0.25, stratify: true, seed: 7}
tokenizer: {kind: wordpiece, vocab_size: 1000}
features: {max_tokens: 800, weighting: tf, scaling: l2}
classifier: {kind: linear-svm, c: 1.0, probabilities: platt}
evaluation: {folds: 5}
YAML
java -jar "$cli" train --config train.yaml --out routing.pmb > /dev/null 2>&1
java -jar "$cli" publish routing.pmb --name routing --tag v2 --activate --store "$store" > /dev/null
# the rows to score: the generator's titles, one column
java -cp "$cli" dev.pressmark.demo.ListingTitles "$rows" --csv | python3 -c '
import csv, sys
r = csv.reader(sys.stdin); w = csv.writer(sys.stdout, lineterminator="\n")
for row in r: w.writerow(row[:1])' > titles.csv
head -2 titles.csv > one.csv

seconds() { # COMMAND...: its wall time; its output goes to run.log, shown if it fails
  local t0 t1
  t0=$(date +%s.%N)
  if ! "$@" > /dev/null 2> run.log; then cat run.log >&2; exit 1; fi
  t1=$(date +%s.%N)
  python3 -c "print(f'{$t1 - $t0:.2f}')"
}
spark_job() { # MASTER INPUT OUTPUT
  java $opts -Dspark.master="$1" -Dspark.driver.host=127.0.0.1 -Dspark.ui.enabled=false -Dspark.sql.shuffle.partitions=4 \
      -cp "$cp" dev.pressmark.spark.ScoreJob --model routing:v2 --store "$store" --input "$2" --output "$3" --format csv
}
load() { cut -d' ' -f1-3 /proc/loadavg; }

local_s=$(seconds java -jar "$cli" predict routing.pmb --data titles.csv); local_load=$(load)
fixed1_s=$(seconds spark_job 'local[1]' one.csv out-one-1)
spark1_s=$(seconds spark_job 'local[1]' titles.csv out-1); spark1_load=$(load)
# two cores need two input splits: the same rows as 4 files
python3 - <<'PY'
lines = open("titles.csv", encoding="utf-8").read().splitlines()
header, body = lines[0], lines[1:]
import os
os.makedirs("titles4", exist_ok=True)
for k in range(4):
    with open(f"titles4/part-{k}.csv", "w", encoding="utf-8") as f:
        f.write(header + "\n" + "\n".join(body[k::4]) + "\n")
PY
fixed2_s=$(seconds spark_job 'local[2]' one.csv out-one-2)
spark2_s=$(seconds spark_job 'local[2]' titles4 out-2); spark2_load=$(load)
scored=$(cat out-1/part-*.csv | grep -c '' || true)

python3 - "$rows" "$local_s" "$local_load" "$fixed1_s" "$spark1_s" "$spark1_load" "$fixed2_s" "$spark2_s" "$spark2_load" "$scored" <<'PY'
import sys
rows = int(sys.argv[1]); local = float(sys.argv[2]); fixed1, spark1 = float(sys.argv[4]), float(sys.argv[5])
fixed2, spark2 = float(sys.argv[7]), float(sys.argv[8])
def rate(s): return f"{rows / s:,.0f}"
print(f"| run ({rows:,} rows, CSV in and out) | wall s | rows/s | rows/s per core | load (1/5/15 min) after |")
print("|---|---|---|---|---|")
print(f"| `pressmark predict --data` (one scoring thread) | {local:.2f} | {rate(local)} | {rate(local)} | {sys.argv[3]} |")
print(f"| Spark job, `local[1]`, end to end | {spark1:.2f} | {rate(spark1)} | {rate(spark1)} | {sys.argv[6]} |")
print(f"| Spark job, `local[1]`, less its one-row run ({fixed1:.2f} s) | {spark1 - fixed1:.2f} | {rate(spark1 - fixed1)} | {rate(spark1 - fixed1)} | |")
print(f"| Spark job, `local[2]`, 4 input files, end to end | {spark2:.2f} | {rate(spark2)} | {rows / spark2 / 2:,.0f} | {sys.argv[9]} |")
print(f"| Spark job, `local[2]`, less its one-row run ({fixed2:.2f} s) | {spark2 - fixed2:.2f} | {rate(spark2 - fixed2)} | {rows / (spark2 - fixed2) / 2:,.0f} | |")
print()
print(f"Spark per core / local predict, end to end: local[1] {local / spark1:.2f}x, local[2] {local / spark2 / 2:.2f}x; "
      f"scoring only: local[1] {local / (spark1 - fixed1):.2f}x, local[2] {local / (spark2 - fixed2) / 2:.2f}x")
print(f"(CSV lines written by the local[1] job, headers included: {sys.argv[10]})")
PY
