#!/usr/bin/env bash
# Runs one libFuzzer target for a given time, at the lowest CPU priority, on one core.
#
#   scripts/fuzz.sh TARGET [SECONDS=600] [BUILD_DIR=build-fuzz]
#   TARGET: csv | npy | session | set | measures
#
# Builds the target first when needed (clang-14 with libFuzzer, -DBARROW_FUZZ=ON, engine +
# CLI only). Seeds: tests/fuzz/corpus/TARGET, tests/fuzz/regressions/TARGET (every input
# that ever failed) and, for csv, the sample clouds. New coverage goes to
# BUILD_DIR/fuzz-corpus/TARGET (not committed); a failing input is written to
# BUILD_DIR/fuzz-artifacts/TARGET/ — copy it into tests/fuzz/regressions/TARGET/ with the
# fix. The last lines of the log are the run's stats (executions, exec/s).
set -euo pipefail
cd "$(dirname "$0")/.."
target=${1:?usage: scripts/fuzz.sh csv|npy|session|set|measures [SECONDS] [BUILD_DIR]}
seconds=${2:-600}
build=${3:-build-fuzz}
bin="$build/tests/fuzz/fuzz_$target"

if [ ! -f "$build/CMakeCache.txt" ]; then
  CC=clang-14 CXX=clang++-14 cmake -S . -B "$build" -G Ninja -DCMAKE_BUILD_TYPE=None \
    -DBARROW_FUZZ=ON -DBARROW_BUILD_UI=OFF -DBARROW_BUILD_TESTS=OFF >/dev/null
fi
# BARROW_FUZZ_NO_BUILD=1: use the binary as it is (e.g. while another build runs there).
[ "${BARROW_FUZZ_NO_BUILD:-0}" = 1 ] || cmake --build "$build" -j2 --target "fuzz_$target" >/dev/null

work="$build/fuzz-corpus/$target"
artifacts="$build/fuzz-artifacts/$target/"
mkdir -p "$work" "$artifacts"
seeds=(tests/fuzz/corpus/"$target")
# A target with no failing input yet has no regressions folder (git keeps no empty folders).
[ -d tests/fuzz/regressions/"$target" ] && seeds+=(tests/fuzz/regressions/"$target")
if [ "$target" = csv ]; then
  for d in samples/*/; do seeds+=("$d"); done
fi

# -timeout: one input taking 10 s is a hang finding. -rss_limit_mb: bounded memory is an
# invariant too. -max_len: the parsers' seeds are up to 8 KB; longer inputs add little.
exec nice -n 19 "$bin" "$work" "${seeds[@]}" \
  -max_total_time="$seconds" -timeout=10 -rss_limit_mb=2048 -max_len=16384 \
  -artifact_prefix="$artifacts" -print_final_stats=1
