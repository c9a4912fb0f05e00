// Energy distance: the V-statistic against a NumPy brute force, the distance-induced kernel
// identity, scipy.stats.energy_distance in 1-D, and the gradient.
#include <gtest/gtest.h>

#include <cmath>
#include <random>
#include <sstream>

#include "measures/evaluate.h"
#include "measures/registry.h"
#include "support/test_support.h"

namespace barrow {
namespace {

const Measure& energy() { return *MeasureRegistry::instance().find("energy"); }

Result runEnergy(const Cloud& a, const Cloud& b) { return evaluateMeasure(energy(), a, b, EvalRequest{}); }

Cloud scatterCloud(const char* name, int n, unsigned seed, double shift) {
  std::mt19937 rng(seed);
  std::uniform_real_distribution<double> u(-1.0, 1.0), w(0.1, 3.0);
  Eigen::MatrixX2d p(n, 2);
  Eigen::VectorXd wt(n);
  for (int i = 0; i < n; ++i) {
    p.row(i) << shift + u(rng), 0.5 * u(rng) + 0.3 * u(rng) * u(rng);
    wt(i) = w(rng);
  }
  return Cloud(name, p, wt);
}

// Points on a line through `origin` at angle `phi`, at the given 1-D positions.
Cloud onLine(const char* name, const std::vector<double>& t, const std::vector<double>& w, double phi,
             Eigen::Vector2d origin) {
  Eigen::MatrixX2d p(Eigen::Index(t.size()), 2);
  for (std::size_t i = 0; i < t.size(); ++i)
    p.row(Eigen::Index(i)) << origin.x() + t[i] * std::cos(phi), origin.y() + t[i] * std::sin(phi);
  return Cloud(name, p, Eigen::Map<const Eigen::VectorXd>(w.data(), Eigen::Index(w.size())));
}

// Reference: NumPy brute force of the definition (scipy.spatial.distance.cdist, weights by
// outer products), E = 2 a'D_xy b - a'D_xx a - b'D_yy b; Székely & Rizzo 2013 (mem).
TEST(EnergyTest, MatchesNumpyBruteForceVStatistic) {
  if (!test::pythonHas("numpy, scipy")) GTEST_SKIP() << "python3-scipy missing";
  Cloud a = scatterCloud("A", 83, 1, 0.0), b = scatterCloud("B", 57, 2, 0.4);
  b.weights(0) = 0.0;
  const std::string py = "import numpy as np\nfrom scipy.spatial.distance import cdist\nX = " + test::pyPoints(a) +
                         "\nY = " + test::pyPoints(b) + "\na = " + test::pyWeights(a) + "\nb = " + test::pyWeights(b) +
                         "\nE = 2 * a @ cdist(X, Y) @ b - a @ cdist(X, X) @ a - b @ cdist(Y, Y) @ b\n"
                         "print(repr(float(E)))\n";
  const double e = std::stod(test::runPython(py));
  const Result r = runEnergy(a, b);
  ASSERT_EQ(r.status, Status::Ok) << r.message;
  EXPECT_NEAR(r.details["energy"].get<double>(), e, 1e-12);
  EXPECT_NEAR(r.value, std::sqrt(e), 1e-11);
}

// [P] Sejdinovic, Sriperumbudur, Gretton, Fukumizu 2013, Ann. Stat. 41: with the
// distance-induced kernel k(x,y) = (|x-z0| + |y-z0| - |x-y|)/2, E = 2 MMD_k^2 for any z0
// (REFERENCES 7d). MMD_k^2 summed here pair by pair, independently of the engine.
TEST(EnergyTest, EqualsTwiceMmdWithDistanceInducedKernel) {
  const Cloud a = scatterCloud("A", 40, 3, 0.0), b = scatterCloud("B", 35, 4, 0.8);
  const Eigen::VectorXd wa = a.normalizedWeights(), wb = b.normalizedWeights();
  const double e = runEnergy(a, b).details["energy"].get<double>();
  for (const Eigen::Vector2d& z0 : {Eigen::Vector2d(0, 0), Eigen::Vector2d(10, -3)}) {
    auto k = [&](const Eigen::Vector2d& x, const Eigen::Vector2d& y) {
      return 0.5 * ((x - z0).norm() + (y - z0).norm() - (x - y).norm());
    };
    auto meanK = [&](const Cloud& p, const Eigen::VectorXd& wp, const Cloud& q, const Eigen::VectorXd& wq) {
      double s = 0;
      for (Eigen::Index i = 0; i < p.size(); ++i)
        for (Eigen::Index j = 0; j < q.size(); ++j) s += wp(i) * wq(j) * k(p.point(i), q.point(j));
      return s;
    };
    const double mmd2 = meanK(a, wa, a, wa) + meanK(b, wb, b, wb) - 2 * meanK(a, wa, b, wb);
    EXPECT_NEAR(e, 2 * mmd2, 1e-12) << z0.transpose();
  }
}

// Reference: scipy.stats.energy_distance docs examples (REFERENCES 7c), which return sqrt(E):
// ([0],[2]) -> 2; ([0,8],[0,8],[3,1],[2,2]) -> 1; ([0.7,7.4,2.4,6.8],[1.4,8],[2.1,4.2,7.4,8],
// [7.6,8.8]) -> 0.8800334098. Placed on an arbitrary line in the plane (the value is invariant).
TEST(EnergyTest, OnALineEqualsScipyEnergyDistanceExamples) {
  const double phi = 0.7;
  const Eigen::Vector2d o(3, -1);
  EXPECT_NEAR(runEnergy(onLine("A", {0}, {1}, phi, o), onLine("B", {2}, {1}, phi, o)).value, 2.0, 1e-12);
  EXPECT_NEAR(runEnergy(onLine("A", {0, 8}, {3, 1}, phi, o), onLine("B", {0, 8}, {2, 2}, phi, o)).value, 1.0, 1e-12);
  EXPECT_NEAR(runEnergy(onLine("A", {0.7, 7.4, 2.4, 6.8}, {2.1, 4.2, 7.4, 8}, phi, o),
                        onLine("B", {1.4, 8}, {7.6, 8.8}, phi, o))
                  .value,
              0.8800334098, 1e-10);
}

// Reference: scipy.stats.energy_distance(u, v, u_weights, v_weights) at run time on random
// weighted 1-D samples (it returns sqrt(E) = sqrt(2 int (F - G)^2)).
TEST(EnergyTest, OnALineMatchesScipyEnergyDistanceOnRandomData) {
  if (!test::pythonHas("scipy")) GTEST_SKIP() << "python3-scipy missing";
  std::mt19937 rng(5);
  std::normal_distribution<double> g(0, 1);
  std::uniform_real_distribution<double> w(0.1, 2);
  std::vector<double> u(31), uw(31), v(19), vw(19);
  for (std::size_t i = 0; i < u.size(); ++i) u[i] = g(rng), uw[i] = w(rng);
  for (std::size_t i = 0; i < v.size(); ++i) v[i] = 0.5 + 2 * g(rng), vw[i] = w(rng);
  auto list = [](const std::vector<double>& x) {
    std::ostringstream s;
    s.precision(17);
    for (double t : x) s << t << ",";
    return "[" + s.str() + "]";
  };
  const double ref = std::stod(test::runPython("from scipy.stats import energy_distance\nprint(repr(float(energy_distance(" +
                                               list(u) + "," + list(v) + "," + list(uw) + "," + list(vw) + "))))\n"));
  const Result r = runEnergy(onLine("A", u, uw, -1.1, {0.5, 2}), onLine("B", v, vw, -1.1, {0.5, 2}));
  EXPECT_NEAR(r.value, ref, 1e-12 * ref);
}

// REFERENCES 7c: for two Diracs, E = 2|x - y|.
TEST(EnergyTest, TwoDiracsGiveTwiceTheDistance) {
  const Cloud a("A", (Eigen::MatrixX2d(1, 2) << 1, 2).finished()), b("B", (Eigen::MatrixX2d(1, 2) << 4, 6).finished());
  EXPECT_NEAR(runEnergy(a, b).details["energy"].get<double>(), 10.0, 1e-12);
  EXPECT_NEAR(runEnergy(a, a).value, 0.0, 0.0);
}

// [D] chain rule on the definition, against central finite differences of the value.
TEST(EnergyTest, GradientMatchesFiniteDifferences) {
  Cloud a = scatterCloud("A", 11, 6, 0.0);
  const Cloud b = scatterCloud("B", 8, 7, 0.5);
  a.weights(2) = 0.0;
  const auto g = test::analyticGradientA(energy(), a, b, ParamSet{});
  ASSERT_TRUE(g.has_value());
  EXPECT_LT((*g - test::finiteDifferenceGradientA(energy(), a, b, ParamSet{}, 1e-6)).cwiseAbs().maxCoeff(), 1e-7);
  EXPECT_EQ(g->row(2).norm(), 0.0);
}

// REFERENCES 12 [D]: along a shift of A by theta e1 the energy distance has slope <= 2; checked as
// |Delta value| <= 2 |Delta theta| on a 41-point sweep.
TEST(EnergyTest, ShiftSweepRespectsSlopeBound) {
  const Cloud a = scatterCloud("A", 150, 8, 0.0), b = scatterCloud("B", 120, 9, 0.3);
  double prev = NAN, worst = 0;
  for (int k = 0; k <= 40; ++k) {
    Cloud moved = a;
    moved.points.col(0).array() += -2.0 + 0.1 * k;
    const double v = runEnergy(moved, b).value;
    if (k > 0) worst = std::max(worst, std::abs(v - prev) / 0.1);
    prev = v;
  }
  EXPECT_LE(worst, 2.0);
  EXPECT_GT(worst, 0.1);
}

}  // namespace
}  // namespace barrow
