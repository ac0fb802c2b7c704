#!/usr/bin/env bash
# Scoring 1,000,000 invented listing titles with the demo's v2 model (WordPiece subwords, Platt
# probabilities): `pressmark predict --data` on one machine against the Spark job in local mode on
# the same rows, bundle and CSV, each timed end to end (JVM start included). A run of the Spark job
# on one row gives its fixed cost (JVM, Spark session, store), reported beside it, and so does a
# run of the local command on one row (JVM start, bundle load): "like for like" compares the two
# less their one-row runs. Prints a Markdown table; the rows per second per core are what
# docs/benchmarks.md records with the machine's load.
#
#   scripts/bench-spark.sh [ROWS]        # default 1000000
#
# The local command runs through ./pressmark (its JVM options) with --threads 1, so its rows/s is
# per core. BENCH_REF_JOB=JAR also times the job from another pressmark-spark.jar (an earlier
# build, say) in the same run, for a before/after ratio under the same load. Each job's `local[1]`
# CSV output is compared with the local command's (`--out`, an untimed run): equal when every line,
# less the job's last column (`version`), is the same bytes.
#
# BENCH_WARM_RUNS=N also runs each job N times in one JVM (`local[1]`, a new Spark session per run)
# and prints the process's CPU seconds per run: past the first two, the JIT has compiled the hot
# code, so the figure is the job's own CPU for the rows with little start-up in it; CPU seconds
# are what a busy machine disturbs least.
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
spark_cp="$(cat "$work/spark.classpath")"
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
spark_job() { # JAR MASTER INPUT OUTPUT
  java $opts -Dspark.master="$2" -Dspark.driver.host=127.0.0.1 -Dspark.ui.enabled=false -Dspark.sql.shuffle.partitions=4 \
      -cp "$1:$spark_cp" dev.pressmark.spark.ScoreJob --model routing:v2 --store "$store" --input "$3" --output "$4" --format csv
}
load() { cut -d' ' -f1-3 /proc/loadavg; }

# a first one-row run records the launcher's class-data archive for predict, as a user's first run does
"$root/pressmark" predict routing.pmb --data one.csv > /dev/null 2>&1
local1_s=$(seconds taskset -c 0 "$root/pressmark" predict routing.pmb --data one.csv --threads 1)
local_s=$(seconds taskset -c 0 "$root/pressmark" predict routing.pmb --data titles.csv --threads 1); local_load=$(load)
"$root/pressmark" predict routing.pmb --data titles.csv --threads 1 --out local.csv 2> /dev/null
python3 - <<'PY'
lines = open("titles.csv", encoding="utf-8").read().splitlines()
header, body = lines[0], lines[1:]
import os
os.makedirs("titles4", exist_ok=True)
for k in range(4):
    with open(f"titles4/part-{k}.csv", "w", encoding="utf-8") as f:
        f.write(header + "\n" + "\n".join(body[k::4]) + "\n")
