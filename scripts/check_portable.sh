#!/bin/sh
# The default build runs on a CPU without AVX2: run the engine tests (or the filter given as
# $1) under QEMU's user-mode emulation of a Nehalem CPU (SSE4.2, no AVX). The vector kernels
# must take their generic form there; an AVX instruction would stop the run with SIGILL.
# Needs: qemu-user (Debian package), a default build in build/ (no -DBARROW_NATIVE=ON).
set -eu
# The default set is the code with two forms (the dispatch, the exp, the kernel passes, the pair
# sums): about 3.5 minutes under emulation on this 2-core machine. Pass '*' for every engine
# test (hours under emulation).
filter="${1:-CpuFeaturesTest.*:KernelExpTest.*:KernelPassTest.*:PairSumTest.*}"
bin="${BUILD_DIR:-build}/tests/barrow_core_tests"
[ -x "$bin" ] || { echo "check_portable: $bin not built" >&2; exit 2; }
exec qemu-x86_64 -cpu Nehalem "$bin" --gtest_filter="$filter" --gtest_brief=1
