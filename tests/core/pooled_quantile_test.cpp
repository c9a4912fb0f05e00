// The IQR behind Silverman's bandwidth: linear-interpolation quantiles of the pooled sample
// (density/pooled_stats.h), checked against NumPy.
#include <gtest/gtest.h>

#include <cmath>
#include <random>
#include <sstream>

#include "density/pooled_stats.h"
#include "support/test_support.h"

namespace barrow {
namespace {

// Equal-size uniform clouds pool into equal weights, where the rule must be numpy.quantile's
// default method 'linear' (Hyndman & Fan 1996, type 7) [P]. Cases: continuous data, the
// issue's 20 + 20 points with ties (coordinates on a 0.5 lattice), and two points.
TEST(PooledQuantileTest, EqualWeightsGiveNumpyQuantileDefault) {
  if (!test::pythonHas("numpy")) GTEST_SKIP() << "python3-numpy not installed";
  std::mt19937 rng(17);
  std::normal_distribution<double> g(0.0, 1.0);
  for (int c = 0; c < 4; ++c) {
    const int n = c == 3 ? 1 : c == 1 ? 20 : 37;
    Eigen::MatrixX2d pa(n, 2), pb(n, 2);
    for (int i = 0; i < n; ++i) {
      pa.row(i) << g(rng), 2 * g(rng);
      pb.row(i) << 1 + g(rng), g(rng);
    }
    if (c == 1 || c == 2) {  // ties: a lattice of step 0.5
      pa = (pa * 2).array().round() / 2;
      pb = (pb * 2).array().round() / 2;
    }
    const Cloud a("A", pa), b("B", pb);
    std::ostringstream py;
    py << "import numpy as np\nx=np.vstack([" << test::pyPoints(a) << "," << test::pyPoints(b) << "])\n"
       << "q=np.quantile(x,[0.25,0.75],axis=0)\nprint(repr(q[1,0]-q[0,0]), repr(q[1,1]-q[0,1]))\n";
    std::istringstream out(test::runPython(py.str()));
    double ix = NAN, iy = NAN;
    out >> ix >> iy;
    ASSERT_TRUE(out) << "case " << c;
    const PooledStats s = pooledStats(a, b);
    EXPECT_NEAR(s.iqr.x(), ix, 1e-12 * std::max(1.0, ix)) << "case " << c;
    EXPECT_NEAR(s.iqr.y(), iy, 1e-12 * std::max(1.0, iy)) << "case " << c;
  }
}

// Unequal weights (clouds of different sizes, random weights): the rule as stated in
// pooled_stats.h and `measure --help`, recomputed with NumPy (np.interp over the rescaled
// centres of each point's weight, ties ordered by weight) [D].
TEST(PooledQuantileTest, UnequalWeightsFollowTheStatedInterpolationRule) {
  if (!test::pythonHas("numpy")) GTEST_SKIP() << "python3-numpy not installed";
  for (unsigned seed : {1u, 2u, 3u}) {
    const Cloud a = test::gaussianCloud(50, seed, 0.0, 1.0, true);
    Cloud b = test::gaussianCloud(20, seed + 10, 0.5, 2.0, true);
    if (seed == 3) b.points = (b.points * 2).array().round() / 2;  // ties across weights
    std::ostringstream py;
    py << "import numpy as np\nx=np.vstack([" << test::pyPoints(a) << "," << test::pyPoints(b) << "])\n"
       << "w=np.concatenate([" << test::pyWeights(a) << "/2," << test::pyWeights(b) << "/2])\n"
       << "r=[]\nfor ax in range(2):\n"
          "  o=np.lexsort((w,x[:,ax])); xs=x[o,ax]; ws=w[o]\n"
          "  m=np.cumsum(ws)-ws/2; p=(m-m[0])/(m[-1]-m[0])\n"
          "  r.append(np.interp(0.75,p,xs)-np.interp(0.25,p,xs))\n"
          "print(repr(r[0]), repr(r[1]))\n";
    std::istringstream out(test::runPython(py.str()));
    double ix = NAN, iy = NAN;
    out >> ix >> iy;
    ASSERT_TRUE(out) << seed;
    const PooledStats s = pooledStats(a, b);
    EXPECT_NEAR(s.iqr.x(), ix, 1e-12 * std::max(1.0, ix)) << seed;
    EXPECT_NEAR(s.iqr.y(), iy, 1e-12 * std::max(1.0, iy)) << seed;
    // Kish's effective size of the 50/50 pool, as --help states: N = 1/sum w^2.
    const Eigen::VectorXd wa = a.normalizedWeights() / 2, wb = b.normalizedWeights() / 2;
    EXPECT_NEAR(s.effectiveSize, 1.0 / (wa.squaredNorm() + wb.squaredNorm()), 1e-9);
  }
  // Uniform 50 + 20 points: N = 4nm/(n+m) = 57.14..., not 70.
  const PooledStats s = pooledStats(test::gaussianCloud(50, 1, 0, 1, false), test::gaussianCloud(20, 2, 0, 1, false));
  EXPECT_NEAR(s.effectiveSize, 4.0 * 50 * 20 / 70, 1e-9);
}

}  // namespace
}  // namespace barrow
