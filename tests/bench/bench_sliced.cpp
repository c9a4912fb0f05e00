// Sliced Wasserstein: one evaluation (K directions, each an exact weighted 1-D problem solved
// by two sorts and a merge, O(K (n + m) log(n + m))) and its gradient, on both cores.
// Clouds: n = m points from two different Gaussians (seeded), random weights.
//
//   BM_SlicedValue/n/K      evaluate(), p = 2 (100000/200: CPU of all threads)
//   BM_SlicedGradient/n/K   gradientA() (couplings kept and scattered back to the points)
//   BM_Ot1d/n               one weighted 1-D problem (the unit of work per direction)
#include <benchmark/benchmark.h>

#include <random>

#include "measures/sliced_measure.h"
#include "transport/ot_1d.h"

namespace barrow {
namespace {

Cloud gaussianCloud(int n, unsigned seed, double shift) {
  std::mt19937_64 rng(seed);
  std::normal_distribution<double> g(0.0, 1.0);
  std::uniform_real_distribution<double> w(0.5, 1.0);
  Eigen::MatrixX2d p(n, 2);
  Eigen::VectorXd wt(n);
  for (int i = 0; i < n; ++i) {
    p.row(i) << shift + g(rng), 0.5 * g(rng);
    wt(i) = w(rng);
  }
  return Cloud("c", p, wt);
}

EvalContext contextFor(int directions) {
  EvalContext ctx;
  ctx.params.set("sliced.directions", std::to_string(directions));
  ctx.params.set("sliced.p", "2");
  return ctx;
}

void BM_SlicedValue(benchmark::State& state) {
  const int n = int(state.range(0));
  const Cloud a = gaussianCloud(n, 1, 0.0), b = gaussianCloud(n, 2, 1.0);
  const EvalContext ctx = contextFor(int(state.range(1)));
  const SlicedMeasure m;
  for (auto _ : state) benchmark::DoNotOptimize(m.evaluate(a, b, ctx).value);
}

void BM_SlicedGradient(benchmark::State& state) {
  const int n = int(state.range(0));
  const Cloud a = gaussianCloud(n, 1, 0.0), b = gaussianCloud(n, 2, 1.0);
  const EvalContext ctx = contextFor(int(state.range(1)));
  const SlicedMeasure m;
  const Result r = m.evaluate(a, b, ctx);
  for (auto _ : state) benchmark::DoNotOptimize(m.gradientA(a, b, ctx, r));
}

void BM_Ot1d(benchmark::State& state) {
  const int n = int(state.range(0));
  const Cloud a = gaussianCloud(n, 1, 0.0), b = gaussianCloud(n, 2, 1.0);
  const Eigen::VectorXd x = a.points.col(0), y = b.points.col(0);
  Ot1dSolver solver;
  for (auto _ : state)
    benchmark::DoNotOptimize(solver.solve(x.data(), a.weights.data(), n, y.data(), b.weights.data(), n, 2.0));
}

BENCHMARK(BM_SlicedValue)
    ->Args({1000, 64})->Args({10000, 64})->Args({100000, 64})->Args({10000, 512})
    ->Unit(benchmark::kMillisecond)->UseRealTime();
// The size users bring (issue 13): 10^5 + 10^5 points, 200 directions. CPU here is the whole
// process's (both threads), which does not depend on how loaded the shared machine is.
BENCHMARK(BM_SlicedValue)->Args({100000, 200})->Unit(benchmark::kMillisecond)->MeasureProcessCPUTime()->UseRealTime();
BENCHMARK(BM_SlicedGradient)->Args({1000, 64})->Args({10000, 64})->Args({100000, 64})
    ->Unit(benchmark::kMillisecond)->UseRealTime();
BENCHMARK(BM_Ot1d)->Arg(1000)->Arg(10000)->Arg(100000)->Unit(benchmark::kMicrosecond);

}  // namespace
}  // namespace barrow

BENCHMARK_MAIN();
