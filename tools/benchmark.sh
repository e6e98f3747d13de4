#!/usr/bin/env bash
# The benchmark command (issue #7): builds what it measures (Release, incremental), then prints
# the core against SciPy/statsmodels on the same arrays, the result cache, and recalculation in
# headless Calc against its own T.TEST, LINEST and AVERAGE (tools/benchmark.py says how).
#   bash tools/benchmark.sh                  everything (about 15 minutes on 2 cores)
#   bash tools/benchmark.sh --skip-office    without headless Calc
#   bash tools/benchmark.sh --sizes 1000,10000   smaller sizes only
# Needs: bash tools/install-deps.sh --reference. Not a test and not in CI: timings depend on the
# machine and its load (printed), so compare the figures of one run with each other.
set -euo pipefail
cd "$(dirname "$0")/.."
BUILD=${QUADRAT_BENCH_BUILD:-build-bench}
office=1
args=()
for a in "$@"; do
  if [[ "$a" == "--skip-office" ]]; then office=0; else args+=("$a"); fi
done
launcher=()
if command -v ccache >/dev/null; then launcher=(-DCMAKE_CXX_COMPILER_LAUNCHER=ccache); fi
# The extension stays as configured (ON for a new folder); --skip-office only builds less.
mkdir -p "$BUILD"
log="$BUILD/benchmark-build.log"
cmake -S . -B "$BUILD" -DCMAKE_BUILD_TYPE=Release "${launcher[@]}" >"$log"
targets=(quadrat_bench_core)
if [[ $office == 1 ]]; then targets+=(quadrat_oxt); fi
cmake --build "$BUILD" -j2 --target "${targets[@]}" >>"$log" 2>&1 || { tail -30 "$log"; exit 1; }
oxt=()
if [[ $office == 1 ]]; then oxt=(--oxt "$BUILD/quadrat.oxt"); fi
exec /usr/bin/python3 tools/benchmark.py --core "$BUILD/quadrat_bench_core" "${oxt[@]}" "${args[@]}"
