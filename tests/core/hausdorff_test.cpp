// Hausdorff distance: REFERENCES 11a/11c, scipy's directed_hausdorff on random clouds,
// weights and multiplicity ignored, and the gradient.
#include <gtest/gtest.h>

#include <cmath>
#include <random>
#include <set>
#include <sstream>

#include "measures/evaluate.h"
#include "measures/registry.h"
#include "support/test_support.h"

namespace barrow {
namespace {

const Measure& hausdorff() { return *MeasureRegistry::instance().find("hausdorff"); }

Result runHausdorff(const Cloud& a, const Cloud& b) { return evaluateMeasure(hausdorff(), a, b, EvalRequest{}); }

Cloud uniformCloud(const char* name, int n, unsigned seed, double cx) {
  std::mt19937 rng(seed);
  std::uniform_real_distribution<double> u(-1, 1);
  Eigen::MatrixX2d p(n, 2);
  for (int i = 0; i < n; ++i) p.row(i) << cx + u(rng), u(rng);
  return Cloud(name, p);
}

// REFERENCES 11a [P] Huttenlocher et al. 1993 (mem): A = {(0,0),(2,0)}, B = {(0,1)}:
// directed A->B = sqrt 5, B->A = 1, H = sqrt 5.
TEST(HausdorffTest, WorkedExample) {
  const Cloud a("A", (Eigen::MatrixX2d(2, 2) << 0, 0, 2, 0).finished()), b("B", (Eigen::MatrixX2d(1, 2) << 0, 1).finished());
  const Result r = runHausdorff(a, b);
  EXPECT_NEAR(r.value, std::sqrt(5.0), 1e-15);
  EXPECT_NEAR(r.details["directed_a_to_b"].get<double>(), std::sqrt(5.0), 1e-15);
  EXPECT_NEAR(r.details["directed_b_to_a"].get<double>(), 1.0, 1e-15);
  EXPECT_EQ(r.details["attained_at"]["a_row"].get<int>(), 1);
}

// Reference: max(directed_hausdorff(X, Y)[0], directed_hausdorff(Y, X)[0]) from
// scipy.spatial.distance (Taha & Hanbury 2015's algorithm, mem).
TEST(HausdorffTest, MatchesScipyDirectedHausdorff) {
  if (!test::pythonHas("scipy")) GTEST_SKIP() << "python3-scipy missing";
  const Cloud a = uniformCloud("A", 400, 1, 0.0), b = uniformCloud("B", 6000, 2, 0.7);
  const std::string py = "import numpy as np\nfrom scipy.spatial.distance import directed_hausdorff as dh\nX = " +
                         test::pyPoints(a) + "\nY = " + test::pyPoints(b) +
                         "\nprint(repr(dh(X, Y)[0]), repr(dh(Y, X)[0]))\n";
  std::istringstream out(test::runPython(py));
  double ab = 0, ba = 0;
  out >> ab >> ba;
  const Result r = runHausdorff(a, b);
  EXPECT_NEAR(r.details["directed_a_to_b"].get<double>(), ab, 1e-15);
  EXPECT_NEAR(r.details["directed_b_to_a"].get<double>(), ba, 1e-15);
  EXPECT_NEAR(r.value, std::max(ab, ba), 1e-15);
}

// REFERENCES 11c [D]: a circle of radius r against its centre gives r; an outlier dominates.
TEST(HausdorffTest, CircleAgainstCentreAndAnOutlier) {
  Eigen::MatrixX2d circle(64, 2);
  for (int k = 0; k < 64; ++k) circle.row(k) << 1 + 2.5 * std::cos(k * M_PI / 32), -1 + 2.5 * std::sin(k * M_PI / 32);
  const Cloud centre("B", (Eigen::MatrixX2d(1, 2) << 1, -1).finished());
  EXPECT_NEAR(runHausdorff(Cloud("A", circle), centre).value, 2.5, 1e-14);
  Cloud a = uniformCloud("A", 300, 3, 0.0);
  const Cloud b = uniformCloud("B", 300, 4, 0.0);
  const double before = runHausdorff(a, b).value;
  a.points.row(0) << 20, 0;
  const double after = runHausdorff(a, b).value;
  EXPECT_LT(before, 0.5);
  double nearest = INFINITY;  // [D] the outlier's distance to B is now the value
  for (Eigen::Index j = 0; j < b.size(); ++j) nearest = std::min(nearest, (b.points.row(j) - a.points.row(0)).norm());
  EXPECT_DOUBLE_EQ(after, nearest);
}

// REFERENCES 11c / pitfalls: Hausdorff ignores weights and multiplicity; points of zero weight
// are not part of the support and are left out (our stated convention).
TEST(HausdorffTest, IgnoresWeightsAndMultiplicityAndSkipsMasslessPoints) {
  Cloud a = uniformCloud("A", 50, 5, 0.0);
  const Cloud b = uniformCloud("B", 40, 6, 0.2);
  const double base = runHausdorff(a, b).value;
  Cloud heavy = a;
  heavy.weights(3) = 100.0;
  EXPECT_EQ(runHausdorff(heavy, b).value, base);
  Cloud doubled("A2", Eigen::MatrixX2d(100, 2));
  doubled.points << a.points, a.points;
  doubled.weights = Eigen::VectorXd::Ones(100);
  EXPECT_EQ(runHausdorff(doubled, b).value, base);
  Cloud extra("A3", Eigen::MatrixX2d(51, 2), Eigen::VectorXd::Ones(51));
  extra.points << a.points, Eigen::RowVector2d(50, 50);
  extra.weights(50) = 0.0;
  EXPECT_EQ(runHausdorff(extra, b).value, base);
}

// [D] the attaining pair alone moves the value; central finite differences.
TEST(HausdorffTest, GradientMatchesFiniteDifferences) {
  std::set<std::string> attained;  // both directions should be exercised
  for (double spread : {0.3, 3.0}) {  // A inside B's hull (B->A attains), then around it (A->B)
    Cloud a = uniformCloud("A", 12, 7, 0.0);
    a.points *= spread;
    const Cloud b = uniformCloud("B", 15, 8, 0.0);
    attained.insert(runHausdorff(a, b).details["attained_at"].begin().key());
    const auto g = test::analyticGradientA(hausdorff(), a, b, ParamSet{});
    ASSERT_TRUE(g.has_value());
    EXPECT_LT((*g - test::finiteDifferenceGradientA(hausdorff(), a, b, ParamSet{}, 1e-7)).cwiseAbs().maxCoeff(), 1e-7)
        << spread;
    EXPECT_EQ((g->array() != 0).count(), 2);  // one point moves the value
  }
  EXPECT_EQ(attained.size(), 2u);
}

}  // namespace
}  // namespace barrow
