// Value versus sample size: the engine's means against outside results on the rate of W1 and
// the expectation of the biased MMD².
#include <gtest/gtest.h>

#include <cmath>
#include <sstream>

#include "measures/registry.h"
#include "support/test_support.h"
#include "uncertainty/value_vs_size.h"
#include "uncertainty_test_data.h"

namespace barrow {
namespace {

const Measure& measure(const std::string& id) { return *MeasureRegistry::instance().find(id); }

// Ajtai, Komlós & Tusnády (1984), "On optimal matchings", Combinatorica 4:259 [P]: for two
// independent n-samples of the unit square, c1·sqrt(log n / n) ≤ E W1 ≤ c2·sqrt(log n / n).
// Checked two ways on subsamples of a fine jittered grid: (1) at each n the engine's mean
// agrees with SciPy (scipy.optimize.linear_sum_assignment on fresh uniform samples: for equal
// uniform weights W1 is the optimal assignment's mean cost, Birkhoff–von Neumann [P]) within
// Monte Carlo error; (2) mean / sqrt(log n / n) stays within a factor 1.4 over n = 25..400 and
// the log–log slope lies between −0.55 and −0.35 (−1/2 plus the log factor's 1/(2 ln n), with
// the boundary terms that dominate at small n) [D].
TEST(ValueVsSizeTest, ExactW1ShrinksLikeAjtaiKomlosTusnady) {
  if (!test::pythonHas("numpy, scipy")) GTEST_SKIP() << "numpy/scipy missing";
  const Cloud grid = test::jitteredSquare(100, 5);
  SizesRequest req;
  req.measures = {&measure("w1")};
  req.sizes = {25, 50, 100, 200, 400};
  req.repeats = 20;
  const SizesResult r = runValueVsSize(grid, grid, req);
  const SizesRow& row = r.rows[0];
  ASSERT_EQ(row.status, Status::Ok) << row.message;
  const std::string py = test::runPython(
      "import numpy as np\nfrom scipy.optimize import linear_sum_assignment\nfrom scipy.spatial.distance import cdist\n"
      "rng=np.random.default_rng(1984)\nout=[]\n"
      "for n in [25,50,100,200,400]:\n"
      "  v=[]\n"
      "  for _ in range(40):\n"
      "    C=cdist(rng.random((n,2)),rng.random((n,2))); i,j=linear_sum_assignment(C); v.append(C[i,j].mean())\n"
      "  out+=[np.mean(v), np.std(v,ddof=1)/np.sqrt(len(v))]\n"
      "print(' '.join(repr(float(x)) for x in out))\n");
  std::istringstream in(py);
  double lo = INFINITY, hi = 0.0;
  for (std::size_t s = 0; s < r.sizes.size(); ++s) {
    double ref = NAN, refSe = NAN;
    in >> ref >> refSe;
    const double se = row.sd[s] / std::sqrt(double(req.repeats));
    EXPECT_NEAR(row.mean[s], ref, 4.0 * std::hypot(se, refSe)) << "n = " << r.sizes[s];
    const double n = r.sizes[s];
    const double ratio = row.mean[s] / std::sqrt(std::log(n) / n);
    lo = std::min(lo, ratio);
    hi = std::max(hi, ratio);
  }
  EXPECT_LT(hi / lo, 1.4);
  EXPECT_GT(row.slope, -0.55);
  EXPECT_LT(row.slope, -0.35);
}

// Biased MMD² of an n- and an m-sample of one distribution: E = (E k(X,X) − E k(X,X′))(1/n + 1/m)
// [D] from the V-statistic (Gretton et al. 2012, JMLR 13:723, eq. 5). Gaussian kernel
// exp(−|x−y|²/(2σ²)) on X ~ N(0, s²I₂): E k(X,X) = 1 and X − X′ ~ N(0, 2s²I₂), so
// E k(X,X′) = σ²/(σ² + 2s²) [D] (Gaussian integral). σ = s = 1: E MMD² = (2/3)(2/n).
// Subsamples come from a 20 000-point sample of N(0, I), whose own E k(X,X′) differs from the
// population's by O(1/sqrt(20 000)); the tolerance is 4 Monte Carlo standard errors plus 3 %.
TEST(ValueVsSizeTest, BiasedMmdSquaredHasClosedFormExpectation) {
  const Cloud big = test::diagonalGaussian(20000, 2012, 0, 0, 1, 1);
  SizesRequest req;
  req.measures = {&measure("mmd")};
  req.params.set("mmd.sigma", "1");
  req.sizes = {20, 60};
  req.repeats = 300;
  const SizesResult r = runValueVsSize(big, big, req);
  for (std::size_t s = 0; s < r.sizes.size(); ++s) {
    std::vector<double> sq;
    for (double v : r.rows[0].values[s]) sq.push_back(v * v);
    double mean = 0, ss = 0;
    for (double v : sq) mean += v / double(sq.size());
    for (double v : sq) ss += (v - mean) * (v - mean);
    const double se = std::sqrt(ss / double(sq.size() - 1) / double(sq.size()));
    const double expected = (1.0 - 1.0 / 3.0) * (2.0 / r.sizes[s]);
    EXPECT_NEAR(mean, expected, 4.0 * se + 0.03 * expected) << "n = " << r.sizes[s];
  }
  // sqrt of a quantity ∝ 1/n: the slope of the mean value is close to −1/2 [D].
  EXPECT_NEAR(r.rows[0].slope, -0.5, 0.1);
}

// 8 sizes spaced geometrically from 25 to the cloud size [CP].
TEST(ValueVsSizeTest, DefaultLadderIsGeometricFrom25) {
  const auto l = defaultSizeLadder(1000);
  ASSERT_EQ(l.size(), 8u);
  EXPECT_EQ(l.front(), 25);
  EXPECT_EQ(l.back(), 1000);
  for (std::size_t i = 1; i + 1 < l.size(); ++i)
    EXPECT_NEAR(std::log(double(l[i + 1]) / l[i]), std::log(40.0) / 7.0, 0.02) << i;
  EXPECT_EQ(defaultSizeLadder(10), std::vector<int>{10});
}

TEST(ValueVsSizeTest, SizesLargerThanTheCloudAndBadRepeatsAreRejected) {
  SizesRequest req;
  req.measures = {&measure("w1")};
  req.sizes = {10, 51};
  EXPECT_TRUE(checkSizesRequest(req, 50).has_value());
  req.sizes = {10, 50};
  EXPECT_FALSE(checkSizesRequest(req, 50).has_value());
  req.repeats = 0;
  EXPECT_TRUE(checkSizesRequest(req, 50).has_value());
  req.repeats = kMaxRepeats + 1;
  EXPECT_TRUE(checkSizesRequest(req, 50).has_value());
}

TEST(ValueVsSizeTest, ThreadCountDoesNotChangeValues) {
  const Cloud a = test::gaussianCloud(80, 1), b = test::gaussianCloud(70, 2, 0.5);
  SizesRequest req;
  req.measures = {&measure("w2"), &measure("chamfer")};
  req.sizes = {10, 30, 70};
  req.repeats = 6;
  req.threads = 1;
  const SizesResult one = runValueVsSize(a, b, req);
  req.threads = 2;
  const SizesResult two = runValueVsSize(a, b, req);
  for (std::size_t k = 0; k < one.rows.size(); ++k) EXPECT_EQ(one.rows[k].values, two.rows[k].values);
}

}  // namespace
}  // namespace barrow
