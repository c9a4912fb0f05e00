// Resampling at the sizes the uncertainty brief asks for, through the engine the CLI and the
// window use (core/uncertainty). Clouds: seeded Gaussian blobs N(0, I), B shifted by 0.5 in x.
//
//   BM_SpreadFast/threads     200 resamples of every fast measure (all but entropic and
//                             sinkhorn) at 500 + 500 points
//   BM_SpreadOne/measure      the same loop for one measure alone (where the time goes)
//   BM_PermuteW1/threads      999 permutations of exact W1 at 300 + 300 points
// Counters: cpu_all_threads_s (process CPU seconds per run, from std::clock: the figure that
// does not depend on how loaded the shared machine is).
//
// Run: build with -DBARROW_BUILD_BENCH=ON, then
//   tests/bench/bench_uncertainty --benchmark_repetitions=3 --benchmark_report_aggregates_only=true
#include <benchmark/benchmark.h>

#include <cmath>
#include <ctime>
#include <random>

#include "measures/registry.h"
#include "uncertainty/permutation_test.h"
#include "uncertainty/spread.h"

namespace barrow {
namespace {

Cloud blob(const char* name, int n, unsigned seed, double shift) {
  std::mt19937_64 rng(seed);
  std::normal_distribution<double> g(0.0, 1.0);
  Eigen::MatrixX2d p(n, 2);
  for (int i = 0; i < n; ++i) p.row(i) << shift + g(rng), g(rng);
  return Cloud(name, p);
}

std::vector<const Measure*> fastMeasures() {
  std::vector<const Measure*> out;
  for (const Measure* m : MeasureRegistry::instance().all())
    if (m->id() != "entropic" && m->id() != "sinkhorn") out.push_back(m);
  return out;
}

void spread(benchmark::State& state, std::vector<const Measure*> measures, int threads) {
  const Cloud a = blob("A", 500, 1, 0.0), b = blob("B", 500, 2, 0.5);
  SpreadRequest req;
  req.measures = std::move(measures);
  req.resamples = 200;
  req.threads = threads;
  SpreadResult r;
  const std::clock_t cpu0 = std::clock();
  for (auto _ : state) {
    r = runSpread(a, b, req);
    benchmark::DoNotOptimize(r);
  }
  for (const auto& row : r.rows)
    // kl_ab / kl_ba are +inf on these clouds (disjoint histogram cells): a legitimate value.
    if (row.failed > 0 || !(row.status == Status::Ok || row.status == Status::Infinite))
      state.SkipWithError((row.id + ": " + row.message).c_str());
  state.counters["cpu_all_threads_s"] = double(std::clock() - cpu0) / CLOCKS_PER_SEC / double(state.iterations());
  state.counters["measures"] = double(req.measures.size());
}

void BM_SpreadFast(benchmark::State& state) { spread(state, fastMeasures(), int(state.range(0))); }
BENCHMARK(BM_SpreadFast)->Arg(1)->Arg(2)->Unit(benchmark::kMillisecond)->UseRealTime()->Iterations(1);

void BM_SpreadOne(benchmark::State& state) {
  const auto all = fastMeasures();
  const Measure* m = all[std::size_t(state.range(0))];
  state.SetLabel(m->id());
  spread(state, {m}, 2);
}
BENCHMARK(BM_SpreadOne)->DenseRange(0, 12)->Unit(benchmark::kMillisecond)->UseRealTime()->Iterations(1);

void BM_PermuteW1(benchmark::State& state) {
  const Cloud a = blob("A", 300, 3, 0.0), b = blob("B", 300, 4, 0.5);
  PermuteRequest req;
  req.measures = {MeasureRegistry::instance().find("w1")};
  req.permutations = 999;
  req.threads = int(state.range(0));
  PermuteResult r;
  const std::clock_t cpu0 = std::clock();
  for (auto _ : state) {
    r = runPermutationTest(a, b, req);
    benchmark::DoNotOptimize(r);
  }
  if (r.rows[0].failed > 0) state.SkipWithError(r.rows[0].message.c_str());
  state.counters["cpu_all_threads_s"] = double(std::clock() - cpu0) / CLOCKS_PER_SEC / double(state.iterations());
  state.counters["p_value"] = r.rows[0].pValue;
}
BENCHMARK(BM_PermuteW1)->Arg(1)->Arg(2)->Unit(benchmark::kMillisecond)->UseRealTime()->Iterations(1);

}  // namespace
}  // namespace barrow

BENCHMARK_MAIN();
