// w1 and w2 at 10^5 + 10^5 points: the certified bracket (measures/wasserstein_bracket.h) that
// the measures give above their exact limit, its wall time and its width. Google Benchmark;
//   bench_large_wp --benchmark_filter='Default' --benchmark_min_time=1x
// runs the default settings (the numbers in RESULTS-large-wp.md); the Representatives family
// varies the count k behind the defaults. Instances: A uniform in the unit square, B the same
// law shifted by (0.3, 0.1) ("shift"); A four Gaussian clusters, B uniform on a wider box
// ("clusters"). Counters: low, high, width, width relative to the midpoint, and the parts'
// seconds (quantise, exact solve between representatives, dual bounds).
#include <benchmark/benchmark.h>

#include <random>
#include <string>

#include "measures/evaluate.h"
#include "measures/registry.h"

namespace {

using namespace barrow;

Cloud makeCloud(bool clustered, bool isA, int n, std::uint64_t seed) {
  std::mt19937_64 rng(seed);
  std::uniform_real_distribution<double> u(0.0, 1.0);
  std::normal_distribution<double> z(0.0, 0.08);
  const double cx[4] = {0.0, 1.0, 0.3, 0.8}, cy[4] = {0.0, 0.2, 1.0, 0.9};
  Eigen::MatrixX2d p(n, 2);
  for (int i = 0; i < n; ++i) {
    if (!clustered) {
      p.row(i) << u(rng) + (isA ? 0.0 : 0.3), u(rng) + (isA ? 0.0 : 0.1);
    } else if (isA) {
      const int c = int(4 * u(rng));
      p.row(i) << cx[c] + z(rng), cy[c] + z(rng);
    } else {
      p.row(i) << 1.2 * u(rng) - 0.1, 0.2 + u(rng);
    }
  }
  return Cloud(isA ? "A" : "B", p);
}

void run(benchmark::State& state, const char* id, bool clustered, int representatives) {
  const int n = 100000;
  const Cloud a = makeCloud(clustered, true, n, 1), b = makeCloud(clustered, false, n, 2);
  const Measure* m = MeasureRegistry::instance().find(id);
  EvalRequest req;
  if (representatives > 0) req.params.set(std::string(id) + ".representatives", std::to_string(representatives));
  Result r;
  for (auto _ : state) {
    r = evaluateMeasure(*m, a, b, req);
    if (r.status != Status::Bracketed) state.SkipWithError(("not bracketed: " + r.message).c_str());
  }
  if (r.status != Status::Bracketed) return;
  state.counters["low"] = r.low;
  state.counters["high"] = r.high;
  state.counters["width"] = r.high - r.low;
  state.counters["rel_width"] = (r.high - r.low) / r.value;
  state.counters["k"] = r.details.at("representatives_a").get<double>();
  state.counters["quantise_s"] = r.details.at("quantise_seconds").get<double>();
  state.counters["solve_s"] = r.details.at("solve_seconds").get<double>();
  state.counters["bounds_s"] = r.details.at("bounds_seconds").get<double>();
  state.SetLabel(r.details.at("low_rule").get<std::string>().substr(0, 24));
}

void Default(benchmark::State& state) {
  run(state, state.range(0) == 1 ? "w1" : "w2", state.range(1) == 1, 0);
}
BENCHMARK(Default)->ArgNames({"p", "clusters"})->ArgsProduct({{1, 2}, {0, 1}})->Unit(benchmark::kSecond)->UseRealTime()
    ->Iterations(1);

void Representatives(benchmark::State& state) {
  run(state, state.range(0) == 1 ? "w1" : "w2", true, int(state.range(1)));
}
BENCHMARK(Representatives)->ArgNames({"p", "k"})->ArgsProduct({{1, 2}, {5000, 12000, 20000, 30000}})
    ->Unit(benchmark::kSecond)->UseRealTime()->Iterations(1);

}  // namespace

BENCHMARK_MAIN();
