// Exact optimal transport: Barrow's solver against LEMON's NetworkSimplex on the same
// instances, and warm starts against cold solves. Google Benchmark; run for medians with
//   bench_exact_ot --benchmark_repetitions=5 --benchmark_report_aggregates_only=true
// Instances: n = m points, uniform in the unit square or two clusters (30 % / 70 % of A's
// points vs an even split of B's, so mass must cross between clusters); uniform or random
// weights; cost |x-y| (W1) or |x-y|^2 (W2). LEMON gets the complete bipartite graph with an
// explicit cost per arc, built the way its users would; it is skipped above n = 4000, where
// the graph (16M arcs at 4000, ~0.8 GB) stops fitting comfortably. Its time is reported
// twice: graph building plus solve ("lemon"), and the solve alone (counter "solve_s", CPU
// seconds). Every benchmark measures process CPU time next to wall time.
#include <benchmark/benchmark.h>
#include <sys/resource.h>

#include <ctime>
#include <cmath>
#include <random>
#include <string>

#include "transport/exact_ot.h"
#include "transport/exact_warm_state.h"

#ifdef BARROW_HAVE_LEMON
#include <lemon/network_simplex.h>
#include <lemon/smart_graph.h>
#endif

namespace {

using namespace barrow;

enum class Shape { Uniform, TwoClusters };

Cloud makeCloud(Shape shape, int n, bool randomWeights, bool isA, std::uint64_t seed) {
  std::mt19937_64 rng(seed);
  std::uniform_real_distribution<double> u(0.0, 1.0);
  std::normal_distribution<double> z(0.0, 0.06);
  Eigen::MatrixX2d p(n, 2);
  Eigen::VectorXd w = Eigen::VectorXd::Ones(n);
  const double left = isA ? 0.3 : 0.5;
  for (int i = 0; i < n; ++i) {
    if (shape == Shape::Uniform) p.row(i) << u(rng), u(rng);
    else p.row(i) << (u(rng) < left ? 0.25 : 0.75) + z(rng), 0.5 + z(rng);
    if (randomWeights) w(i) = 0.1 + u(rng);
  }
  return Cloud(isA ? "A" : "B", p, w);
}

// CPU time of the process: on a shared machine it moves less than wall time.
double cpuSeconds() {
  timespec ts{};
  clock_gettime(CLOCK_PROCESS_CPUTIME_ID, &ts);
  return double(ts.tv_sec) + 1e-9 * double(ts.tv_nsec);
}

double peakRssMiB() {
  rusage ru{};
  getrusage(RUSAGE_SELF, &ru);
  return double(ru.ru_maxrss) / 1024.0;
}

void runBarrow(benchmark::State& state, Shape shape, bool randomWeights, double p, int n) {
  const Cloud a = makeCloud(shape, n, randomWeights, true, 1), b = makeCloud(shape, n, randomWeights, false, 2);
  ExactOtOptions o = exactOtOptionsFor(p);  // what the measures use
  ExactOtResult r;
  for (auto _ : state) {
    r = solveExactOt(a, b, o);
    benchmark::DoNotOptimize(r.plan.data());  // (on a double, this version's DoNotOptimize garbles it)
  }
  if (r.status != ExactOtStatus::Optimal) state.SkipWithError(r.message.c_str());
  state.counters["value"] = r.value;
  state.counters["pivots"] = double(r.pivots);
  state.counters["rounds"] = r.rounds;
  state.counters["arcs"] = r.arcs;
  state.counters["peak_rss_MiB"] = peakRssMiB();  // of the whole process so far
}

#ifdef BARROW_HAVE_LEMON
void runLemon(benchmark::State& state, Shape shape, bool randomWeights, double p, int n) {
  using Graph = lemon::SmartDigraph;
  const Cloud a = makeCloud(shape, n, randomWeights, true, 1), b = makeCloud(shape, n, randomWeights, false, 2);
  double value = 0.0, solveSeconds = 0.0;
  for (auto _ : state) {
    Graph g;
    g.reserveNode(2 * n);
    g.reserveArc(n * n);
    std::vector<Graph::Node> na, nb;
    for (int i = 0; i < n; ++i) na.push_back(g.addNode());
    for (int j = 0; j < n; ++j) nb.push_back(g.addNode());
    Graph::ArcMap<double> cost(g);
    for (int i = 0; i < n; ++i)
      for (int j = 0; j < n; ++j) {
        const double d2 = (a.point(i) - b.point(j)).squaredNorm();
        cost[g.addArc(na[std::size_t(i)], nb[std::size_t(j)])] = p == 1.0 ? std::sqrt(d2) : d2;
      }
    // Integer supplies (LEMON's recommended use) summing to exactly 2^52 on both sides.
    Graph::NodeMap<long long> supply(g);
    for (const auto* side : {&a, &b}) {
      const Eigen::VectorXd w = side->normalizedWeights();
      const auto& nodes = side == &a ? na : nb;
      const long long sign = side == &a ? 1 : -1;
      long long sum = 0;
      for (int i = 0; i + 1 < n; ++i) {
        const long long q = std::llround(std::ldexp(w(i), 52));
        supply[nodes[std::size_t(i)]] = sign * q;
        sum += q;
      }
      supply[nodes.back()] = sign * ((1LL << 52) - sum);
    }
    lemon::NetworkSimplex<Graph, long long, double> ns(g);
    ns.costMap(cost).supplyMap(supply);
    const double t0 = cpuSeconds();
    if (ns.run() != lemon::NetworkSimplex<Graph, long long, double>::OPTIMAL) state.SkipWithError("LEMON: not optimal");
    solveSeconds = cpuSeconds() - t0;
    value = std::pow(std::ldexp(ns.totalCost(), -52), 1.0 / p);
  }
  state.counters["value"] = value;
  state.counters["solve_s"] = solveSeconds;
  state.counters["peak_rss_MiB"] = peakRssMiB();
}
#endif

// Warm start after a small move of A: the basis of the solve before the move is reused.
// "shift": all of A translated by 1 % of the joint diameter (one step of a shift sweep);
// "jitter": every point of A moved by up to 1 % of the diameter in a random direction;
// "drag": one point moved by 10 % of the diameter; "shift-apart": the shift, with B first
// moved 1.5 to the right so that the supports lie apart (a shift sweep past overlap). The
// cold solve of the same moved instance is the matching "cold" benchmark.
enum class Move { Shift, Jitter, Drag, ShiftApart };

Cloud moved(const Cloud& a, Move move, double diameter) {
  Cloud out = a;
  std::mt19937_64 rng(99);
  std::uniform_real_distribution<double> u(-1.0, 1.0);
  switch (move) {
    case Move::Shift:
    case Move::ShiftApart: out.points.col(0).array() += 0.01 * diameter; break;
    case Move::Jitter:
      for (Eigen::Index i = 0; i < out.size(); ++i) {
        const double t = M_PI * u(rng), r = 0.01 * diameter * (0.5 + 0.5 * u(rng));
        out.points.row(i) += Eigen::RowVector2d(r * std::cos(t), r * std::sin(t));
      }
      break;
    case Move::Drag: out.points.row(out.size() / 2) += Eigen::RowVector2d(0.1 * diameter, 0.0); break;
  }
  return out;
}

void runMoved(benchmark::State& state, Move move, double p, int n, bool warm) {
  const Cloud a = makeCloud(Shape::Uniform, n, true, true, 1);
  Cloud b = makeCloud(Shape::Uniform, n, true, false, 2);
  if (move == Move::ShiftApart) b.points.col(0).array() += 1.5;
  const Cloud a2 = moved(a, move, jointDiameter(a, b));
  ExactOtOptions o = exactOtOptionsFor(p);  // what the measures use
  std::shared_ptr<WarmState> before;
  solveExactOt(a, b, o, nullptr, &before);
  const auto& state0 = dynamic_cast<const ExactWarmState&>(*before);
  ExactOtResult r;
  for (auto _ : state) {
    state.PauseTiming();
    std::shared_ptr<WarmState> slot = std::make_shared<ExactWarmState>(state0);
    state.ResumeTiming();
    r = solveExactOt(a2, b, o, nullptr, warm ? &slot : nullptr);
    benchmark::DoNotOptimize(r.plan.data());  // (on a double, this version's DoNotOptimize garbles it)
  }
  if (r.status != ExactOtStatus::Optimal || r.warmStarted != warm) state.SkipWithError("unexpected start");
  state.counters["value"] = r.value;
  state.counters["pivots"] = double(r.pivots);
  state.counters["rounds"] = r.rounds;
}

// Ablation at one size: what each design choice of the solver buys, on uniform clouds with
// random weights (LEMON above is the plain network simplex on all n·m arcs).
void runVariant(benchmark::State& state, std::string variant, double p, int n) {
  const Cloud a = makeCloud(Shape::Uniform, n, true, true, 1), b = makeCloud(Shape::Uniform, n, true, false, 2);
  ExactOtOptions o = exactOtOptionsFor(p);  // what the measures use
  if (variant == "single-level-greedy") o.multiscale = false;
  if (variant == "single-level-northwest") o.multiscale = false, o.initial = InitialBasis::NorthWest;
  if (variant == "neighbours-2") o.neighbours = 2;
  if (variant == "neighbours-16") o.neighbours = 16;
  if (variant == "arcs-per-row-1") o.arcsPerRow = 1;
  if (variant == "groups-of-8") o.groupSize = 8;
  ExactOtResult r;
  for (auto _ : state) {
    r = solveExactOt(a, b, o);
    benchmark::DoNotOptimize(r.plan.data());
  }
  if (r.status != ExactOtStatus::Optimal) state.SkipWithError(r.message.c_str());
  state.counters["pivots"] = double(r.pivots);
  state.counters["rounds"] = r.rounds;
  state.counters["arcs"] = r.arcs;
}

void registerAll() {
  const char* shapeName[] = {"uniform", "clusters"};
  const char* weightName[] = {"w-uniform", "w-random"};
  for (int shape = 0; shape < 2; ++shape)
    for (int weights = 0; weights < 2; ++weights)
      for (double p : {1.0, 2.0})
        for (int n : {500, 1000, 2000, 4000, 8000}) {
          const std::string tag = std::string(shapeName[shape]) + "/" + weightName[weights] + "/W" +
                                  std::to_string(int(p)) + "/" + std::to_string(n);
          benchmark::RegisterBenchmark(("barrow/" + tag).c_str(), runBarrow, Shape(shape), weights == 1, p, n)
              ->Unit(benchmark::kMillisecond)
              ->MeasureProcessCPUTime()
              ->UseRealTime();
#ifdef BARROW_HAVE_LEMON
          if (n <= 4000)
            benchmark::RegisterBenchmark(("lemon/" + tag).c_str(), runLemon, Shape(shape), weights == 1, p, n)
                ->Unit(benchmark::kMillisecond)
                ->MeasureProcessCPUTime()
                ->UseRealTime();
#endif
        }
  for (const char* variant : {"default", "single-level-greedy", "single-level-northwest", "neighbours-2",
                              "neighbours-16", "arcs-per-row-1", "groups-of-8"})
    for (double p : {1.0, 2.0})
      benchmark::RegisterBenchmark(("ablation/" + std::string(variant) + "/W" + std::to_string(int(p)) + "/2000").c_str(),
                                   runVariant, std::string(variant), p, 2000)
          ->Unit(benchmark::kMillisecond)
          ->MeasureProcessCPUTime()
          ->UseRealTime();
  const char* moveName[] = {"shift1pct", "jitter1pct", "drag1point", "shift1pct-apart"};
  for (int move = 0; move < 4; ++move)
    for (double p : {1.0, 2.0})
      for (int n : {1000, 2000, 4000})
        for (bool warm : {false, true}) {
          const std::string tag = std::string(warm ? "warm/" : "cold/") + moveName[move] + "/W" +
                                  std::to_string(int(p)) + "/" + std::to_string(n);
          benchmark::RegisterBenchmark(tag.c_str(), runMoved, Move(move), p, n, warm)
              ->Unit(benchmark::kMillisecond)
              ->MeasureProcessCPUTime()
              ->UseRealTime();
        }
}

}  // namespace

int main(int argc, char** argv) {
  registerAll();
  benchmark::Initialize(&argc, argv);
  if (benchmark::ReportUnrecognizedArguments(argc, argv)) return 1;
  benchmark::RunSpecifiedBenchmarks();
  benchmark::Shutdown();
  return 0;
}
