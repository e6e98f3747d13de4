#!/usr/bin/env bash
# Fuzz every cell function through the exception fence (tests/fuzz/fuzz_functions.cpp).
#   bash tools/fuzz.sh            short run (FUZZ_SECONDS, default 120 s), as in the test command
#   FUZZ_SECONDS=3600 bash tools/fuzz.sh    a long run
# Every saved input in tests/fuzz/regressions/ is replayed first. A finding is written to
# build-asan/fuzz/findings/; copy it into tests/fuzz/regressions/ once fixed.
set -euo pipefail
cd "$(dirname "$0")/.."
seconds="${FUZZ_SECONDS:-120}"
# The sanitizer build (clang, ASan + UBSan) also holds the fuzzer: tools/test-all.sh builds it once
# for both; this builds only what is missing.
build="${FUZZ_BUILD:-build-asan}"
CC=clang CXX=clang++ cmake -S . -B "$build" -DQUADRAT_SANITIZE=ON -DQUADRAT_FUZZ=ON -DQUADRAT_EXTENSION=OFF \
  -DCMAKE_BUILD_TYPE=RelWithDebInfo >/dev/null
cmake --build "$build" -j"${JOBS:-2}" --target quadrat_fuzz >/dev/null
fuzzer="$build/tests/fuzz/quadrat_fuzz"
out="$build/fuzz"
mkdir -p "$out/corpus" "$out/findings"
export ASAN_OPTIONS=detect_leaks=1 UBSAN_OPTIONS=print_stacktrace=1
regressions=(tests/fuzz/regressions/*)
if [ -e "${regressions[0]}" ]; then
  "$fuzzer" "${regressions[@]}" >"$out/regressions.log" 2>&1 || { tail -40 "$out/regressions.log"; echo "fuzz: 0 passed, 1 failed"; exit 1; }
  echo "fuzz regressions: ${#regressions[@]} inputs replayed clean"
fi
if "$fuzzer" -max_total_time="$seconds" -timeout=10 -rss_limit_mb=2048 -print_final_stats=1 \
     -artifact_prefix="$out/findings/" "$out/corpus" tests/fuzz/regressions >"$out/fuzz.log" 2>&1; then
  runs=$(grep -o 'stat::number_of_executed_units: *[0-9]*' "$out/fuzz.log" | grep -o '[0-9]*$' || echo '?')
  echo "fuzz: ${runs} inputs in ${seconds} s, no crash, hang or escaped exception"
  echo "fuzz: 1 passed, 0 failed"
else
  tail -60 "$out/fuzz.log"
  echo "fuzz: finding saved in $out/findings/"
  echo "fuzz: 0 passed, 1 failed"
  exit 1
fi
