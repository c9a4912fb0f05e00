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
//   BM_MedianGrid/N, BM_MedianStreamed/N   the median by the cell-grid rank search (default
//                       above 2048 points) and by the streamed selection over all pairs (before)
//   BM_KernelSums/n/kind/binned   the three pair sums behind mmd (kind 0, sigma = median of
//                       the uniform pool) and energy (kind 1), direct (binned = 0) or binned
//   BM_MmdUniform/n, BM_EnergyUniform/n   the measures end to end (defaults: sigma = median,
//                       direct or binned by size) on uniform unit squares, B shifted (0.5, 0.2)
// Counter pairs_per_s: pair evaluations per second of wall time.
//
// Run: build with -DBARROW_BUILD_BENCH=ON, then
//   tests/bench/bench_kernel_geometric --benchmark_repetitions=3
//     --benchmark_report_aggregates_only=true   (one command line)
#include <benchmark/benchmark.h>

#include <cstdio>
#include <ctime>
#include <random>

#include "kernel/discrepancy.h"
#include "kernel/median_distance.h"
#include "kernel/median_grid.h"
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

Cloud square(const char* name, int n, unsigned seed, double sx, double sy) {
  std::mt19937_64 rng(seed);
  std::uniform_real_distribution<double> u(0.0, 1.0);
  Eigen::MatrixX2d p(n, 2);
  for (int i = 0; i < n; ++i) p.row(i) << sx + u(rng), sy + u(rng);
  return Cloud(name, p);
}

void runUniform(benchmark::State& state, const char* id) {
  const int n = int(state.range(0));
  const Cloud a = square("A", n, 1, 0.0, 0.0), b = square("B", n, 2, 0.5, 0.2);
  const Measure& m = *MeasureRegistry::instance().find(id);
  Result r;
  for (auto _ : state) {
    r = evaluateMeasure(m, a, b, EvalRequest{});
    benchmark::DoNotOptimize(r);
  }
  if (r.status != Status::Ok) state.SkipWithError(r.message.c_str());
  char label[96];
  std::snprintf(label, sizeof label, "value %.10g accuracy %.3g", r.value,
                r.details.contains("value_accuracy") ? r.details["value_accuracy"].get<double>() : 0.0);
  state.SetLabel(label);
}
void BM_MmdUniform(benchmark::State& s) { runUniform(s, "mmd"); }
void BM_EnergyUniform(benchmark::State& s) { runUniform(s, "energy"); }

void runMedian(benchmark::State& state, bool grid) {
  const int n = int(state.range(0));
  const Eigen::MatrixX2d p = square("P", n, 3, 0.0, 0.0).points;
  MedianDistanceOptions o;
  o.cellGrid = grid;
  MedianDistance med;
  for (auto _ : state) {
    med = medianPairwiseDistance(p, {}, o);
    benchmark::DoNotOptimize(med);
  }
  state.counters["passes"] = med.passes;
  state.SetLabel(med.method.substr(0, 40));
}
void BM_MedianGrid(benchmark::State& s) { runMedian(s, true); }
void BM_MedianStreamed(benchmark::State& s) { runMedian(s, false); }

void BM_KernelSums(benchmark::State& state) {
  const int n = int(state.range(0));
  const bool gaussian = state.range(1) == 0, binned = state.range(2) == 1;
  const SupportPoints a = supportOf(square("A", n, 1, 0.0, 0.0)), b = supportOf(square("B", n, 2, 0.5, 0.2));
  const double sigma = 0.593;  // about the median distance of this pool
  const PairKernelSpec k{gaussian ? PairKernel::Gaussian : PairKernel::Distance, 1.0 / (2 * sigma * sigma)};
  DiscrepancyOptions o;
  o.method = binned ? DiscrepancyOptions::Method::Binned : DiscrepancyOptions::Method::Direct;
  DiscrepancySums s;
  for (auto _ : state) {
    s = discrepancySums(a, b, k, {}, o);
    benchmark::DoNotOptimize(s);
  }
  state.counters["bound"] = s.boundAA + s.boundBB + 2 * s.boundAB;
  char label[96];
  std::snprintf(label, sizeof label, "aa %.12g bb %.12g ab %.12g", s.aaDiagonal + s.aaOffDiagonal,
                s.bbDiagonal + s.bbOffDiagonal, s.ab);
  state.SetLabel(label);
}

BENCHMARK(BM_MmdUniform)->Arg(10000)->Arg(100000)->Unit(benchmark::kMillisecond)->UseRealTime()->Iterations(2);
BENCHMARK(BM_EnergyUniform)->Arg(10000)->Arg(100000)->Unit(benchmark::kMillisecond)->UseRealTime()->Iterations(2);
BENCHMARK(BM_MedianGrid)->Arg(20000)->Arg(200000)->Unit(benchmark::kMillisecond)->UseRealTime()->Iterations(2);
BENCHMARK(BM_MedianStreamed)->Arg(20000)->Arg(200000)->Unit(benchmark::kMillisecond)->UseRealTime()->Iterations(1);
BENCHMARK(BM_KernelSums)
    ->ArgsProduct({{10000, 100000}, {0, 1}, {0, 1}})
    ->Unit(benchmark::kMillisecond)
    ->UseRealTime()
    ->Iterations(1);
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