PY
# JAR NAME: times the job from JAR on one row and on every row, local[1] and local[2]; appends a line to jobs.txt
measure_job() {
  local f1 s1 l1 f2 s2 l2
  rm -rf out-one-1 out-1 out-one-2 out-2
  f1=$(seconds spark_job "$1" 'local[1]' one.csv out-one-1)
  s1=$(seconds spark_job "$1" 'local[1]' titles.csv out-1); l1=$(load | tr ' ' '/')
  f2=$(seconds spark_job "$1" 'local[2]' one.csv out-one-2)
  s2=$(seconds spark_job "$1" 'local[2]' titles4 out-2); l2=$(load | tr ' ' '/')
  local same=differs
  if cat out-1/part-* | sed 's/,[^,]*$//' | cmp -s - local.csv; then same=equal; fi
  echo "$2 $f1 $s1 $l1 $f2 $s2 $l2 $(cat out-1/part-* | grep -c '' || true) $same" >> jobs.txt
}
if [ -n "${BENCH_REF_JOB:-}" ]; then measure_job "$BENCH_REF_JOB" reference; fi
measure_job "$job" this
cat > Warm.java <<'JAVA'
import java.lang.management.ManagementFactory;
/** ScoreJob.main ARGS[1].. run ARGS[0] times in this JVM; prints the process's CPU seconds per run. */
public class Warm {
    public static void main(String[] args) throws Exception {
        var os = (com.sun.management.OperatingSystemMXBean) ManagementFactory.getOperatingSystemMXBean();
        StringBuilder runs = new StringBuilder();
        for (int i = 0; i < Integer.parseInt(args[0]); i++) {
            String[] job = java.util.Arrays.copyOfRange(args, 1, args.length + 2);
            job[job.length - 2] = "--output";
            job[job.length - 1] = "warm-" + i;
            long cpu = os.getProcessCpuTime();
            Class.forName("dev.pressmark.spark.ScoreJob").getMethod("main", String[].class).invoke(null, (Object) job);
            runs.append(String.format(" %.2f", (os.getProcessCpuTime() - cpu) / 1e9));
        }
        System.out.println(runs.toString().strip());
    }
}
JAVA
warm() { # JAR NAME: CPU seconds of each run
  rm -rf warm-*
  echo "$2: $(java $opts -Dspark.master='local[1]' -Dspark.driver.host=127.0.0.1 -Dspark.ui.enabled=false -cp "$1:$spark_cp" Warm.java \
      "$BENCH_WARM_RUNS" --model routing:v2 --store "$store" --input titles.csv --format csv 2> run.log | tail -1) (load $(load))" >> warm.txt
}
if [ -n "${BENCH_WARM_RUNS:-}" ]; then
  for round in 1 2; do
    if [ -n "${BENCH_REF_JOB:-}" ]; then warm "$BENCH_REF_JOB" reference; fi
    warm "$job" this
  done
fi
python3 - "$rows" "$local_s" "$local_load" "$local1_s" <<'PY'
import sys
rows = int(sys.argv[1]); local = float(sys.argv[2]); local1 = float(sys.argv[4])
def rate(s): return f"{rows / s:,.0f}"
print(f"| run ({rows:,} rows, CSV in and out) | wall s | rows/s | rows/s per core | load (1/5/15 min) after |")
print("|---|---|---|---|---|")
print(f"| `pressmark predict --data --threads 1` on CPU 0 | {local:.2f} | {rate(local)} | {rate(local)} | {sys.argv[3]} |")
print(f"| the same less its one-row run ({local1:.2f} s) | {local - local1:.2f} | {rate(local - local1)} | {rate(local - local1)} | |")
ratios = []
for line in open("jobs.txt"):
    name, fixed1, spark1, load1, fixed2, spark2, load2, lines, same = line.split()
    fixed1, spark1, fixed2, spark2 = map(float, (fixed1, spark1, fixed2, spark2))
    load1, load2 = load1.replace("/", " "), load2.replace("/", " ")
    print(f"| {name}: Spark job, `local[1]`, end to end | {spark1:.2f} | {rate(spark1)} | {rate(spark1)} | {load1} |")
    print(f"| {name}: Spark job, `local[1]`, less its one-row run ({fixed1:.2f} s) | {spark1 - fixed1:.2f} | {rate(spark1 - fixed1)} | {rate(spark1 - fixed1)} | |")
    print(f"| {name}: Spark job, `local[2]`, 4 input files, end to end | {spark2:.2f} | {rate(spark2)} | {rows / spark2 / 2:,.0f} | {load2} |")
    print(f"| {name}: Spark job, `local[2]`, less its one-row run ({fixed2:.2f} s) | {spark2 - fixed2:.2f} | {rate(spark2 - fixed2)} | {rows / (spark2 - fixed2) / 2:,.0f} | |")
    ratios.append(f"{name}: Spark per core / local predict per core, end to end: local[1] {local / spark1:.2f}x, local[2] {local / spark2 / 2:.2f}x; "
                  f"scoring only: local[1] {local / (spark1 - fixed1):.2f}x, local[2] {local / (spark2 - fixed2) / 2:.2f}x; "
                  f"like for like (both less their one-row runs): local[1] {(local - local1) / (spark1 - fixed1):.2f}x, "
                  f"local[2] {(local - local1) / (spark2 - fixed2) / 2:.2f}x "
                  f"(CSV lines written by local[1], header included: {lines}; less the version column, "
                  f"{'byte for byte' if same == 'equal' else 'not'} the local command's output)")
print()
for r in ratios:
    print(r)
PY
if [ -f warm.txt ]; then
  echo
  echo "CPU seconds of each of $BENCH_WARM_RUNS runs of the job on $rows rows in one JVM, local[1], two rounds:"
  cat warm.txt
fi
