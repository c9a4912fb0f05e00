// Quantiles, intervals and slopes of replicate values, checked against NumPy.
#include <gtest/gtest.h>

#include <cmath>
#include <sstream>

#include "support/test_support.h"
#include "uncertainty/replicate_stats.h"

namespace barrow {
namespace {

// numpy.quantile's default ("linear", Hyndman & Fan 1996 definition 7) is the reference.
TEST(ReplicateStatsTest, QuantilesMatchNumpyLinearDefinition) {
  if (!test::pythonHas("numpy")) GTEST_SKIP() << "numpy missing";
  const std::vector<double> v = {0.1, 0.25, 0.4, 0.41, 0.7, 0.9, 1.3};
  const std::vector<double> qs = {0.0, 0.025, 0.1, 0.5, 0.77, 0.975, 1.0};
  const std::string py = test::runPython(
      "import numpy as np\n"
      "v=np.array([0.1,0.25,0.4,0.41,0.7,0.9,1.3])\n"
      "print(' '.join(repr(float(np.quantile(v,q))) for q in [0.0,0.025,0.1,0.5,0.77,0.975,1.0]))\n");
  std::istringstream in(py);
  for (double q : qs) {
    double ref = NAN;
    in >> ref;
    EXPECT_NEAR(sortedQuantile(v, q), ref, 1e-14) << q;
  }
}

// An infinite largest replicate makes the upper quantile infinite, never NaN.
TEST(ReplicateStatsTest, InfiniteReplicatesGiveInfiniteUpperEnd) {
  const std::vector<double> v = {1.0, 2.0, INFINITY, INFINITY};
  EXPECT_EQ(sortedQuantile(v, 1.0), INFINITY);
  EXPECT_EQ(sortedQuantile(v, 0.9), INFINITY);
  EXPECT_DOUBLE_EQ(sortedQuantile(v, 0.0), 1.0);
}

// Basic interval = (2θ̂ − q_hi, 2θ̂ − q_lo): Davison & Hinkley (1997) eq. 5.6 [P] (mem).
TEST(ReplicateStatsTest, BasicIntervalReflectsPercentileAboutValue) {
  std::vector<double> v;
  for (int i = 0; i <= 100; ++i) v.push_back(double(i) / 100.0);
  const Interval p = resampleInterval(v, 0.3, 0.9, IntervalKind::Percentile);
  const Interval b = resampleInterval(v, 0.3, 0.9, IntervalKind::Basic);
  EXPECT_NEAR(p.low, 0.05, 1e-12);
  EXPECT_NEAR(p.high, 0.95, 1e-12);
  EXPECT_NEAR(b.low, 0.6 - 0.95, 1e-12);
  EXPECT_NEAR(b.high, 0.6 - 0.05, 1e-12);
}

// Standard deviation with divisor k − 1 (numpy.std(ddof=1)) and the log–log slope of an exact
// power law [D].
TEST(ReplicateStatsTest, SdAndLogLogSlope) {
  EXPECT_NEAR(sampleSd({1.0, 2.0, 4.0}), std::sqrt(((1 - 7.0 / 3) * (1 - 7.0 / 3) + (2 - 7.0 / 3) * (2 - 7.0 / 3) +
                                                    (4 - 7.0 / 3) * (4 - 7.0 / 3)) / 2.0), 1e-14);
  EXPECT_TRUE(std::isnan(sampleSd({1.0, INFINITY})));
  std::vector<double> x = {10, 20, 40, 80}, y;
  for (double n : x) y.push_back(3.0 * std::pow(n, -0.5));
  EXPECT_NEAR(logLogSlope(x, y), -0.5, 1e-12);
}

}  // namespace
}  // namespace barrow
