#!/usr/bin/env bash
# Installs what building, testing and running Quadrat needs on Debian 12 (bookworm).
# Idempotent and non-interactive: asks apt only when a package is missing.
#   bash tools/install-deps.sh              build, core tests, extension, office tests, main job
#   bash tools/install-deps.sh --reference  also what the reference generators need
#                                           (tests/reference/generate_*.py: SciPy, statsmodels, mpmath)
set -euo pipefail

# The one list. --no-install-recommends keeps LibreOffice to about 60 packages.
PACKAGES=(
  # build and core tests; clang and its runtime for the sanitizer and fuzzing build
  build-essential cmake make zip clang libclang-rt-14-dev
  libboost-dev libboost-math-dev libeigen3-dev libgtest-dev nlohmann-json3-dev
  # the extension: SDK tools and headers, a headless Calc to run it, Python UNO bridge for the harness
  libreoffice-dev libreoffice-calc-nogui python3-uno
  # fonts for the PDFs of the main job, and pdftoppm for its PNG pictures (docs/images)
  fonts-dejavu-core poppler-utils
)
REFERENCE_PACKAGES=(python3-scipy python3-statsmodels python3-mpmath)

if [[ "${1:-}" == "--reference" ]]; then
  PACKAGES+=("${REFERENCE_PACKAGES[@]}")
fi

missing=()
for p in "${PACKAGES[@]}"; do
  if ! dpkg-query -W -f='${Status}' "$p" 2>/dev/null | grep -q 'install ok installed'; then
    missing+=("$p")
  fi
done

if [[ ${#missing[@]} -eq 0 ]]; then
  echo "install-deps: all ${#PACKAGES[@]} packages present"
  exit 0
fi

echo "install-deps: installing ${missing[*]}"
SUDO=()
if [[ $(id -u) -ne 0 ]]; then
  if command -v sudo >/dev/null; then
    SUDO=(sudo)
  else
    echo "install-deps: not root and no sudo; install these first: ${missing[*]}" >&2
    exit 1
  fi
fi
export DEBIAN_FRONTEND=noninteractive
"${SUDO[@]}" apt-get update -q
"${SUDO[@]}" apt-get install -y -q --no-install-recommends "${missing[@]}"
