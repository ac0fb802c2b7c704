#!/usr/bin/env bash
# The main job on invented data, with the embedded default store: generate listing titles of a
# fictional hardware marketplace, train a classifier with cross-validation and a held-out test,
# publish the bundle into a SQLite store under an immutable tag, and predict with it.
# Builds the jar on first use. Everything goes into one working directory (argument 1, or a
# new temporary one).
set -euo pipefail
root="$(cd "$(dirname "$0")/.." && pwd)"
jar="$root/server/target/pressmark.jar"
if [ ! -f "$jar" ]; then
  echo "quick-start: building $jar" >&2
  (cd "$root" && mvn -q -B package -DskipTests) >&2
fi
work="${1:-$(mktemp -d)}"
mkdir -p "$work"
cd "$work"
pressmark() { java -jar "$jar" "$@"; }

java -cp "$jar" dev.pressmark.demo.ListingTitles 20000 --csv > listings.csv
cat > train.yaml <<'YAML'
name: routing
data: {file: listings.csv, text: [title], label: department}
tokenizer: {kind: wordpiece, vocab_size: 1500}
features: {max_tokens: 800, weighting: tf, scaling: l2}
classifier: {kind: linear-svm, c: 1.0, probabilities: platt}
evaluation: {folds: 5}
YAML
echo "quick-start: training on 20,000 invented listings in $work" >&2
pressmark train --config train.yaml --out routing.pmb
pressmark publish routing.pmb --name routing --tag 1.0.0 --activate --store "sqlite:$work/pressmark.db"
pressmark versions routing --store "sqlite:$work/pressmark.db"
echo "quick-start: predictions for brands the data never had, a typing slip, and parts every department sells:" >&2
pressmark predict routing.pmb "Quorubwick service kit 3/4in" "Zentazlin dimmer swtich, pack of 4" "Kragopeau mounting bracket M8"
echo "quick-start: the report is $work/routing.pmb.html" >&2
