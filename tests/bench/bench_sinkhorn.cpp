// Log-domain Sinkhorn against its floor: one pass that evaluates exp(−c_ij/ε) for all n·m
// pairs from the coordinates on all cores, with the same vectorised exp and row team as the
// solver. Clouds: uniform on the unit square (seeded), cost |x − y|².
//
//   BM_KernelFloor/n            the floor pass alone
//   BM_SinkhornIteration/n      one full iteration (both half-steps), timed together with a
//                               floor pass in the same loop; counter x_floor = iteration / floor
//   BM_SinkhornSolve/n/eps_exp  a whole solve with ε-scaling, ε = 10^-eps_exp, to the default
//                               tolerance; counters: iterations, stages, marginal error
//
// Run: build with -DBARROW_BUILD_BENCH=ON, then
//   tests/bench/bench_sinkhorn --benchmark_min_time=1 --benchmark_repetitions=5
//     --benchmark_report_aggregates_only=true   (one command line)
#include <benchmark/benchmark.h>

#include <chrono>
#include <cmath>
#include <random>
#include <vector>

#include "transport/kernel_pass.h"
#include "transport/kernel_pass_simd.h"
#include "transport/sinkhorn_solver.h"

namespace barrow {
namespace {

Eigen::MatrixX2d unitSquare(int n, unsigned seed) {
  std::mt19937_64 rng(seed);
  std::uniform_real_distribution<double> u(0.0, 1.0);
  Eigen::MatrixX2d p(n, 2);
  for (int i = 0; i < n; ++i) p.row(i) << u(rng), u(rng);
  return p;
}

#ifdef BARROW_X86_SIMD
// One row of the floor pass in AVX2 (called only when the CPU has it, like the solver's).
BARROW_AVX2_FN double floorRowAvx2(const kernel::ScaledPoints& xs, const kernel::ScaledPoints& ys, int i) {
  const __m256d xr = _mm256_set1_pd(xs.x[i]), yr = _mm256_set1_pd(xs.y[i]);
  __m256d acc0 = _mm256_setzero_pd(), acc1 = _mm256_setzero_pd();
  int j = 0;
  for (; j + 8 <= ys.padded(); j += 8) {
    const __m256d dx0 = _mm256_sub_pd(xr, _mm256_loadu_pd(ys.x.data() + j));
    const __m256d dy0 = _mm256_sub_pd(yr, _mm256_loadu_pd(ys.y.data() + j));
    const __m256d dx1 = _mm256_sub_pd(xr, _mm256_loadu_pd(ys.x.data() + j + 4));
    const __m256d dy1 = _mm256_sub_pd(yr, _mm256_loadu_pd(ys.y.data() + j + 4));
    const __m256d c0 = _mm256_fmadd_pd(dx0, dx0, _mm256_mul_pd(dy0, dy0));
    const __m256d c1 = _mm256_fmadd_pd(dx1, dx1, _mm256_mul_pd(dy1, dy1));
    acc0 = _mm256_add_pd(acc0, kernel::exp4(_mm256_sub_pd(_mm256_setzero_pd(), c0)));
    acc1 = _mm256_add_pd(acc1, kernel::exp4(_mm256_sub_pd(_mm256_setzero_pd(), c1)));
  }
  for (; j < ys.padded(); j += 4) {
    const __m256d dx = _mm256_sub_pd(xr, _mm256_loadu_pd(ys.x.data() + j));
    const __m256d dy = _mm256_sub_pd(yr, _mm256_loadu_pd(ys.y.data() + j));
    acc0 = _mm256_add_pd(acc0, kernel::exp4(_mm256_sub_pd(_mm256_setzero_pd(),
                                                          _mm256_fmadd_pd(dx, dx, _mm256_mul_pd(dy, dy)))));
  }
  return kernel::hsum4(_mm256_add_pd(acc0, acc1));
}
#endif

double floorRowScalar(const kernel::ScaledPoints& xs, const kernel::ScaledPoints& ys, int i) {
  double s = 0.0;
  for (int j = 0; j < ys.size; ++j) {
    const double dx = xs.x[i] - ys.x[j], dy = xs.y[i] - ys.y[j];
    s += std::exp(-(dx * dx + dy * dy));
  }
  return s;
}

// Σ_ij exp(−|x_i − y_j|²/ε): the least work any kernel-based iteration must do per pair.
double floorPass(const kernel::ScaledPoints& xs, const kernel::ScaledPoints& ys, kernel::RowWorkers& team,
                 std::vector<double>& rowSums) {
  const bool avx = cpuHasAvx2Fma();
  team.run(xs.size, kernel::grainFor(xs.size, ys.size), [&](int b, int e) {
    for (int i = b; i < e; ++i) {
#ifdef BARROW_X86_SIMD
      if (avx) {
        rowSums[i] = floorRowAvx2(xs, ys, i);
        continue;
      }
#endif
      rowSums[i] = floorRowScalar(xs, ys, i);
    }
  });
  double total = 0.0;
  for (int i = 0; i < xs.size; ++i) total += rowSums[i];
  return total;
}

struct Problem {
  Eigen::MatrixX2d x, y;
  Eigen::VectorXd a, b;
  explicit Problem(int n)
      : x(unitSquare(n, 1)), y(unitSquare(n, 2)), a(Eigen::VectorXd::Constant(n, 1.0 / n)),
        b(Eigen::VectorXd::Constant(n, 1.0 / n)) {}
};

constexpr double kIterationEpsilon = 0.01;

void BM_KernelFloor(benchmark::State& state) {
  const Problem pr(int(state.range(0)));
  const double scale = kernel::scaleFor(2, kIterationEpsilon);
  const kernel::ScaledPoints xs(pr.x, scale), ys(pr.y, scale);
  kernel::RowWorkers team;
  std::vector<double> rows(xs.size);
  for (auto _ : state) benchmark::DoNotOptimize(floorPass(xs, ys, team, rows));
  state.counters["pairs_per_s"] = benchmark::Counter(double(xs.size) * ys.size, benchmark::Counter::kIsIterationInvariantRate);
  state.counters["threads"] = team.threads();
}

// One iteration from converged potentials (the state every iteration but the first few of a
// stage is in), so the one-exp-per-pair route is what gets measured.
void BM_SinkhornIteration(benchmark::State& state) {
  const int n = int(state.range(0));
  const Problem pr(n);
  SinkhornOptions o;
  o.epsilon = kIterationEpsilon;
  o.tolerance = 1e-6;
  const SinkhornResult solved = solveSinkhorn(pr.x, pr.a, pr.y, pr.b, o);
  const double e = o.epsilon, scale = kernel::scaleFor(2, e);
  const kernel::ScaledPoints xs(pr.x, scale), ys(pr.y, scale);
  const std::vector<double> logA = kernel::paddedLogWeights(pr.a), logB = kernel::paddedLogWeights(pr.b);
  std::vector<double> hA(logA.size()), hB(logB.size()), guessF(n), guessG(n), out(n), ratio(n), rows(n);
  Eigen::VectorXd f = solved.f, g = solved.g;
  kernel::RowWorkers team;
  double floorSeconds = 0.0, iterSeconds = 0.0;
  for (auto _ : state) {
    auto t0 = std::chrono::steady_clock::now();
    benchmark::DoNotOptimize(floorPass(xs, ys, team, rows));
    auto t1 = std::chrono::steady_clock::now();
    // The solver's iteration body (sinkhorn_solver.cpp), both half-steps.
    for (int j = 0; j < n; ++j) hB[j] = g(j) / e + logB[j];
    for (int i = 0; i < n; ++i) guessF[i] = -f(i) / e;
    kernel::logSumExpRows(xs, ys, hB, 2, guessF.data(), out.data(), ratio.data(), team);
    for (int i = 0; i < n; ++i) f(i) = -e * out[i];
    for (int i = 0; i < n; ++i) hA[i] = f(i) / e + logA[i];
    for (int j = 0; j < n; ++j) guessG[j] = -g(j) / e;
    kernel::logSumExpRows(ys, xs, hA, 2, guessG.data(), out.data(), nullptr, team);
    for (int j = 0; j < n; ++j) g(j) = -e * out[j];
    auto t2 = std::chrono::steady_clock::now();
    floorSeconds += std::chrono::duration<double>(t1 - t0).count();
    iterSeconds += std::chrono::duration<double>(t2 - t1).count();
    state.SetIterationTime(std::chrono::duration<double>(t2 - t1).count());
  }
  state.counters["x_floor"] = iterSeconds / floorSeconds;
  state.counters["floor_ms"] = 1e3 * floorSeconds / double(state.iterations());
}

void BM_SinkhornSolve(benchmark::State& state) {
  const Problem pr(int(state.range(0)));
  SinkhornOptions o;
  o.epsilon = std::pow(10.0, -double(state.range(1)));
  SinkhornResult r;
  for (auto _ : state) r = solveSinkhorn(pr.x, pr.a, pr.y, pr.b, o);
  state.counters["iterations"] = r.iterations;
  state.counters["stages"] = r.stages;
  state.counters["marginal_error"] = r.marginalError;
  state.counters["converged"] = r.status == SinkhornStatus::Converged;
}

BENCHMARK(BM_KernelFloor)->Arg(1000)->Arg(4000)->Arg(10000)->Unit(benchmark::kMillisecond)->UseRealTime();
BENCHMARK(BM_SinkhornIteration)->Arg(1000)->Arg(4000)->Arg(10000)->Unit(benchmark::kMillisecond)->UseManualTime();
BENCHMARK(BM_SinkhornSolve)
    ->Args({1000, 2})->Args({1000, 3})->Args({4000, 2})->Args({4000, 3})->Args({10000, 2})->Args({10000, 3})
    ->Unit(benchmark::kMillisecond)->UseRealTime()->Iterations(1);

}  // namespace
}  // namespace barrow

BENCHMARK_MAIN();
