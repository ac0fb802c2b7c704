#!/usr/bin/env bash
# Learns a WordPiece vocabulary from invented listing titles of a fictional hardware
# marketplace, then encodes a few titles with it. Builds the jar on first use.
set -euo pipefail
root="$(cd "$(dirname "$0")/.." && pwd)"
jar="$root/server/target/pressmark.jar"
if [ ! -f "$jar" ]; then
  echo "vocab-example: building $jar" >&2
  (cd "$root" && mvn -q -B package -DskipTests) >&2
fi
work="${1:-$(mktemp -d)}"
mkdir -p "$work"

java -cp "$jar" dev.pressmark.demo.ListingTitles 20000 > "$work/titles.txt"
echo "vocab-example: 20,000 invented titles in $work/titles.txt, e.g.:" >&2
head -3 "$work/titles.txt" | sed 's/^/  /' >&2

java -jar "$jar" vocab train --data "$work/titles.txt" --size 1000 --out "$work/vocab.txt"

echo "vocab-example: encoding three titles, one of them with a brand the titles never had:" >&2
printf '%s\n' "Torvikline ball valve 3/4in" "Aquaholt dimmer swtich, pack of 4" "Brassmoraward hex bolt M8" \
  | java -jar "$jar" vocab encode --vocab "$work/vocab.txt"
