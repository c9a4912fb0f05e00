// The on-the-fly kernel passes under log-domain Sinkhorn: the vectorised exp, the row
// log-sum-exp with its one-pass stabiliser and exact fallback, the gradient sums, and the
// row team. References: std::exp / std::log (libm) and the definitions evaluated in long
// double, [D].
#include <gtest/gtest.h>

#include <algorithm>
#include <atomic>
#include <cmath>
#include <random>
#include <vector>

#include "transport/kernel_pass.h"
#include "transport/kernel_pass_simd.h"

namespace barrow::kernel {
namespace {

Eigen::MatrixX2d randomPoints(int n, unsigned seed, double spread = 1.0) {
  std::mt19937 rng(seed);
  std::uniform_real_distribution<double> u(0.0, spread);
  Eigen::MatrixX2d p(n, 2);
  for (int i = 0; i < n; ++i) p.row(i) << u(rng), u(rng);
  return p;
}

std::vector<double> randomLogWeights(int m, int padded, unsigned seed) {
  std::mt19937 rng(seed);
  std::uniform_real_distribution<double> u(-3.0, 3.0);
  std::vector<double> h(padded, -INFINITY);
  for (int j = 0; j < m; ++j) h[j] = u(rng);
  return h;
}

// log Σ_j exp(h_j − |x_i − y_j|^p / ε) by the definition, in long double with the max taken out.
long double lseReference(const Eigen::MatrixX2d& x, int i, const Eigen::MatrixX2d& y, const std::vector<double>& h,
                         int p, double eps) {
  std::vector<long double> t(y.rows());
  long double mx = -INFINITY;
  for (int j = 0; j < y.rows(); ++j) {
    const long double d = (x.row(i) - y.row(j)).norm();
    t[j] = h[j] - (p == 2 ? d * d : d) / eps;
    mx = std::max(mx, t[j]);
  }
  long double s = 0;
  for (long double v : t) s += std::exp(v - mx);
  return mx + std::log(s);
}

#ifdef BARROW_X86_SIMD
BARROW_AVX2_FN void exp4Of(const double* in, double* out) { _mm256_storeu_pd(out, exp4(_mm256_loadu_pd(in))); }

// [D] reference: libm's exp, correctly rounded to within 1 ulp.
TEST(KernelExpTest, MatchesLibmToAFewUlps) {
  if (!cpuHasAvx2Fma()) GTEST_SKIP() << "this CPU has no AVX2+FMA: the vector exp is never used here";
  std::mt19937 rng(7);
  std::uniform_real_distribution<double> u(-708.0, 709.0);
  double worst = 0.0;
  for (int k = 0; k < 200000; ++k) {
    alignas(32) double in[4], out[4];
    for (double& v : in) v = k < 4 ? double(k) - 2.0 : u(rng);
    exp4Of(in, out);
    for (int l = 0; l < 4; ++l) worst = std::max(worst, std::abs(out[l] / std::exp(in[l]) - 1.0));
  }
  EXPECT_LT(worst, 1e-15);
}

TEST(KernelExpTest, FlushesBelowTheUnderflowLimitAndHandlesMinusInfinity) {
  if (!cpuHasAvx2Fma()) GTEST_SKIP() << "this CPU has no AVX2+FMA: the vector exp is never used here";
  alignas(32) double in[4] = {-708.5, -1e6, -INFINITY, 0.0}, out[4];
  exp4Of(in, out);
  EXPECT_EQ(out[0], 0.0);
  EXPECT_EQ(out[1], 0.0);
  EXPECT_EQ(out[2], 0.0);
  EXPECT_EQ(out[3], 1.0);
}
#endif

class KernelPassTest : public ::testing::TestWithParam<int> {};

TEST_P(KernelPassTest, RowLogSumExpMatchesTheDefinition) {
  const int p = GetParam();
  const double eps = p == 2 ? 0.003 : 0.02;
  const Eigen::MatrixX2d x = randomPoints(37, 1), y = randomPoints(53, 2);
  const ScaledPoints xs(x, scaleFor(p, eps)), ys(y, scaleFor(p, eps));
  const std::vector<double> h = randomLogWeights(53, ys.padded(), 3);
  std::vector<double> out(37), ratio(37), guess(37, 0.0);  // guess 0: far off, forces the exact route
  RowWorkers team(2);
  logSumExpRows(xs, ys, h, p, guess.data(), out.data(), ratio.data(), team);
  for (int i = 0; i < 37; ++i) EXPECT_NEAR(out[i], double(lseReference(x, i, y, h, p, eps)), 1e-12 * (1 + std::abs(out[i])));
  // A close guess takes the one-pass route and reports exp(out − guess).
  std::vector<double> near(37), out2(37);
  for (int i = 0; i < 37; ++i) near[i] = out[i] + 0.25;
  logSumExpRows(xs, ys, h, p, near.data(), out2.data(), ratio.data(), team);
  for (int i = 0; i < 37; ++i) {
    EXPECT_NEAR(out2[i], out[i], 1e-12 * (1 + std::abs(out[i])));
    EXPECT_NEAR(ratio[i], std::exp(-0.25), 1e-13);
  }
}

TEST_P(KernelPassTest, NoOverflowOrNanWhenTheGuessIsHopeless) {
  const int p = GetParam();
  const Eigen::MatrixX2d x = randomPoints(9, 4, 50.0), y = randomPoints(11, 5, 50.0);
  const double eps = 1e-4;  // exponents of order −10^7
  const ScaledPoints xs(x, scaleFor(p, eps)), ys(y, scaleFor(p, eps));
  const std::vector<double> h = randomLogWeights(11, ys.padded(), 6);
  for (double g : {0.0, 1e9, -1e9, double(NAN)}) {
    std::vector<double> out(9), ratio(9), guess(9, g);
    RowWorkers team(1);
    logSumExpRows(xs, ys, h, p, guess.data(), out.data(), ratio.data(), team);
    for (int i = 0; i < 9; ++i) {
      ASSERT_TRUE(std::isfinite(out[i])) << "guess " << g;
      EXPECT_NEAR(out[i], double(lseReference(x, i, y, h, p, eps)), 1e-9 * std::abs(out[i]));
    }
  }
}

TEST_P(KernelPassTest, GradientSumsMatchTheDefinition) {
  const int p = GetParam();
  const double eps = 0.05;
  const Eigen::MatrixX2d x = randomPoints(13, 7), y = randomPoints(10, 8);
  const double sc = scaleFor(p, eps);
  const ScaledPoints xs(x, sc), ys(y, sc);
  const std::vector<double> h = randomLogWeights(10, ys.padded(), 9);
  std::vector<double> o(13, 1.5), s0(13), sx(13), sy(13);
  RowWorkers team(2);
  gradientRows(xs, ys, h, p, o.data(), s0.data(), sx.data(), sy.data(), team);
  for (int i = 0; i < 13; ++i) {
    long double r0 = 0, rx = 0, ry = 0;
    for (int j = 0; j < 10; ++j) {
      const Eigen::RowVector2d d = (x.row(i) - y.row(j)) * sc;
      const long double c = p == 2 ? d.squaredNorm() : d.norm();
      const long double e = std::exp(h[j] - c - o[i]);
      const long double w = p == 2 ? e : e / d.norm();
      r0 += e;
      rx += w * d(0);
      ry += w * d(1);
    }
    EXPECT_NEAR(s0[i], double(r0), 1e-13 * double(r0));
    EXPECT_NEAR(sx[i], double(rx), 1e-12 * (std::abs(double(rx)) + double(r0)));
    EXPECT_NEAR(sy[i], double(ry), 1e-12 * (std::abs(double(ry)) + double(r0)));
  }
}

INSTANTIATE_TEST_SUITE_P(CostPowers, KernelPassTest, ::testing::Values(1, 2));

TEST(KernelPassTest, UnitVectorSumsSkipCoincidentPoints) {
  Eigen::MatrixX2d x(1, 2), y(2, 2);
  x << 0.5, 0.5;
  y << 0.5, 0.5, 1.5, 0.5;  // the first coincides with x
  const ScaledPoints xs(x, 1.0), ys(y, 1.0);
  std::vector<double> h(ys.padded(), -INFINITY);
  h[0] = h[1] = 0.0;
  double o = 0.0, s0, sx, sy;
  RowWorkers team(1);
  gradientRows(xs, ys, h, 1, &o, &s0, &sx, &sy, team);
  EXPECT_NEAR(s0, 1.0 + std::exp(-1.0), 1e-15);
  EXPECT_NEAR(sx, -std::exp(-1.0), 1e-15);  // only the second point pulls, along −x
  EXPECT_EQ(sy, 0.0);
}

TEST(RowWorkersTest, CoversEveryRowExactlyOnce) {
  RowWorkers team(2);
  for (int rows : {1, 7, 64, 1000, 4099}) {
    std::vector<std::atomic<int>> hits(rows);
    for (auto& h : hits) h = 0;
    team.run(rows, 5, [&](int b, int e) {
      for (int i = b; i < e; ++i) hits[i]++;
    });
    for (int i = 0; i < rows; ++i) ASSERT_EQ(hits[i].load(), 1) << "row " << i << " of " << rows;
  }
}

// Back-to-back short runs: a helper that wakes late must neither run a finished job's rows
// nor take rows of the next job twice.
TEST(RowWorkersTest, ManyShortRunsBackToBack) {
  RowWorkers team(3);
  std::vector<int> hits(97);
  for (int run = 0; run < 3000; ++run) {
    std::fill(hits.begin(), hits.end(), 0);
    const int rows = 1 + run % 97;
    team.run(rows, 2, [&](int b, int e) {
      for (int i = b; i < e; ++i) {
        volatile double work = 0.0;  // long enough for the helpers to join in
        for (int k = 0; k < 500; ++k) work = work + k;
        hits[i] += 1;  // chunks are disjoint: no race on an entry
      }
    });
    for (int i = 0; i < rows; ++i) ASSERT_EQ(hits[i], 1) << "run " << run << " row " << i;
    for (int i = rows; i < 97; ++i) ASSERT_EQ(hits[i], 0) << "run " << run << " row " << i;
  }
}

}  // namespace
}  // namespace barrow::kernel
