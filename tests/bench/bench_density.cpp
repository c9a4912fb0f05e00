// The density measures at the sizes the brief asks for, through evaluateMeasure (the entry
// point of the CLI, the sweep and the GUI). Clouds: seeded Gaussian blobs N(0, I) and
// N((2, 0), I), n = m; data-dependent settings at their defaults (Scott bandwidth, auto bin).
//
//   BM_Kde/<measure>/n   KDE divergence: cut-kernel grid sums (+ uncut far-field logs for KL,
//                        + exact-in-x rows for TV), integration with the 2h check
//   BM_Hist/<measure>/n  histogram plug-in (sort-based binning of n + m points)
//   BM_Knn/k/n           kNN KL(A||B) (two k-d trees, n queries each)
// Counter nodes: grid nodes of the KDE integration grid.
//
// Run: build with -DBARROW_BUILD_BENCH=ON, then
//   tests/bench/bench_density --benchmark_repetitions=3 --benchmark_report_aggregates_only=true
#include <benchmark/benchmark.h>

#include <random>
#include <string>

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

void runDensity(benchmark::State& state, const char* id, const char* estimator, int k = 5) {
  const int n = int(state.range(0));
  const Cloud a = blob("A", n, 1, 0.0), b = blob("B", n, 2, 2.0);
  const Measure& m = *MeasureRegistry::instance().find(id);
  EvalRequest req;
  req.params.set("density.estimator", estimator);
  req.params.set("density.k", std::to_string(k));
  Result r;
  for (auto _ : state) {
    r = evaluateMeasure(m, a, b, req);
    benchmark::DoNotOptimize(r.value);
  }
  if (!r.usable()) state.SkipWithError(r.message.c_str());
  if (r.details.contains("grid_size"))
    state.counters["nodes"] = r.details["grid_size"][0].get<double>() * r.details["grid_size"][1].get<double>();
}

void BM_KdeKl(benchmark::State& s) { runDensity(s, "kl_ab", "kde"); }
void BM_KdeJs(benchmark::State& s) { runDensity(s, "js", "kde"); }
void BM_KdeTv(benchmark::State& s) { runDensity(s, "tv", "kde"); }
void BM_KdeHellinger(benchmark::State& s) { runDensity(s, "hellinger", "kde"); }
void BM_HistJs(benchmark::State& s) { runDensity(s, "js", "hist"); }
void BM_HistKl(benchmark::State& s) { runDensity(s, "kl_ab", "hist"); }
void BM_KnnK1(benchmark::State& s) { runDensity(s, "kl_ab", "knn", 1); }
void BM_KnnK5(benchmark::State& s) { runDensity(s, "kl_ab", "knn", 5); }

BENCHMARK(BM_KdeKl)->Arg(1000)->Arg(10000)->Unit(benchmark::kMillisecond);
BENCHMARK(BM_KdeJs)->Arg(1000)->Arg(10000)->Unit(benchmark::kMillisecond);
BENCHMARK(BM_KdeTv)->Arg(1000)->Arg(10000)->Unit(benchmark::kMillisecond);
BENCHMARK(BM_KdeHellinger)->Arg(1000)->Arg(10000)->Unit(benchmark::kMillisecond);
BENCHMARK(BM_HistJs)->Arg(1000)->Arg(10000)->Arg(100000)->Unit(benchmark::kMillisecond);
BENCHMARK(BM_HistKl)->Arg(1000)->Arg(10000)->Arg(100000)->Unit(benchmark::kMillisecond);
BENCHMARK(BM_KnnK1)->Arg(1000)->Arg(10000)->Arg(100000)->Unit(benchmark::kMillisecond);
BENCHMARK(BM_KnnK5)->Arg(1000)->Arg(10000)->Arg(100000)->Unit(benchmark::kMillisecond);

}  // namespace
}  // namespace barrow

BENCHMARK_MAIN();
