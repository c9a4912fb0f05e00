#!/usr/bin/env bash
# Sets up, builds and runs every test suite (engine, command line, GUI offscreen).
set -euo pipefail
cd "$(dirname "$0")/.."
bash scripts/setup.sh
ctest --test-dir build --output-on-failure -j "$(nproc)"
