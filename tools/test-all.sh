#!/usr/bin/env bash
# Every test, as CI runs it (.ci/run): install what is missing → Release build with the
# extension → core tests → clang AddressSanitizer/UBSan build of the core and its tests → a short
# fuzz run over every function → office tests in a headless Calc → the live-edit matrix there.
# Runs every stage it can, exits non-zero on any failure, and ends with the runners' summary lines.
#   bash tools/test-all.sh
set -uo pipefail
cd "$(dirname "$0")/.."
JOBS="${JOBS:-2}"
status=0
summary=()
log_dir="$(mktemp -d -t quadrat-tests-XXXXXX)"
trap 'rm -rf "$log_dir"' EXIT

stage() { echo; echo "=== $* ==="; }

# ctest with its output shown, its summary line kept for the end.
run_ctest() {
  local label="$1" dir="$2" log="$log_dir/ctest-$1.log"
  ctest --test-dir "$dir" -j"$JOBS" --output-on-failure 2>&1 | tee "$log"
  local rc=${PIPESTATUS[0]}
  local line
  line="$(grep -E 'tests passed|No tests were found' "$log" | tail -1)"
  summary+=("$label: ${line:-ctest gave no summary (exit $rc)}")
  [[ $rc -eq 0 ]] || status=1
}

stage "dependencies"
bash tools/install-deps.sh || exit 1

stage "Release build with the extension"
if cmake -S . -B build -DCMAKE_BUILD_TYPE=Release -DQUADRAT_EXTENSION=ON -DQUADRAT_SANITIZE=OFF &&
   cmake --build build -j"$JOBS"; then
  stage "core tests (Release)"
  run_ctest "core tests (Release)" build
  built_extension=1
else
  summary+=("Release build: FAILED")
  status=1
  built_extension=0
fi

stage "sanitizer build (clang: AddressSanitizer, UBSan, libFuzzer), core only"
if CC=clang CXX=clang++ cmake -S . -B build-asan -DQUADRAT_SANITIZE=ON -DQUADRAT_FUZZ=ON -DQUADRAT_EXTENSION=OFF \
     -DCMAKE_BUILD_TYPE=RelWithDebInfo &&
   cmake --build build-asan -j"$JOBS"; then
  stage "core tests (sanitizers)"
  ASAN_OPTIONS="${ASAN_OPTIONS:-detect_leaks=1}" run_ctest "core tests (sanitizers)" build-asan
  stage "fuzzing every function through the fence (${FUZZ_SECONDS:-120} s)"
  fuzz_log="$log_dir/fuzz.log"
  FUZZ_BUILD=build-asan bash tools/fuzz.sh 2>&1 | tee "$fuzz_log"
  rc=${PIPESTATUS[0]}
  line="$(grep -E '^fuzz: [0-9]+ passed, [0-9]+ failed$' "$fuzz_log" | tail -1)"
  summary+=("${line:-fuzz: no summary (exit $rc)}")
  [[ $rc -eq 0 ]] || status=1
else
  summary+=("sanitizer build: FAILED")
  status=1
fi

# A runner in a headless Calc with the built extension, its `N passed, N failed` line kept.
run_office() {
  local label="$1" script="$2" log="$log_dir/$(basename "$2").log"
  if [[ $built_extension -ne 1 ]]; then
    summary+=("$label: not run (no extension built)")
    return
  fi
  /usr/bin/python3 "$script" --oxt build/quadrat.oxt </dev/null 2>&1 | tee "$log"
  local rc=${PIPESTATUS[0]}
  local line
  line="$(grep -E '^[0-9]+ passed, [0-9]+ failed$' "$log" | tail -1)"
  summary+=("$label: ${line:-no summary (exit $rc)}")
  [[ $rc -eq 0 ]] || status=1
}

stage "office tests (headless Calc)"
run_office "office tests" tests/office/run_office_tests.py

stage "live edits (headless Calc: no stale value after any edit)"
run_office "live edits" tests/office/run_live_edits.py

echo
echo "=== summary ==="
printf '%s\n' "${summary[@]}"
if [[ $status -eq 0 ]]; then echo "all stages passed"; else echo "FAILED"; fi
exit $status
