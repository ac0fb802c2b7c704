#!/usr/bin/env bash
# Runs every fuzz test in fuzzing mode for SECONDS each (default 20), JOBS at a time (env
# FUZZ_JOBS, default 2), and fails if any of them finds a crashing input.
#
#   scripts/fuzz.sh [SECONDS]
#
# `mvn -B verify` runs the same tests in regression mode: each seed and each saved finding under
# src/test/resources/<package>/<Class>Inputs/<method>/ as an ordinary test. Here the fuzzer mutates
# those inputs instead. One Maven call compiles the tests and writes their class path; then each
# target runs in its own JVM through Jazzer's command line, so no target pays for a Maven start and
# two can run side by side. A finding is written next to the seeds (crash-<sha1>), where the
# regression run picks it up: fix the bug, keep the file, commit both.
#
# For a single target through Maven instead (one fuzz test per run):
#   JAZZER_FUZZ=1 mvn -B -pl model-core -am test -Dtest='TokenizerFuzzTest#every_text_encodes_to_vocabulary_pieces_that_spell_its_words' \
#       -Dsurefire.failIfNoSpecifiedTests=false -Djazzer.max_duration=2m
set -euo pipefail
cd "$(dirname "$0")/.."

seconds="${1:-20}"
jobs="${FUZZ_JOBS:-2}"
case "$seconds" in ''|*[!0-9]*) echo "usage: scripts/fuzz.sh [SECONDS]" >&2; exit 2 ;; esac
case "$jobs" in ''|*[!0-9]*|0) echo "fuzz: FUZZ_JOBS must be a positive whole number, was $jobs" >&2; exit 2 ;; esac

# module, class, method
targets=(
  "model-core dev.pressmark.core.fuzz.BundleReaderFuzzTest any_bytes_load_as_a_bundle_or_fail_with_a_bundle_exception"
  "model-core dev.pressmark.core.fuzz.BundleReaderFuzzTest entries_under_matching_checksums_load_or_fail_with_a_pressmark_exception"
  "model-core dev.pressmark.core.fuzz.TokenizerFuzzTest every_text_encodes_to_vocabulary_pieces_that_spell_its_words"
  "model-core dev.pressmark.core.fuzz.TrainConfigFuzzTest any_text_parses_to_a_valid_config_or_fails_with_a_message_naming_the_file"
  "server dev.pressmark.server.PredictRequestFuzzTest any_body_gives_a_response_or_a_client_error"
)

# -am so that server runs against this tree's model-core, not whatever ~/.m2 holds.
mvn -B -q -pl model-core,server -am test-compile dependency:build-classpath \
  -Dmdep.includeScope=test -Dmdep.outputFile=target/fuzz.classpath

out=target/fuzz
rm -rf "$out"
mkdir -p "$out"

run_target() {
  local module="$1" class="$2" method="$3"
  local name="${class##*.}#$method"
  local log="$PWD/$out/${class##*.}.$method.log"
  local inputs="src/test/resources/${class//.//}Inputs/$method"
  mkdir -p "$module/$inputs"
  local status=0
  # -Xmx1g: an allocation sized from the input becomes an OutOfMemoryError, which Jazzer reports.
  # -timeout: an input that runs 10 s is reported as a hang. The reproducer .java files go to target/.
  (cd "$module" && java -Xmx1g -XX:-OmitStackTraceInFastThrow \
      -cp "target/test-classes:target/classes:$(cat target/fuzz.classpath)" \
      com.code_intelligence.jazzer.Jazzer \
      --target_class="$class" --target_method="$method" \
      --reproducer_path="target" \
      -max_total_time="$seconds" -timeout=10 -rss_limit_mb=4096 \
      -artifact_prefix="$inputs/") > "$log" 2>&1 || status=$?
  local done_line
  done_line=$(grep -E '^Done [0-9]+ runs in [0-9]+ second' "$log" | tail -1 || true)
  if [ "$status" -eq 0 ]; then
    echo "fuzz: ok    $name: ${done_line:-finished}"
  else
    echo "fuzz: FOUND $name (exit $status): ${done_line:-no summary}; log $log"
    grep -E 'Test unit written to|^(==|java\.|com\.code_intelligence).*(Exception|Error|Finding)' "$log" | head -5 | sed 's/^/fuzz:       /'
  fi
  return "$status"
}

pids=()
failed=0
for target in "${targets[@]}"; do
  # shellcheck disable=SC2086 # the three words are the three arguments
  run_target $target &
  pids+=("$!")
  if [ "${#pids[@]}" -ge "$jobs" ]; then
    wait "${pids[0]}" || failed=$((failed + 1))
    pids=("${pids[@]:1}")
  fi
done
for pid in "${pids[@]}"; do
  wait "$pid" || failed=$((failed + 1))
done

if [ "$failed" -gt 0 ]; then
  echo "fuzz: $failed of ${#targets[@]} targets found a crashing input (see above); it is saved beside the seeds" >&2
  exit 1
fi
echo "fuzz: ${#targets[@]} targets, ${seconds} s each, no findings"
