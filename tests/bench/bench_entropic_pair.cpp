// `entropic` + `sinkhorn` on the same two clouds, as `barrow-cli measure` runs them with the
// default settings (ε = auto = (D/20)², p = 2, tolerance 1e-6), before and after the shared
// A–B solve (transport/sinkhorn_cache.h) and the coarse-to-fine start
// (transport/sinkhorn_coarse.h).
//
//   BM_PairBefore/n   the solves the two measures made before: OT_ε(A, B) for `entropic`, then
//                     OT_ε(A, B) again, OT_ε(A, A) and OT_ε(B, B) for `sinkhorn`, each cold
//                     with annealing on the full clouds (coarseGrid = 0), no shared store
//   BM_PairAfter/n    evaluateMeasure(entropic) then evaluateMeasure(sinkhorn) as they are
//                     now, the store emptied first (so `entropic` solves and `sinkhorn` reuses)
//
// Clouds: A uniform on [0,1]², B uniform on [0.5,1.5]×[0.2,1.2] (the example, seeded
// here with std::mt19937_64), uniform weights. Counters: seconds of each measure (wall), the
// process CPU seconds (both cores), full-cloud iterations of each solve, and both values.
//   BM_Bracket/n/k    both measures above their exact limit: certified brackets (entropic_bracket.h)
// Run: build with -DBARROW_BUILD_BENCH=ON, then
//   tests/bench/bench_entropic_pair --benchmark_filter=BM_Pair
#include <benchmark/benchmark.h>

#include <chrono>
#include <cmath>
#include <cstdio>
#include <ctime>
#include <random>

#include "measures/entropic_measure.h"
#include "measures/evaluate.h"
#include "measures/sinkhorn_measure.h"
#include "transport/sinkhorn_cache.h"
#include "transport/sinkhorn_solver.h"

