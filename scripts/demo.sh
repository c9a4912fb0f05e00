#!/usr/bin/env bash
# Sets up, builds and starts Barrow on the built-in demo scenario. With no display it runs
# offscreen instead and writes a screenshot of the window to build/barrow-demo.png.
set -euo pipefail
cd "$(dirname "$0")/.."
bash scripts/setup.sh
if [ -n "${DISPLAY:-}" ] || [ -n "${WAYLAND_DISPLAY:-}" ]; then
  exec ./build/app/barrow "$@"
fi
echo "demo: no display found; rendering offscreen"
QT_QPA_PLATFORM=offscreen ./build/app/barrow --screenshot build/barrow-demo.png --size 1400x900 "$@"
./build/app/barrow-cli demo || true
