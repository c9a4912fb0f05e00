// The blocked, vectorised, threaded pair-sum engine, the vector exp it uses, and the exact
// median of pairwise distances (streamed selection) against direct computation and NumPy.
#include <gtest/gtest.h>

#include <atomic>
#include <cmath>
#include <random>
#include <sstream>

#include "base/simd_exp.h"
#include "kernel/median_distance.h"
#include "kernel/pair_sum.h"
#include "support/test_support.h"

namespace barrow {
namespace {

struct WeightedPoints {
  Eigen::MatrixX2d p;
  Eigen::VectorXd w;
};

WeightedPoints randomWeighted(int n, unsigned seed, double spread = 1.0) {
  std::mt19937 rng(seed);
  std::normal_distribution<double> g(0.0, spread);
  std::uniform_real_distribution<double> u(0.1, 1.0);
  WeightedPoints s{Eigen::MatrixX2d(n, 2), Eigen::VectorXd(n)};
  for (int i = 0; i < n; ++i) {
    s.p.row(i) << g(rng), g(rng);
    s.w(i) = u(rng);
  }
  s.w /= s.w.sum();
  return s;
}

double kernelOf(const PairKernelSpec& k, const Eigen::RowVector2d& d) {
  return k.kind == PairKernel::Gaussian ? std::exp(-k.gamma * d.squaredNorm()) : d.norm();
}

// [D] the definitions, summed pair by pair with std::exp / std::sqrt.
TEST(PairSumTest, SumsMatchPairByPairLoops) {
  for (const PairKernelSpec k : {PairKernelSpec{PairKernel::Gaussian, 0.7}, PairKernelSpec{PairKernel::Distance, 0}}) {
    for (const auto& [n, m] : {std::pair{1, 1}, std::pair{7, 3}, std::pair{37, 2050}, std::pair{2101, 6}}) {
      const auto a = randomWeighted(n, unsigned(n + 1)), b = randomWeighted(m, unsigned(m + 2), 1.5);
      double cross = 0, self = 0;
      for (int i = 0; i < n; ++i) {
        for (int j = 0; j < m; ++j) cross += a.w(i) * b.w(j) * kernelOf(k, a.p.row(i) - b.p.row(j));
        for (int j = i + 1; j < n; ++j) self += a.w(i) * a.w(j) * kernelOf(k, a.p.row(i) - a.p.row(j));
      }
      const PackedPoints pa(a.p, a.w), pb(b.p, b.w);
      EXPECT_NEAR(crossPairSum(pa, pb, k, {}).value, cross, 1e-13 * std::max(1.0, cross)) << n << "x" << m;
      EXPECT_NEAR(offDiagonalPairSum(pa, k, {}).value, self, 1e-13 * std::max(1.0, self)) << n;
    }
  }
}

// [D] row sums and their gradients: sum_j w_j k(x_i, y_j) and sum_j w_j grad_x k, the
// gradient from the definition (Gaussian: -2 gamma (x - y) k; distance: (x - y)/|x - y|).
TEST(PairSumTest, RowSumsAndGradientsMatchDefinitions) {
  for (const PairKernelSpec k : {PairKernelSpec{PairKernel::Gaussian, 0.3}, PairKernelSpec{PairKernel::Distance, 0}}) {
    auto a = randomWeighted(45, 5), b = randomWeighted(2061, 6);
    b.p.row(17) = a.p.row(3);  // a coincident pair: the distance kernel's gradient term is 0 there
    const RowSums rs = rowPairSums(PackedPoints(a.p, a.w), PackedPoints(b.p, b.w), k, {});
    ASSERT_TRUE(rs.complete);
    for (int i = 0; i < 45; ++i) {
      double s = 0;
      Eigen::RowVector2d g = Eigen::RowVector2d::Zero();
      for (int j = 0; j < 2061; ++j) {
        const Eigen::RowVector2d d = a.p.row(i) - b.p.row(j);
        s += b.w(j) * kernelOf(k, d);
        if (k.kind == PairKernel::Gaussian) g += b.w(j) * (-2.0 * k.gamma) * kernelOf(k, d) * d;
        else if (d.norm() > 0) g += b.w(j) * d / d.norm();
      }
      EXPECT_NEAR(rs.value(i), s, 1e-13);
      EXPECT_NEAR(rs.grad(i, 0), g(0), 1e-13);
      EXPECT_NEAR(rs.grad(i, 1), g(1), 1e-13);
    }
  }
}

// [D] each block's partial sum is kept and added in block order, so the thread count cannot
// change a single bit of the result (sweeps stay reproducible).
TEST(PairSumTest, ResultDoesNotDependOnThreadCount) {
  const auto a = randomWeighted(3001, 8), b = randomWeighted(2999, 9);
  const PackedPoints pa(a.p, a.w), pb(b.p, b.w);
  for (const PairKernelSpec k : {PairKernelSpec{PairKernel::Gaussian, 1.1}, PairKernelSpec{PairKernel::Distance, 0}}) {
    EXPECT_EQ(crossPairSum(pa, pb, k, {}, 1).value, crossPairSum(pa, pb, k, {}, 2).value);
    EXPECT_EQ(offDiagonalPairSum(pa, k, {}, 1).value, offDiagonalPairSum(pa, k, {}, 3).value);
  }
}

TEST(PairSumTest, StopsWhenCancelledAndReportsProgress) {
  const auto a = randomWeighted(5000, 10);
  const PackedPoints pa(a.p, a.w);
  std::atomic<bool> cancel{true};
  RunControl stopNow;
  stopNow.cancel = &cancel;
  EXPECT_FALSE(offDiagonalPairSum(pa, {PairKernel::Distance, 0}, {&stopNow}).complete);
  double last = -1;
  bool increasing = true;
  RunControl watch;
  watch.onProgress = [&](double f) {
    increasing = increasing && f >= last && f <= 1.0;
    last = f;
    return true;
  };
  EXPECT_TRUE(crossPairSum(pa, pa, {PairKernel::Gaussian, 1}, {&watch}).complete);
  EXPECT_TRUE(increasing);
  EXPECT_DOUBLE_EQ(last, 1.0);
}

#ifdef BARROW_X86_SIMD
// Lane 2 of the vector exp of (x, x, x, x); AVX2 CPUs only.
BARROW_AVX2_FN double vectorExpLane(double x) {
  double lanes[4];
  _mm256_storeu_pd(lanes, simd::expNonPositive4(_mm256_set1_pd(x)));
  return lanes[2];
}
#endif

// Reference: the C library's exp. The vector exp stays within ~1.5 ulp on [-708, 0], is
// bit-identical to its scalar form, and is exactly 0 below the cut-off.
TEST(PairSumTest, VectorExpMatchesLibraryExp) {
  std::mt19937 rng(12);
  std::uniform_real_distribution<double> u(-708.0, 0.0), small(-1.0, 0.0);
  double worst = 0;
  for (int t = 0; t < 200000; ++t) {
    const double x = t % 2 ? u(rng) : small(rng);
    const double e = simd::expNonPositive(x), ref = std::exp(x);
    worst = std::max(worst, std::abs(e - ref) / ref);
#ifdef BARROW_X86_SIMD
    if (cpuHasAvx2Fma()) ASSERT_EQ(vectorExpLane(x), e) << x;
#endif
  }
  EXPECT_LT(worst, 3e-16);  // measured 2.2e-16
  EXPECT_EQ(simd::expNonPositive(0.0), 1.0);
  EXPECT_EQ(simd::expNonPositive(-709.0), 0.0);
  EXPECT_EQ(simd::expNonPositive(-INFINITY), 0.0);
}

std::string pyMatrix(const Eigen::MatrixX2d& p) {
  std::ostringstream s;
  s.precision(17);
  s << "np.array([";
  for (Eigen::Index i = 0; i < p.rows(); ++i) s << "[" << p(i, 0) << "," << p(i, 1) << "],";
  s << "]).reshape(-1, 2)";
  return s.str();
}

// Reference: numpy.median(scipy.spatial.distance.pdist(P)) (all pairs i < j; the mean of
// the two middle values for an even count). The streamed selections are forced with small
// limits so that every pass kind runs (sampled bracket, histogram passes, collection).
TEST(MedianDistanceTest, MatchesNumpyMedianOfPdist) {
  if (!test::pythonHas("numpy, scipy")) GTEST_SKIP() << "python3-numpy/scipy missing";
  std::vector<Eigen::MatrixX2d> sets;
  sets.push_back(randomWeighted(300, 21).p);   // 44850 pairs: even count
  sets.push_back(randomWeighted(301, 22).p);   // 45150 pairs: even
  sets.push_back(randomWeighted(302, 23, 1e3).p);  // 45451 pairs: odd
  Eigen::MatrixX2d grid(400, 2);  // many exact ties and duplicate points
  for (int i = 0; i < 400; ++i) grid.row(i) << i % 7, (i / 7) % 5;
  sets.push_back(grid);
  Eigen::MatrixX2d two(2, 2);
  two << 0, 0, 3, 4;
  sets.push_back(two);
  std::ostringstream py;
  py << "import numpy as np\nfrom scipy.spatial.distance import pdist\n";
  for (const auto& p : sets) py << "print(repr(float(np.median(pdist(" << pyMatrix(p) << ")))))\n";
  std::istringstream out(test::runPython(py.str()));
  for (const auto& p : sets) {
    double ref = -1;
    out >> ref;
    const MedianDistance direct = medianPairwiseDistance(p, {});
    EXPECT_NEAR(direct.value, ref, 1e-14 * ref) << p.rows();
    // limit 1 and 50: radix passes down to single values; 1000: the sampled bracket (one pass);
    // 2^30: a single collecting pass.
    for (std::size_t limit : {std::size_t(1), std::size_t(50), std::size_t(1000), std::size_t(1) << 30}) {
      MedianDistanceOptions forced;
      forced.directLimit = 0;
      forced.cellGrid = false;  // the streamed selection; the grid search: median_grid_test.cpp
      forced.candidateLimit = limit;
      const MedianDistance streamed = medianPairwiseDistance(p, {}, forced);
      EXPECT_TRUE(streamed.complete);
      EXPECT_NEAR(streamed.value, ref, 1e-14 * ref) << p.rows() << " limit " << limit << " " << streamed.method;
      if (limit == 1000 && p.rows() > 2 && p.rows() < 400) {  // random sets (grid ties overfill it)
        EXPECT_NE(streamed.method.find("bracket"), std::string::npos) << p.rows();
      }
      forced.sampleBracket = false;
      EXPECT_NEAR(medianPairwiseDistance(p, {}, forced).value, ref, 1e-14 * ref) << p.rows() << " limit " << limit;
    }
  }
}

}  // namespace
}  // namespace barrow
