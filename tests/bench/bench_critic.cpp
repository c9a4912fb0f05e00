// Critic training speed (issue 18): 1000 gradient-penalty steps, batch 256 per cloud, the
// default 2-64-64-1 ReLU network, on two seeded Gaussian clouds of 2000 points each.
// Peer: peer_critic.py (the same loop in PyTorch on the CPU). Results: RESULTS-critic.md.
#include <benchmark/benchmark.h>

#include <random>

#include "critic/critic_trainer.h"

namespace {

barrow::Cloud blob(int n, unsigned seed, double shift) {
  std::mt19937 rng(seed);
  std::normal_distribution<double> z(0.0, 1.0);
  Eigen::MatrixX2d p(n, 2);
  for (int i = 0; i < n; ++i) p.row(i) << shift + z(rng), z(rng);
  return barrow::Cloud("", p);
}

void trainSteps(benchmark::State& state, barrow::critic::Method method) {
  const barrow::Cloud a = blob(2000, 1, 0.0), b = blob(2000, 2, 1.5);
  barrow::critic::CriticSettings s = barrow::critic::defaultSettings(method);
  s.steps = int(state.range(0));
  s.batch = 256;
  s.curvePoints = 1;  // the loop itself, not the full-data checkpoints
  for (auto _ : state) {
    const auto out = barrow::critic::trainCritic(a, b, s, nullptr, nullptr);
    benchmark::DoNotOptimize(out.curve.back().estimate);
  }
}

void BM_CriticGp(benchmark::State& st) { trainSteps(st, barrow::critic::Method::Gp); }
void BM_CriticSn(benchmark::State& st) { trainSteps(st, barrow::critic::Method::Sn); }
void BM_CriticClip(benchmark::State& st) { trainSteps(st, barrow::critic::Method::Clip); }

}  // namespace

BENCHMARK(BM_CriticGp)->Arg(1000)->Unit(benchmark::kMillisecond)->MeasureProcessCPUTime();
BENCHMARK(BM_CriticSn)->Arg(1000)->Unit(benchmark::kMillisecond)->MeasureProcessCPUTime();
BENCHMARK(BM_CriticClip)->Arg(1000)->Unit(benchmark::kMillisecond)->MeasureProcessCPUTime();
BENCHMARK_MAIN();
