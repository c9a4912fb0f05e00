// The demo scenario (300 + 300 points as shipped, and the same scene with 500 + 500) swept by
// every registered measure over 201 shift values, with and without warm starts, with and
// without refinement, on 2 threads (one run on 1 thread).
// Counters: θ values evaluated (grid + refinement) and the summed evaluation time of each
// measure (seconds of one sweep, across both threads), which shows where the time goes.
#include <benchmark/benchmark.h>

#include "measures/registry.h"
#include "scenario/demo_scenario.h"
#include "sweep/sweep_engine.h"

namespace barrow {
namespace {

void BM_DemoSweep(benchmark::State& state) {
  const Session s = demoSession(int(state.range(3)));
  SweepRequest req;
  req.settings = s.sweep;
  req.settings.steps = 201;
  req.warmStart = state.range(0) != 0;
  req.refineJumps = state.range(1) != 0;
  req.threads = int(state.range(2));
  SweepResult r;
  for (auto _ : state) {
    r = runSweep(s.a, s.b, req);
    benchmark::DoNotOptimize(r.theta.data());
  }
  if (!r.message.empty()) state.SkipWithError(r.message.c_str());
  state.counters["theta"] = double(r.theta.size());
  state.counters["measures"] = double(r.series.size());
  for (const auto& ser : r.series) {
    double total = 0;
    for (double t : ser.seconds) total += t;
    state.counters["s_" + ser.id] = total;
  }
  state.SetLabel(std::to_string(state.range(3)) + "+" + std::to_string(state.range(3)) + ", " +
                 (req.warmStart ? "warm" : "cold") + (req.refineJumps ? ", refined" : ", grid only") + ", " +
                 std::to_string(req.threads) + " threads");
}

// Args: warm start, refinement, threads, points per cloud.
BENCHMARK(BM_DemoSweep)
    ->Args({1, 1, 2, 300})
    ->Args({0, 1, 2, 300})
    ->Args({1, 0, 2, 300})
    ->Args({0, 0, 2, 300})
    ->Args({1, 0, 1, 300})
    ->Args({1, 1, 2, 500})
    ->Args({1, 0, 2, 500})
    ->Args({0, 0, 2, 500})
    ->Unit(benchmark::kSecond)
    ->Iterations(1)
    ->Repetitions(2)
    ->ReportAggregatesOnly(false);

}  // namespace
}  // namespace barrow

BENCHMARK_MAIN();
