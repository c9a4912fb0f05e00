#!/usr/bin/env bash
# Installs Barrow's build and test dependencies from Debian's packages (idempotent), then
# configures and builds into build/. Run as root (or with sudo available).
set -euo pipefail
cd "$(dirname "$0")/.."

PACKAGES=(cmake ninja-build ccache g++ pkg-config
          qt6-base-dev qt6-svg-dev libqcustomplot-dev libeigen3-dev nlohmann-json3-dev
          libgtest-dev libgmock-dev googletest libbenchmark-dev liblemon-dev
          python3 python3-numpy python3-scipy python3-sklearn python3-torch python3-colorspacious
          xvfb xauth fonts-dejavu-core
          clang-14 libclang-rt-14-dev  # fuzz targets (libFuzzer) and sanitizer builds
          chromium nodejs  # the report's browser tests (tests/report)
          qemu-user)  # scripts/check_portable.sh: the engine on an emulated CPU without AVX2

missing=()
for p in "${PACKAGES[@]}"; do
  dpkg-query -W -f='${Status}' "$p" 2>/dev/null | grep -q "install ok installed" || missing+=("$p")
done
# npm: Debian's package, unless the installed Node already brings its own.
command -v npm >/dev/null 2>&1 || missing+=(npm)
if [ ${#missing[@]} -gt 0 ]; then
  echo "setup: installing ${missing[*]}"
  SUDO=""
  [ "$(id -u)" -ne 0 ] && SUDO="sudo"
  $SUDO apt-get update -qq
  DEBIAN_FRONTEND=noninteractive $SUDO apt-get install -y -qq --no-install-recommends "${missing[@]}"
fi

# The report's browser tests drive the system Chromium with puppeteer-core, pinned by the
# committed lockfile (it never downloads a browser).
(cd tests/report && npm ci --no-audit --no-fund --loglevel=error)

BUILD_DIR=${BARROW_BUILD_DIR:-build}
cmake -S . -B "$BUILD_DIR" -G Ninja -DCMAKE_BUILD_TYPE=Release "$@" >/dev/null
cmake --build "$BUILD_DIR" -j "$(nproc)"
