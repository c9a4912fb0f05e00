// Chamfer distance: the worked example of REFERENCES 11b, scipy cKDTree and brute force on
// random weighted clouds, points without mass, and the gradient.
#include <gtest/gtest.h>

#include <cmath>
#include <random>
#include <sstream>

#include "measures/evaluate.h"
#include "measures/registry.h"
#include "support/test_support.h"

namespace barrow {
namespace {

const Measure& chamfer() { return *MeasureRegistry::instance().find("chamfer"); }

Result runChamfer(const Cloud& a, const Cloud& b, bool squared) {
  EvalRequest req;
  req.params.set("chamfer.squared", squared ? "true" : "false");
  return evaluateMeasure(chamfer(), a, b, req);
}

Cloud blobCloud(const char* name, int n, unsigned seed, double cx) {
  std::mt19937 rng(seed);
  std::normal_distribution<double> g(0, 1);
  std::uniform_real_distribution<double> u(0.1, 1.0);
  Eigen::MatrixX2d p(n, 2);
  Eigen::VectorXd w(n);
  for (int i = 0; i < n; ++i) {
    p.row(i) << cx + g(rng), 0.7 * g(rng);
    w(i) = u(rng);
  }
  return Cloud(name, p, w);
}

// Brute-force nearest distance from p to the positive-weight points of c. [D]
double nearestTo(const Eigen::RowVector2d& p, const Cloud& c) {
  double best = INFINITY;
  for (Eigen::Index j = 0; j < c.size(); ++j)
    if (c.weights(j) > 0) best = std::min(best, (p - c.points.row(j)).norm());
  return best;
}

// REFERENCES 11b [CP]: A = {(0,0),(2,0)}, B = {(0,1)}, equal weights. Mean unsquared,
// both directions added: (1 + sqrt 5)/2 + 1 = 2.618033988750; mean of squares added: 4.
TEST(ChamferTest, WorkedExampleOfBothVariants) {
  const Cloud a("A", (Eigen::MatrixX2d(2, 2) << 0, 0, 2, 0).finished()), b("B", (Eigen::MatrixX2d(1, 2) << 0, 1).finished());
  const Result r = runChamfer(a, b, false);
  EXPECT_NEAR(r.value, 2.618033988750, 1e-12);
  EXPECT_FALSE(r.details["squared"].get<bool>());
  EXPECT_NEAR(runChamfer(a, b, true).value, 4.0, 1e-14);
}

// Reference: scipy.spatial.cKDTree(...).query nearest distances, weighted by the normalised
// weights of the positive-weight points (points without mass are left out on both sides).
TEST(ChamferTest, MatchesScipyCKDTreeOnWeightedClouds) {
  if (!test::pythonHas("numpy, scipy")) GTEST_SKIP() << "python3-scipy missing";
  Cloud a = blobCloud("A", 300, 1, 0.0), b = blobCloud("B", 220, 2, 0.8);
  a.weights(7) = 0.0;
  b.weights(11) = 0.0;
  const std::string py = "import numpy as np\nfrom scipy.spatial import cKDTree\nX = " + test::pyPoints(a) + "\nY = " +
                         test::pyPoints(b) + "\na = " + test::pyWeights(a) + "\nb = " + test::pyWeights(b) +
                         "\nX, a, Y, b = X[a > 0], a[a > 0], Y[b > 0], b[b > 0]\n"
                         "dx, _ = cKDTree(Y).query(X)\ndy, _ = cKDTree(X).query(Y)\n"
                         "print(repr(float(a @ dx + b @ dy)), repr(float(a @ dx**2 + b @ dy**2)))\n";
  std::istringstream out(test::runPython(py));
  double plain = 0, squared = 0;
  out >> plain >> squared;
  EXPECT_NEAR(runChamfer(a, b, false).value, plain, 1e-13 * plain);
  EXPECT_NEAR(runChamfer(a, b, true).value, squared, 1e-13 * squared);
}

// [D] brute force on clouds large enough for the threaded query path (several blocks).
TEST(ChamferTest, MatchesBruteForceOnLargerClouds) {
  const Cloud a = blobCloud("A", 5000, 3, 0.0), b = blobCloud("B", 4100, 4, 0.5);
  const Eigen::VectorXd wa = a.normalizedWeights(), wb = b.normalizedWeights();
  double ref = 0;
  for (Eigen::Index i = 0; i < a.size(); ++i) ref += wa(i) * nearestTo(a.points.row(i), b);
  for (Eigen::Index j = 0; j < b.size(); ++j) ref += wb(j) * nearestTo(b.points.row(j), a);
  EXPECT_NEAR(runChamfer(a, b, false).value, ref, 1e-12 * ref);
}

// [D] brute force on clouds made of few locations, each repeated many times with different
// weights (repeated points are queried once per location; the sums still weigh every row).
TEST(ChamferTest, RepeatedPointsMatchBruteForce) {
  std::mt19937 rng(11);
  std::uniform_int_distribution<int> pick(0, 24);
  std::uniform_real_distribution<double> w(0.1, 1.0);
  Eigen::MatrixX2d pa(3000, 2), pb(2000, 2);
  Eigen::VectorXd wa(3000), wb(2000);
  for (int i = 0; i < 3000; ++i) {
    const int k = pick(rng);
    pa.row(i) << k % 5, k / 5;
    wa(i) = w(rng);
  }
  for (int j = 0; j < 2000; ++j) {
    const int k = pick(rng);
    pb.row(j) << 0.3 + k % 5, 0.7 * (k / 5);
    wb(j) = w(rng);
  }
  const Cloud a("A", pa, wa), b("B", pb, wb);
  const Eigen::VectorXd na = a.normalizedWeights(), nb = b.normalizedWeights();
  double ref = 0;
  for (Eigen::Index i = 0; i < a.size(); ++i) ref += na(i) * nearestTo(a.points.row(i), b);
  for (Eigen::Index j = 0; j < b.size(); ++j) ref += nb(j) * nearestTo(b.points.row(j), a);
  EXPECT_NEAR(runChamfer(a, b, false).value, ref, 1e-12 * ref);
}

// [D] a point without mass is not part of the measure: moving it anywhere changes nothing.
TEST(ChamferTest, PointsWithoutMassAreLeftOut) {
  Cloud a = blobCloud("A", 30, 5, 0.0);
  const Cloud b = blobCloud("B", 20, 6, 0.3);
  const double before = runChamfer(a, b, false).value;
  a.weights(0) = 0.0;
  const double without = runChamfer(a, b, false).value;
  a.points.row(0) << 0.3, 0.0;  // would be some B point's nearest neighbour if it counted
  EXPECT_DOUBLE_EQ(runChamfer(a, b, false).value, without);
  EXPECT_NE(before, without);
}

// [D] through the nearest-neighbour assignment (unique for random data), against central
// finite differences, for both variants.
TEST(ChamferTest, GradientMatchesFiniteDifferences) {
  Cloud a = blobCloud("A", 14, 7, 0.0);
  const Cloud b = blobCloud("B", 10, 8, 0.4);
  a.weights(5) = 0.0;
  for (bool squared : {false, true}) {
    ParamSet params;
    params.set("chamfer.squared", squared ? "true" : "false");
    const auto g = test::analyticGradientA(chamfer(), a, b, params);
    ASSERT_TRUE(g.has_value());
    EXPECT_LT((*g - test::finiteDifferenceGradientA(chamfer(), a, b, params, 1e-7)).cwiseAbs().maxCoeff(), 1e-7) << squared;
    EXPECT_EQ(g->row(5).norm(), 0.0);
  }
}

}  // namespace
}  // namespace barrow
