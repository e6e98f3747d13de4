#!/usr/bin/env bash
# The main job: install what is missing, build the extension, install it into a private
# LibreOffice profile, open every sample sheet headless, recompute, print each sheet's Quadrat
# results as a text table and write a PDF of each sheet to out/.
#   bash tools/main-job.sh
set -euo pipefail
cd "$(dirname "$0")/.."
JOBS="${JOBS:-2}"

bash tools/install-deps.sh
cmake -S . -B build -DCMAKE_BUILD_TYPE=Release -DQUADRAT_EXTENSION=ON
cmake --build build -j"$JOBS"
/usr/bin/python3 tools/main_job.py --oxt build/quadrat.oxt --out out --images docs/images sample_sheets/*.fods