namespace barrow {
namespace {

Cloud uniformCloud(int n, unsigned seed, double dx, double dy) {
  std::mt19937_64 rng(seed);
  std::uniform_real_distribution<double> u(0.0, 1.0);
  Eigen::MatrixX2d p(n, 2);
  for (int i = 0; i < n; ++i) p.row(i) << dx + u(rng), dy + u(rng);
  return Cloud("c", p, Eigen::VectorXd::Ones(n));
}

double seconds(std::chrono::steady_clock::time_point t0) {
  return std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count();
}

double cpuSeconds() { return double(std::clock()) / CLOCKS_PER_SEC; }

void BM_PairBefore(benchmark::State& state) {
  const int n = int(state.range(0));
  const Cloud a = uniformCloud(n, 1, 0.0, 0.0), b = uniformCloud(n, 2, 0.5, 0.2);
  SinkhornOptions o = readEntropicSettings("entropic", ParamSet{}, a, b).options;
  o.coarseGrid = 0;  // annealing on the full clouds, as before
  const Eigen::VectorXd wa = a.normalizedWeights(), wb = b.normalizedWeights();
  for (auto _ : state) {
    const double cpu0 = cpuSeconds();
    auto t0 = std::chrono::steady_clock::now();
    const SinkhornResult ent = solveSinkhorn(a.points, wa, b.points, wb, o);
    const double entSeconds = seconds(t0);
    t0 = std::chrono::steady_clock::now();
    const SinkhornResult ab = solveSinkhorn(a.points, wa, b.points, wb, o);
    const SinkhornResult aa = solveSinkhornSymmetric(a.points, wa, o);
    const SinkhornResult bb = solveSinkhornSymmetric(b.points, wb, o);
    const double sinkSeconds = seconds(t0);
    const double div = ab.value - 0.5 * aa.value - 0.5 * bb.value;
    state.counters["entropic_s"] = entSeconds;
    state.counters["sinkhorn_s"] = sinkSeconds;
    state.counters["cpu_s"] = cpuSeconds() - cpu0;
    state.counters["ab_it"] = ent.iterations;
    state.counters["aa_it"] = aa.iterations;
    state.counters["bb_it"] = bb.iterations;
    std::fprintf(stderr, "before n=%d entropic %.17g (%d it, err %.3g) sinkhorn %.17g (ab %d, aa %d, bb %d it)\n", n,
                 ent.value, ent.iterations, ent.marginalError, div, ab.iterations, aa.iterations, bb.iterations);
  }
}

void BM_PairAfter(benchmark::State& state) {
  const int n = int(state.range(0));
  const Cloud a = uniformCloud(n, 1, 0.0, 0.0), b = uniformCloud(n, 2, 0.5, 0.2);
  for (auto _ : state) {
    SinkhornCache::shared().clear();
    const double cpu0 = cpuSeconds();
    auto t0 = std::chrono::steady_clock::now();
    const Result ent = evaluateMeasure(EntropicMeasure(), a, b, EvalRequest{});
    const double entSeconds = seconds(t0);
    t0 = std::chrono::steady_clock::now();
    const Result sink = evaluateMeasure(SinkhornMeasure(), a, b, EvalRequest{});
    const double sinkSeconds = seconds(t0);
    state.counters["entropic_s"] = entSeconds;
    state.counters["sinkhorn_s"] = sinkSeconds;
    state.counters["cpu_s"] = cpuSeconds() - cpu0;
    state.counters["ab_it"] = ent.details["iterations"].get<int>();
    state.counters["aa_it"] = sink.details["aa_iterations"].get<int>();
    state.counters["bb_it"] = sink.details["bb_iterations"].get<int>();
    state.counters["ab_reused"] = sink.details["ab_reused"].get<bool>();
    std::fprintf(stderr,
                 "after  n=%d entropic %.17g (%d it + %d coarse, err %.3g) sinkhorn %.17g (ab reused %d, aa %d, bb %d "
                 "it) accuracy %.3g / %.3g\n",
                 n, ent.value, ent.details["iterations"].get<int>(), ent.details["coarse_iterations"].get<int>(),
                 ent.details["marginal_error"].get<double>(), sink.value, int(sink.details["ab_reused"].get<bool>()),
                 sink.details["aa_iterations"].get<int>(), sink.details["bb_iterations"].get<int>(),
                 ent.details["value_accuracy"].get<double>(), sink.details["value_accuracy"].get<double>());
  }
}

// OT_ε(A, B) alone at small ε, dense (truncation off: the solver as before) or truncated
// (transport/sinkhorn_truncated.h). Args: n, case (0: ε = (D/50)², p = 2; 1: ε = 1e-4, p = 2;
// 2: ε = D/50, p = 1), truncation (0/1).
void BM_SmallEpsilon(benchmark::State& state) {
  const int n = int(state.range(0)), kind = int(state.range(1));
  const bool truncate = state.range(2) != 0;
  const Cloud a = uniformCloud(n, 1, 0.0, 0.0), b = uniformCloud(n, 2, 0.5, 0.2);
  ParamSet params;
  params.setNumber("entropic.p", kind == 2 ? 1 : 2);
  EntropicSettings settings = readEntropicSettings("entropic", params, a, b);
  SinkhornOptions o = settings.options;
  o.epsilon = kind == 1 ? 1e-4 : std::pow(settings.diameter / 50.0, o.p);
  o.truncation = truncate;
  const Eigen::VectorXd wa = a.normalizedWeights(), wb = b.normalizedWeights();
  for (auto _ : state) {
    const double cpu0 = cpuSeconds();
    const SinkhornResult r = solveSinkhorn(a.points, wa, b.points, wb, o);
    state.counters["cpu_s"] = cpuSeconds() - cpu0;
    state.counters["it"] = r.iterations;
    state.counters["kept_share"] = double(r.keptPairs) / (double(n) * n);
    state.counters["bound"] = r.neglectedBound;
    std::fprintf(stderr, "small-eps n=%d p=%d eps=%.4g %s: %.17g (%d it, %d coarse, err %.3g, kept %lld, bound %.3g)\n",
                 n, o.p, o.epsilon, r.truncated ? "truncated" : "dense", r.value, r.iterations, r.coarseIterations,
                 r.marginalError, r.keptPairs, r.neglectedBound);
  }
}

// `entropic` then `sinkhorn` above their exact limit (measures/entropic_bracket.h): certified
// brackets at the default settings. Args: n (both clouds), representatives (0: the default).
void BM_Bracket(benchmark::State& state) {
  const int n = int(state.range(0)), k = int(state.range(1));
  const Cloud a = uniformCloud(n, 1, 0.0, 0.0), b = uniformCloud(n, 2, 0.5, 0.2);
  EvalRequest req;
  req.params.set("entropic.exact_limit", "0");
  req.params.set("sinkhorn.exact_limit", "0");
  if (k > 0) {
    req.params.set("entropic.representatives", std::to_string(k));
    req.params.set("sinkhorn.representatives", std::to_string(k));
  }
  for (auto _ : state) {
    const double cpu0 = cpuSeconds();
    auto t0 = std::chrono::steady_clock::now();
    const Result ent = evaluateMeasure(EntropicMeasure(), a, b, req);
    const double entSeconds = seconds(t0);
    t0 = std::chrono::steady_clock::now();
    const Result sink = evaluateMeasure(SinkhornMeasure(), a, b, req);
    state.counters["entropic_s"] = entSeconds;
    state.counters["sinkhorn_s"] = seconds(t0);
    state.counters["cpu_s"] = cpuSeconds() - cpu0;
    state.counters["entropic_rel_width"] = (ent.high - ent.low) / std::abs(ent.value);
    state.counters["sinkhorn_rel_width"] = (sink.high - sink.low) / std::abs(sink.value);
    std::fprintf(stderr, "bracket n=%d k=%d: entropic [%.10g, %.10g] sinkhorn [%.10g, %.10g] (%s / %s)\n", n, k,
                 ent.low, ent.high, sink.low, sink.high, ent.message.c_str(), sink.message.c_str());
  }
}

BENCHMARK(BM_Bracket)->Args({10000, 0})->Args({100000, 0})->Args({100000, 16384})
    ->Unit(benchmark::kSecond)->UseRealTime()->Iterations(1);

BENCHMARK(BM_SmallEpsilon)
    ->Args({10000, 0, 0})->Args({10000, 0, 1})->Args({10000, 1, 0})->Args({10000, 1, 1})
    ->Args({10000, 2, 0})->Args({10000, 2, 1})
    ->Unit(benchmark::kSecond)->UseRealTime()->Iterations(1);

BENCHMARK(BM_PairBefore)->Arg(4000)->Arg(10000)->Unit(benchmark::kSecond)->UseRealTime()->Iterations(1);
BENCHMARK(BM_PairAfter)->Arg(4000)->Arg(10000)->Unit(benchmark::kSecond)->UseRealTime()->Iterations(1);

}  // namespace
}  // namespace barrow

BENCHMARK_MAIN();
