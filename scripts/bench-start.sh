#!/usr/bin/env bash
# Start-up of two builds of pressmark, measured against each other in the same run:
#   serve:    launch of `serve` to the first 200 from /health/ready, store of 20 versions
#   versions: one short command to its end (`versions routing` on the same store)
# Rounds alternate the jars (ROUNDS rounds of 3 runs each of A, then of B), so that a machine
# that speeds up or slows down during the run weighs on both alike. It prints each jar's median
# and the ratio B/A. Plain JVM, no class-data archive: the archive is measured by bench-http.sh.
#
# Usage: scripts/bench-start.sh JAR_A JAR_B
#   e.g. git stash; mvn -q -B package -DskipTests; cp server/target/pressmark.jar /tmp/a.jar; git stash pop;
#        mvn -q -B package -DskipTests; scripts/bench-start.sh /tmp/a.jar server/target/pressmark.jar
# Environment: ROUNDS (default 4).
set -euo pipefail
root="$(cd "$(dirname "$0")/.." && pwd)"
die() { echo "bench-start: $*" >&2; exit 1; }
[ $# -eq 2 ] || die "usage: scripts/bench-start.sh JAR_A JAR_B"
jar_a="$(realpath "$1")"
jar_b="$(realpath "$2")"
[ -f "$jar_a" ] && [ -f "$jar_b" ] || die "both jars must exist"
command -v curl >/dev/null 2>&1 || die "curl is not installed"
rounds="${ROUNDS:-4}"

work="$(mktemp -d)"
server_pid=""
cleanup() {
  if [ -n "$server_pid" ]; then kill "$server_pid" 2>/dev/null || true; wait "$server_pid" 2>/dev/null || true; fi
  rm -rf "$work"
}
trap cleanup EXIT
now_ms() { local t="$EPOCHREALTIME"; t="${t/./}"; echo $(( t / 1000 )); }

cd "$work"
echo "bench-start: a store of 20 versions in $work (built with A)" >&2
java -cp "$jar_a" dev.pressmark.demo.ListingTitles 5000 --csv > listings.csv
cp "$root/scripts/bench-train.yaml" train.yaml
java -jar "$jar_a" train --config train.yaml --out routing.pmb > train.out 2>&1 || { cat train.out >&2; die "training failed"; }
for i in $(seq 1 20); do
  activate=()
  [ "$i" = 20 ] && activate=(--activate)
  java -jar "$jar_a" publish --name routing --tag "v$i" --store sqlite:store.db "${activate[@]}" routing.pmb > /dev/null \
    || die "publishing v$i failed"
done

# One start of serve, to the first 200 from /health/ready; sets serve_ms. Called in this shell,
# not in a command substitution, so that cleanup sees server_pid if a start fails half-way.
serve_once() {
  local jar="$1" t0 port="" code
  t0="$(now_ms)"
  java -jar "$jar" serve --port 0 --store sqlite:store.db > serve.out 2> serve.log &
  server_pid=$!
  while :; do
    kill -0 "$server_pid" 2>/dev/null || { tail -5 serve.log >&2; die "serve stopped during start-up"; }
    [ $(( $(now_ms) - t0 )) -lt 60000 ] || die "serve was not ready within 60 s"
    [ -n "$port" ] || port="$(sed -n 's|^serving on http://127\.0\.0\.1:\([0-9]*\).*|\1|p' serve.out)"
    if [ -n "$port" ]; then
      code="$(curl -s -o /dev/null -w '%{http_code}' --max-time 1 "http://127.0.0.1:$port/health/ready" || true)"
      [ "$code" = 200 ] && break
    fi
    sleep 0.01
  done
  serve_ms=$(( $(now_ms) - t0 ))
  kill "$server_pid"
  wait "$server_pid" 2>/dev/null || true
  server_pid=""
}

versions_once() {
  local t0
  t0="$(now_ms)"
  java -jar "$1" versions routing --store sqlite:store.db > /dev/null || die "versions failed"
  echo $(( $(now_ms) - t0 ))
}

median() { printf '%s\n' "$@" | sort -n | awk '{ v[NR] = $1 } END { print (NR % 2) ? v[(NR + 1) / 2] : (v[NR / 2] + v[NR / 2 + 1]) / 2 }'; }

serve_a=(); serve_b=(); versions_a=(); versions_b=()
for r in $(seq 1 "$rounds"); do
  echo "bench-start: round $r of $rounds" >&2
  for i in 1 2 3; do serve_once "$jar_a"; serve_a+=("$serve_ms"); done
  for i in 1 2 3; do serve_once "$jar_b"; serve_b+=("$serve_ms"); done
  for i in 1 2 3; do versions_a+=("$(versions_once "$jar_a")"); done
  for i in 1 2 3; do versions_b+=("$(versions_once "$jar_b")"); done
done

sa="$(median "${serve_a[@]}")"; sb="$(median "${serve_b[@]}")"
va="$(median "${versions_a[@]}")"; vb="$(median "${versions_b[@]}")"
echo "| measure (median of $(( rounds * 3 )) runs) | A | B | B / A |"
echo "|---|---|---|---|"
echo "| serve to ready, 20 versions | $sa ms | $sb ms | $(awk -v a="$sa" -v b="$sb" 'BEGIN { printf "%.2f", b / a }') |"
echo "| \`versions routing\` | $va ms | $vb ms | $(awk -v a="$va" -v b="$vb" 'BEGIN { printf "%.2f", b / a }') |"
echo
echo "A: $jar_a"
echo "B: $jar_b"
echo "serve A: ${serve_a[*]}"
echo "serve B: ${serve_b[*]}"
echo "versions A: ${versions_a[*]}"
echo "versions B: ${versions_b[*]}"
