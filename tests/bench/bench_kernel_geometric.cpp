// Kernel and geometric measures at the sizes the brief asks for, through the same entry point
// the CLI and the sweep use (evaluateMeasure). Clouds: seeded Gaussian blobs, B shifted.
//
//   BM_Mmd/n            n = m, sigma given (no median); pairs: 2 half self sums + cross
//   BM_MmdMedian/n      the same with sigma = median (adds the exact median over the pool)
//   BM_MmdGradient/n    gradientA of the MMD (row sums with gradients, n x (n + m) pairs)
//   BM_Energy/n         energy distance
//   BM_MedianDistance/N exact median pairwise distance of N pooled points alone
//   BM_Chamfer/n        Chamfer (two k-d trees + n + m threaded queries)
//   BM_Hausdorff/n      Hausdorff
//   BM_Frechet/n        Fréchet distance of the fitted Gaussians (weighted moments, 2×2 roots)
//   BM_ChamferRepeated/n  Chamfer where A's n points sit on only 100 grid locations (repeated
//                         points: each location is queried and indexed once)
// Counter pairs_per_s: pair evaluations per second of wall time.
//
// Run: build with -DBARROW_BUILD_BENCH=ON, then
//   tests/bench/bench_kernel_geometric --benchmark_repetitions=3
//     --benchmark_report_aggregates_only=true   (one command line)
#include <benchmark/benchmark.h>

#include <cstdio>
#include <ctime>
#include <random>

#include "kernel/median_distance.h"
#include "measures/evaluate.h"
#include "measures/registry.h"

namespace barrow {
namespace {

Cloud blob(const char* name, int n, unsigned seed, double shift) {
  std::mt19937_64 rng(seed);
  std::normal_distribution<double> g(0.0, 1.0);
  Eigen::MatrixX2d p(n, 2);
  for (int i = 0; i < n; ++i) p.row(i) << shift + g(rng), g(rng);
  return Cloud(name, p);
}

void runMeasure(benchmark::State& state, const char* id, std::vector<std::pair<std::string, std::string>> settings,
                double pairsPerEval) {
  const int n = int(state.range(0));
  const Cloud a = blob("A", n, 1, 0.0), b = blob("B", n, 2, 0.5);
  const Measure& m = *MeasureRegistry::instance().find(id);
  EvalRequest req;
  for (const auto& [k, v] : settings) req.params.set(k, v);
  Result r;
  const std::clock_t cpu0 = std::clock();
  for (auto _ : state) {
    r = evaluateMeasure(m, a, b, req);
    // Not DoNotOptimize(r.value): this libbenchmark's "+r" asm constraint garbles a lone double.
    benchmark::DoNotOptimize(r);
  }
  if (r.status != Status::Ok) state.SkipWithError(r.message.c_str());
  // CPU seconds of all threads per evaluation: a load-independent view on a shared machine.
  state.counters["cpu_all_threads_s"] =
      double(std::clock() - cpu0) / CLOCKS_PER_SEC / double(state.iterations());
  char label[64];
  std::snprintf(label, sizeof label, "value %.10g", r.value);
  state.SetLabel(label);
  if (pairsPerEval > 0)
    state.counters["pairs_per_s"] = benchmark::Counter(pairsPerEval, benchmark::Counter::kIsIterationInvariantRate);
}

double kernelPairs(double n) { return 0.5 * n * n * 2 + n * n; }  // two half self sums + the cross sum

void BM_Mmd(benchmark::State& s) { runMeasure(s, "mmd", {{"mmd.sigma", "1"}}, kernelPairs(double(s.range(0)))); }
void BM_MmdMedian(benchmark::State& s) { runMeasure(s, "mmd", {}, 0); }
void BM_Energy(benchmark::State& s) { runMeasure(s, "energy", {}, kernelPairs(double(s.range(0)))); }
void BM_Chamfer(benchmark::State& s) { runMeasure(s, "chamfer", {}, 0); }
void BM_Hausdorff(benchmark::State& s) { runMeasure(s, "hausdorff", {}, 0); }
void BM_Frechet(benchmark::State& s) { runMeasure(s, "frechet", {}, 0); }

void BM_ChamferRepeated(benchmark::State& state) {
  const int n = int(state.range(0));
  Eigen::MatrixX2d p(n, 2);
  for (int i = 0; i < n; ++i) p.row(i) << (i % 10) * 0.1, ((i / 10) % 10) * 0.1;
  const Cloud a("A", p), b = blob("B", n, 2, 0.5);
  const Measure& m = *MeasureRegistry::instance().find("chamfer");
  Result r;
  for (auto _ : state) {
    r = evaluateMeasure(m, a, b, EvalRequest{});
    benchmark::DoNotOptimize(r);
  }
}

void BM_MmdGradient(benchmark::State& state) {
  const int n = int(state.range(0));
  const Cloud a = blob("A", n, 1, 0.0), b = blob("B", n, 2, 0.5);
  const Measure& m = *MeasureRegistry::instance().find("mmd");
  EvalRequest req;
  req.params.set("mmd.sigma", "1");
  const Result r = evaluateMeasure(m, a, b, req);
  EvalContext ctx;
  std::string error;
  ctx.params = resolveParams(m, req.params, &error);
  for (auto _ : state) {
    auto g = m.gradientA(a, b, ctx, r);
    benchmark::DoNotOptimize(g);
  }
  state.counters["pairs_per_s"] = benchmark::Counter(2.0 * n * n, benchmark::Counter::kIsIterationInvariantRate);
}

void BM_MedianDistance(benchmark::State& state) {
  const int n = int(state.range(0));
  const Eigen::MatrixX2d p = blob("P", n, 3, 0.0).points;
  MedianDistance med;
  for (auto _ : state) {
    med = medianPairwiseDistance(p, {});
    benchmark::DoNotOptimize(med);
  }
  state.counters["passes"] = med.passes;
  state.SetLabel(med.method);
}

BENCHMARK(BM_Mmd)->Arg(2000)->Arg(5000)->Arg(20000)->Unit(benchmark::kMillisecond)->UseRealTime();
BENCHMARK(BM_MmdMedian)->Arg(20000)->Unit(benchmark::kMillisecond)->UseRealTime()->Iterations(2);
BENCHMARK(BM_MmdGradient)->Arg(20000)->Unit(benchmark::kMillisecond)->UseRealTime()->Iterations(2);
BENCHMARK(BM_Energy)->Arg(2000)->Arg(5000)->Arg(20000)->Unit(benchmark::kMillisecond)->UseRealTime();
BENCHMARK(BM_MedianDistance)->Arg(2000)->Arg(40000)->Unit(benchmark::kMillisecond)->UseRealTime();
BENCHMARK(BM_Chamfer)->Arg(10000)->Arg(100000)->Unit(benchmark::kMillisecond)->UseRealTime();
BENCHMARK(BM_Hausdorff)->Arg(10000)->Arg(100000)->Unit(benchmark::kMillisecond)->UseRealTime();
BENCHMARK(BM_Frechet)->Arg(100000)->Arg(1000000)->Unit(benchmark::kMillisecond)->UseRealTime();
BENCHMARK(BM_ChamferRepeated)->Arg(100000)->Unit(benchmark::kMillisecond)->UseRealTime();

}  // namespace
}  // namespace barrow

BENCHMARK_MAIN();
