#!/usr/bin/env bash
# pressmark's SVM solver against the C LIBLINEAR on one large matrix, in one run.
#
#   scripts/bench-solver.sh [--c C] [--tolerance TOL] [--repeats N] [--out FILE.md]
#
# (defaults: C 1, tolerance 0.1, 7 timed solves a side). scripts/bench_solver.py builds the
# char_wb 1-5 tf-idf matrix of the 82,124 place names of cities-country.csv (fetched by
# scripts/fetch-bench-data.sh), labels them Romance-language country or not, writes it in the
# svmlight format and times scikit-learn's LinearSVC on it (squared hinge, dual, no intercept: the
# C LIBLINEAR's L2R_L2LOSS_SVC_DUAL). Then SvmLightSolveBenchmark (JMH, model-core's bench profile)
# reads the same file and times pressmark's solver at the same C, loss, tolerance and iteration
# cap, without a bias. Prints both objectives, both times and the ratios; also to --out.
# Work files stay in $BENCH_DIR (default /tmp/pressmark-bench-solver).
set -euo pipefail

here="$(cd "$(dirname "$0")" && pwd)"
root="$(dirname "$here")"
python=/usr/bin/python3
work="${BENCH_DIR:-/tmp/pressmark-bench-solver}"
data="${BENCH_DATA:-$HOME/.cache/pressmark/bench-data}"
c=1
tolerance=0.1
repeats=7
out=""
while [ $# -gt 0 ]; do
  case "$1" in
    --c) c="$2"; shift 2 ;;
    --tolerance) tolerance="$2"; shift 2 ;;
    --repeats) repeats="$2"; shift 2 ;;
    --out) out="$2"; shift 2 ;;
    -h|--help) sed -n '2,14p' "$0"; exit 0 ;;
    *) echo "bench-solver: unknown argument $1" >&2; exit 2 ;;
  esac
done

if ! "$python" -c 'import sklearn' 2>/dev/null; then
  echo "bench-solver: installing Debian's python3-sklearn" >&2
  apt-get update -qq && DEBIAN_FRONTEND=noninteractive apt-get install -y -qq python3-sklearn >&2
fi
"$here/fetch-bench-data.sh" "$data"
rm -rf "$work" && mkdir -p "$work"
load_before=$(cat /proc/loadavg)

echo "bench-solver: reference (scikit-learn LinearSVC, the C LIBLINEAR), $repeats solves" >&2
"$python" "$here/bench_solver.py" "$data/cities-country.csv" "$work" "$c" "$tolerance" "$repeats" >/dev/null

echo "bench-solver: pressmark (SvmLightSolveBenchmark), 3 warm-up and $repeats timed solves" >&2
(cd "$root" && mvn -q -B -o -pl model-core -Pbench test-compile exec:exec -Djmh.args="SvmLightSolveBenchmark \
  -p file=$work/problem.svm -p c=$c -p tolerance=$tolerance -p referenceWeights=$work/reference.w \
  -wi 3 -i $repeats -rf json -rff $work/jmh.json") >"$work/jmh.out" 2>&1 || { tail -40 "$work/jmh.out" >&2; exit 1; }
load_after=$(cat /proc/loadavg)

report=$("$python" - "$work" "$load_before" "$load_after" "$(git -C "$root" rev-parse --short HEAD)" <<'EOF'
import json, re, statistics, sys
work, before, after, commit = sys.argv[1:]
ref = json.load(open(work + "/reference.json"))
jmh = json.load(open(work + "/jmh.json"))[0]
ours_ms = [v for fork in jmh["primaryMetric"]["rawData"] for v in fork]
text = open(work + "/jmh.out").read()
ours = re.search(r"solver-bench: ours objective (\S+) passes (\d+) converged (\S+)", text)
at_ref = re.search(r"solver-bench: reference-weights objective (\S+)", text)
ours_obj, ref_obj = float(ours.group(1)), ref["objective"]
ours_med, ref_med = statistics.median(ours_ms) / 1000, ref["median_s"]
print("Commit %s; problem: %d rows x %d features, %d non-zeros, %d positive; C %g, squared hinge, no bias, "
      "tolerance %g, at most 1000 passes. Load average before: %s; after: %s."
      % (commit, ref["rows"], ref["features"], ref["non_zeros"], ref["positives"], ref["c"], ref["tolerance"], before, after))
print()
print("| | C LIBLINEAR (scikit-learn LinearSVC) | pressmark | pressmark / C |")
print("|---|---|---|---|")
print("| primal objective | %.6f | %.6f | %.6f |" % (ref_obj, ours_obj, ours_obj / ref_obj))
print("| the reference's weights, objective by pressmark's function | %s | | |" % (at_ref.group(1) if at_ref else "n/a"))
print("| passes | %d | %s (converged: %s) | |" % (ref["passes"], ours.group(2), ours.group(3)))
print("| solve time, median of %d | %.3f s | %.3f s | **%.2f** |" % (len(ours_ms), ref_med, ours_med, ours_med / ref_med))
print("| solve time, fastest | %.3f s | %.3f s | %.2f |" % (ref["min_s"], min(ours_ms) / 1000, min(ours_ms) / 1000 / ref["min_s"]))
print("| fit stopped after one pass (conversion, set-up, one pass), median | %.3f s | | |" % ref["one_pass_median_s"])
print("| solve times | %s | %s | |" % (", ".join("%.3f" % t for t in ref["times_s"]), ", ".join("%.3f" % (t / 1000) for t in ours_ms)))
print()
print("Goals: objective within 0.1 %%: %s; time at most 1.0x: %s."
      % ("met" if abs(ours_obj / ref_obj - 1) <= 0.001 else "missed", "met" if ours_med <= ref_med else "missed"))
EOF
)
echo "$report"
if [ -n "$out" ]; then
  echo "$report" >"$out"
fi
