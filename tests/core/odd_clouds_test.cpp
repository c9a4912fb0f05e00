// Odd but valid clouds: one point, all points coincident, collinear, coordinates near
// 1e±150 and beyond, weights spanning 1e±300, 10^5 duplicates of one point. Every cheap
// measure returns the right value (closed forms marked [D], derived from each measure's
// definition in DEVELOPERS.md (Measure conventions), or SciPy) or a non-ok status that names the reason.
#include <gtest/gtest.h>

#include <cmath>
#include <sstream>

#include "cloud/congruence.h"
#include "density/discrete_divergence.h"
#include "measures/evaluate.h"
#include "measures/registry.h"
#include "support/test_support.h"

namespace barrow {
namespace {

Result run(const char* id, const Cloud& a, const Cloud& b, std::initializer_list<const char*> sets = {}) {
  EvalRequest req;
  for (const char* s : sets) EXPECT_FALSE(req.params.assign(s)) << s;
  return evaluateMeasure(*MeasureRegistry::instance().find(id), a, b, req);
}

Cloud points(std::initializer_list<std::pair<double, double>> xy, std::initializer_list<double> w = {}) {
  Eigen::MatrixX2d p(Eigen::Index(xy.size()), 2);
  Eigen::Index i = 0;
  for (const auto& [x, y] : xy) p.row(i++) << x, y;
  if (w.size() == 0) return Cloud("c", p);
  Eigen::VectorXd wv(Eigen::Index(w.size()));
  i = 0;
  for (double v : w) wv(i++) = v;
  return Cloud("c", p, wv);
}

// Value within a relative tolerance, with status ok.
void expectValue(const char* id, const Cloud& a, const Cloud& b, double expected, double rel = 1e-12) {
  const Result r = run(id, a, b);
  ASSERT_EQ(r.status, Status::Ok) << id << ": " << r.message;
  EXPECT_NEAR(r.value, expected, rel * std::fabs(expected)) << id;
}

// [D] One point each, |x − y| = 5: every transport distance is 5; Chamfer adds both
// directions (10); energy: sqrt(2·5 − 0 − 0); Fréchet: the Gaussians are point masses, so
// W2 between them is 5; sliced W2 over K ≥ 2 equally spaced angles: 5·sqrt(mean cos²) = 5/√2.
TEST(OddCloudsTest, OnePointEach) {
  const Cloud a = points({{0, 0}}), b = points({{3, 4}});
  for (const char* id : {"w1", "w2", "hausdorff", "frechet"}) expectValue(id, a, b, 5.0);
  expectValue("chamfer", a, b, 10.0);
  expectValue("energy", a, b, std::sqrt(10.0));
  expectValue("sliced", a, b, 5.0 / std::sqrt(2.0));
}

// [D] Every point of both clouds at one location: every distance and divergence is 0.
TEST(OddCloudsTest, AllPointsCoincident) {
  const Cloud a("A", Eigen::MatrixX2d::Constant(5, 2, 2.5)), b("B", Eigen::MatrixX2d::Constant(3, 2, 2.5));
  for (const char* id : {"w1", "w2", "sliced", "energy", "frechet", "chamfer", "hausdorff", "kl_ab", "kl_ba", "js",
                         "tv", "hellinger"}) {
    const Result r = run(id, a, b);
    ASSERT_EQ(r.status, Status::Ok) << id << ": " << r.message;
    // 0 up to the rounding of the coordinates (2.5): projections and sums may leave an ulp,
    // depending on the optimisation level.
    EXPECT_NEAR(r.value, 0.0, 1e-12 * 2.5) << id;
  }
}

// [D] Collinear: B is A moved by 0.5 along the line, uniform weights. W1 = W2 = 0.5 (a
// translation), Hausdorff 0.5, Chamfer 0.5 + 0.5; Fréchet: equal (rank-1) covariances, means
// 0.5 apart. Energy: scipy.stats.energy_distance on the x coordinates (DEVELOPERS.md, Measure conventions: in 1-D the
// energy measure is SciPy's).
TEST(OddCloudsTest, CollinearPoints) {
  const Cloud a = points({{0, 0}, {1, 0}, {2, 0}}), b = points({{0.5, 0}, {1.5, 0}, {2.5, 0}});
  for (const char* id : {"w1", "w2", "hausdorff", "frechet"}) expectValue(id, a, b, 0.5);
  expectValue("chamfer", a, b, 1.0);
  if (!test::pythonHas("scipy")) GTEST_SKIP() << "python3-scipy missing";
  const double e = std::stod(test::runPython(
      "from scipy.stats import energy_distance\nprint(repr(energy_distance([0,1,2],[0.5,1.5,2.5])))"));
  expectValue("energy", a, b, e);
}

// Found: A = (0,0), B = (1e-300,0) gave 0 with status ok (squared distances underflow).
// [D] W1 = W2 = Hausdorff = Fréchet = 1e-300, Chamfer 2e-300, energy sqrt(2e-300),
// sliced 1e-300/√2 (as for one point each, scaled).
TEST(OddCloudsTest, PointsOneTenToTheMinus300Apart) {
  const Cloud a = points({{0, 0}}), b = points({{1e-300, 0}});
  for (const char* id : {"w1", "w2", "hausdorff", "frechet"}) expectValue(id, a, b, 1e-300);
  expectValue("chamfer", a, b, 2e-300);
  expectValue("energy", a, b, std::sqrt(2e-300));
  expectValue("sliced", a, b, 1e-300 / std::sqrt(2.0));
}

// Found: every squared distance overflowed, and the nearest-neighbour batch used index -1
// (UBSan). [D] A = (0,0),(1,0), B = (1e200,0),(1e200,1): each nearest distance is 1e200 to
// double precision; Chamfer 2e200, Hausdorff 1e200, W1 = W2 = Fréchet = 1e200; energy
// sqrt(2·1e200 − ½ − ½) = sqrt(2e200) to double precision.
TEST(OddCloudsTest, CoordinatesNearOneTenToThe200) {
  const Cloud a = points({{0, 0}, {1, 0}}), b = points({{1e200, 0}, {1e200, 1}});
  expectValue("chamfer", a, b, 2e200);
  expectValue("hausdorff", a, b, 1e200);
  expectValue("w1", a, b, 1e200);
  expectValue("w2", a, b, 1e200);
  expectValue("energy", a, b, std::sqrt(2e200));
  expectValue("frechet", a, b, 1e200);
  // The squared Chamfer (4e400) is beyond double's range: a non-ok status saying so.
  const Result sq = run("chamfer", a, b, {"chamfer.squared=true"});
  EXPECT_EQ(sq.status, Status::InvalidInput);
  EXPECT_NE(sq.message.find("not a finite number"), std::string::npos) << sq.message;
}

// [D] Coordinates near 1e±150: A = (1e150, 0), (0, 1e150), B = (−1e150, 0). W1 moves half
// the mass 2e150 and half sqrt(2)·1e150; W2 = sqrt(½(2e150)² + ½·2e300); Hausdorff 2e150.
TEST(OddCloudsTest, CoordinatesNearOneTenToThePlusMinus150) {
  for (const double s : {1e150, 1e-150}) {
    const Cloud a = points({{s, 0}, {0, s}}), b = points({{-s, 0}});
    expectValue("w1", a, b, s * (1.0 + std::sqrt(2.0) / 2.0));
    expectValue("w2", a, b, s * std::sqrt(3.0));
    expectValue("hausdorff", a, b, 2 * s);
    expectValue("chamfer", a, b, s * (1.0 + std::sqrt(2.0) / 2.0) + s * std::sqrt(2.0));
  }
}

// [D] Weights spanning 1e±300: only their ratios matter. A has masses ½, ½ at 0 and 1, B has
// ¼, ¾: W1 moves ¼ of the mass a distance 1.
TEST(OddCloudsTest, WeightsSpanningTenToThePlusMinus300) {
  const Cloud a = points({{0, 0}, {1, 0}}, {1e300, 1e300}), b = points({{0, 0}, {1, 0}}, {1e-300, 3e-300});
  expectValue("w1", a, b, 0.25);
  expectValue("w2", a, b, 0.5);
  expectValue("tv", a, b, 0.25, 1e-9);  // [D] ½(|½−¼| + |½−¾|), each point in its own bin
}

// [D] 10^5 copies of one point against one other point 5 away: every transport distance is
// 5. (Energy and the kernel sums are O(n²) in the copies and are left out here.) B lies on
// the x axis so that the automatic histogram bin (0.88 of the gap here) separates the two.
TEST(OddCloudsTest, HundredThousandDuplicatesOfOnePoint) {
  const Cloud a("A", Eigen::MatrixX2d::Zero(100000, 2)), b = points({{5, 0}});
  for (const char* id : {"w1", "w2", "hausdorff", "frechet"}) expectValue(id, a, b, 5.0);
  expectValue("chamfer", a, b, 10.0);
  expectValue("sliced", a, b, 5.0 / std::sqrt(2.0));
  const Result js = run("js", a, b);
  ASSERT_EQ(js.status, Status::Ok) << js.message;
  EXPECT_NEAR(js.value, std::log(2.0), 1e-12);  // [D] disjoint bins: JS = ln 2
}

// Found with assertions on (any Debug build): the rigid-congruence check behind the Sinkhorn
// divergence's reused self terms compared weight vectors of different sizes (Eigen asserts;
// in Release it read past the shorter one). Clouds of different sizes are never congruent.
TEST(OddCloudsTest, CloudsOfDifferentSizesAreNeverRigidlyCongruent) {
  const Cloud a = points({{0, 0}, {1, 0}}), b = points({{0, 0}, {1, 0}, {2, 0}});
  EXPECT_FALSE(rigidlyCongruent(a, b, 1e-12));
  EXPECT_FALSE(rigidlyCongruent(b, a, 1e-12));
  const Result r = run("sinkhorn", a, b);
  EXPECT_TRUE(r.usable()) << r.message;
}

// Found by fuzz_measures (regressions/measures/kl_rounding_negative.bin): the histogram KL
// came out as -1.1e-16 with status ok for bins whose masses differ only in the last bit.
// [P] Gibbs' inequality: KL >= 0; a sum a rounding below 0 is reported as 0.
TEST(OddCloudsTest, HistogramKlIsNeverNegativeFromRounding) {
  Eigen::VectorXd p(2), q(2);
  p << 0.3, 0.7;
  q << 0.3, std::nextafter(0.7, 1.0);
  EXPECT_EQ(discreteKl(p, q).value, 0.0);
}

}  // namespace
}  // namespace barrow
