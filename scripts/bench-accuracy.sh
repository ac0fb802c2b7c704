#!/usr/bin/env bash
# Test accuracy of pressmark against the strongest simple baseline, scikit-learn's tf-idf with a
# linear SVM, on the same rows of open labelled data sets (scripts/fetch-bench-data.sh).
#
#   scripts/bench-accuracy.sh [--out FILE.md] [SET...]
#
# SETs: names-gender cities-country mail-subjects verb-glosses (default: all four).
# For each set: one stratified split (test share 0.25, seed 7) written as train.csv and test.csv;
# the reference grid (scripts/bench_accuracy.py: char_wb 1-4, 1-5 and word 1-2 tf-idf, LinearSVC
# at C 0.3, 1, 3; its best test accuracy); then `pressmark train --config
# scripts/bench-accuracy/SET.yaml --test-data test.csv` on train.csv, its accuracy and macro F1
# read from `pressmark inspect --json`, and its wall time (the whole command: JVM start, CSV
# reading, cross-validation or search, final fit, test, bundle). One Markdown table at the end,
# also written to --out. Work files stay in $BENCH_DIR (default /tmp/pressmark-bench-accuracy).
# The reference runs on Debian's /usr/bin/python3 with python3-sklearn, installed when missing.
set -euo pipefail

here="$(cd "$(dirname "$0")" && pwd)"
root="$(dirname "$here")"
python=/usr/bin/python3
work="${BENCH_DIR:-/tmp/pressmark-bench-accuracy}"
data="${BENCH_DATA:-$HOME/.cache/pressmark/bench-data}"
out=""
sets=()
while [ $# -gt 0 ]; do
  case "$1" in
    --out) out="$2"; shift 2 ;;
    -h|--help) sed -n '2,17p' "$0"; exit 0 ;;
    -*) echo "bench-accuracy: unknown option $1" >&2; exit 2 ;;
    *) sets+=("$1"); shift ;;
  esac
done
[ ${#sets[@]} -gt 0 ] || sets=(names-gender cities-country mail-subjects verb-glosses)
for set in "${sets[@]}"; do
  [ -f "$here/bench-accuracy/$set.yaml" ] || { echo "bench-accuracy: no config $here/bench-accuracy/$set.yaml" >&2; exit 2; }
done

if ! "$python" -c 'import sklearn' 2>/dev/null; then
  echo "bench-accuracy: installing Debian's python3-sklearn" >&2
  apt-get update -qq && DEBIAN_FRONTEND=noninteractive apt-get install -y -qq python3-sklearn >&2
fi
"$here/fetch-bench-data.sh" "$data"
"$root/pressmark" --version >/dev/null   # builds the jar on first use

log() { echo "bench-accuracy: $*" >&2; }
load_before=$(cat /proc/loadavg)
dirs=()
for set in "${sets[@]}"; do
  dir="$work/$set"
  rm -rf "$dir" && mkdir -p "$dir"
  log "$set: split"
  "$python" "$here/bench_accuracy.py" split "$data/$set.csv" "$dir"
  log "$set: reference grid"
  "$python" "$here/bench_accuracy.py" reference "$dir"
  log "$set: pressmark"
  cp "$here/bench-accuracy/$set.yaml" "$dir/pressmark.yaml"
  start=$(date +%s.%N)
  "$root/pressmark" train --config "$dir/pressmark.yaml" --test-data "$dir/test.csv" --out "$dir/pressmark.pmb" \
    >"$dir/train.out" 2>"$dir/train.err" || { cat "$dir/train.err" >&2; exit 1; }
  end=$(date +%s.%N)
  "$root/pressmark" inspect "$dir/pressmark.pmb" --json >"$dir/inspect.json"
  summary=$(sed -n 's/^# table: //p' "$dir/pressmark.yaml" | head -1)
  "$python" "$here/bench_accuracy.py" pressmark "$dir" "$dir/inspect.json" "$(echo "$end - $start" | bc)" \
    "${summary:-$set.yaml}"
  dirs+=("$dir")
done

report=$(
  echo "Commit $(git -C "$root" rev-parse --short HEAD), $(date -u +%Y-%m-%dT%H:%MZ), $(nproc) cores," \
    "$(java -version 2>&1 | head -1), scikit-learn $("$python" -c 'import sklearn; print(sklearn.__version__)');" \
    "load average before: $load_before; after: $(cat /proc/loadavg)."
  echo
  "$python" "$here/bench_accuracy.py" table "${dirs[@]}"
)
echo "$report"
if [ -n "$out" ]; then
  echo "$report" >"$out"
fi
