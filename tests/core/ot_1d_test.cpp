// Exact 1-D optimal transport by the quantile coupling (REFERENCES rows 3a, 3b).
#include <gtest/gtest.h>

#include <cmath>
#include <random>
#include <sstream>

#include "support/test_support.h"
#include "transport/ot_1d.h"

namespace barrow {
namespace {

Eigen::VectorXd vec(std::initializer_list<double> v) {
  Eigen::VectorXd out(v.size());
  int k = 0;
  for (double x : v) out(k++) = x;
  return out;
}

Eigen::VectorXd uniform(int n) { return Eigen::VectorXd::Constant(n, 1.0); }

std::string pyVec(const Eigen::VectorXd& v) {
  std::ostringstream s;
  s.precision(17);
  s << "np.array([";
  for (Eigen::Index i = 0; i < v.size(); ++i) s << v(i) << ",";
  s << "])";
  return s.str();
}

// REFERENCES 3a: scipy.stats.wasserstein_distance documentation examples (SciPy 1.10).
TEST(Ot1dTest, MatchesTheScipyDocumentationExamples) {
  EXPECT_NEAR(wasserstein1d(vec({0, 1, 3}), uniform(3), vec({5, 6, 8}), uniform(3), 1), 5.0, 1e-15);
  EXPECT_NEAR(wasserstein1d(vec({0, 1}), vec({3, 1}), vec({0, 1}), vec({2, 2}), 1), 0.25, 1e-15);
  EXPECT_NEAR(wasserstein1d(vec({3.4, 3.9, 7.5, 7.8}), vec({1.4, 0.9, 3.1, 7.2}), vec({4.5, 1.4}), vec({3.2, 3.5}), 1),
              4.078133143804786, 1e-14);
}

// REFERENCES 3b: W2({0,1},{1/2}) = 1/2 and W2({0,1},{0,3}) = √2 [D] from the quantile formula
// (Villani 2003, Thm 2.18).
TEST(Ot1dTest, SmallQuantileCases) {
  EXPECT_NEAR(wasserstein1d(vec({0, 1}), uniform(2), vec({0.5}), uniform(1), 2), 0.5, 1e-15);
  EXPECT_NEAR(wasserstein1d(vec({1, 0}), uniform(2), vec({3, 0}), uniform(2), 2), std::sqrt(2.0), 1e-15);
}

// REFERENCES 3b: U[0,1] vs U[0,2]: W1 = 1/2, W2 = 1/√3. With N midpoint quantiles the discrete
// values are exactly W1 = 1/2 and W2² = 1/3 − 1/(12N²) (midpoint rule for ∫ t² dt) [D].
TEST(Ot1dTest, UniformScalingByMidpointQuantiles) {
  const int n = 1000;
  Eigen::VectorXd u(n), v(n);
  for (int k = 0; k < n; ++k) {
    u(k) = (k + 0.5) / n;
    v(n - 1 - k) = 2.0 * (k + 0.5) / n;  // given in reverse: the solver sorts
  }
  EXPECT_NEAR(wasserstein1d(u, uniform(n), v, uniform(n), 1), 0.5, 1e-13);
  EXPECT_NEAR(std::pow(wasserstein1d(u, uniform(n), v, uniform(n), 2), 2), 1.0 / 3.0 - 1.0 / (12.0 * n * n), 1e-13);
}

// REFERENCES 3b: N(0,1) vs N(1,4): W2² = Δm² + Δs² = 2 and W1 = 1.16663094 (folded-normal mean),
// [P] Villani 2003 Thm 2.18 / Peyré & Cuturi 2019 Rem. 2.30; quantiles from scipy.stats.norm.ppf.
TEST(Ot1dTest, GaussianQuantilesApproachTheClosedForms) {
  if (!test::pythonHas("scipy, numpy")) GTEST_SKIP() << "needs python3-scipy";
  const std::string out = test::runPython(
      "import numpy as np\nfrom scipy.stats import norm\nt = (np.arange(20000) + 0.5) / 20000\n"
      "for q in norm.ppf(t): print(repr(q))\n");
  std::istringstream in(out);
  Eigen::VectorXd z(20000);
  for (int k = 0; k < 20000; ++k) in >> z(k);
  const Eigen::VectorXd a = z, b = (1.0 + 2.0 * z.array()).matrix();
  EXPECT_NEAR(wasserstein1d(a, uniform(20000), b, uniform(20000), 1), 1.16663094, 2e-4);
  EXPECT_NEAR(std::pow(wasserstein1d(a, uniform(20000), b, uniform(20000), 2), 2), 2.0, 2e-3);
}

// Random weighted sets: W1 against scipy.stats.wasserstein_distance, W2 against a NumPy
// quantile integral written from the definition (REFERENCES 3b).
TEST(Ot1dTest, RandomWeightedSetsAgreeWithScipyAndNumpy) {
  if (!test::pythonHas("scipy, numpy")) GTEST_SKIP() << "needs python3-scipy";
  std::mt19937 rng(3);
  std::normal_distribution<double> g(0.0, 1.0);
  std::uniform_real_distribution<double> w(0.0, 1.0);
  for (int trial = 0; trial < 4; ++trial) {
    const int n = 5 + 17 * trial, m = 3 + 11 * trial;
    Eigen::VectorXd x(n), a(n), y(m), b(m);
    for (int i = 0; i < n; ++i) x(i) = g(rng), a(i) = w(rng);
    for (int j = 0; j < m; ++j) y(j) = 0.5 + 2.0 * g(rng), b(j) = w(rng);
    a(0) = 0.0;  // a zero weight takes no part
    const std::string out = test::runPython(
        "import numpy as np\nfrom scipy.stats import wasserstein_distance\n"
        "u, v, uw, vw = " + pyVec(x) + ", " + pyVec(y) + ", " + pyVec(a) + ", " + pyVec(b) + "\n"
        "print(repr(wasserstein_distance(u, v, uw, vw)))\n"
        "iu, iv = np.argsort(u), np.argsort(v)\n"
        "cu, cv = np.cumsum(uw[iu]) / uw.sum(), np.cumsum(vw[iv]) / vw.sum()\n"
        "t = np.unique(np.concatenate([[0.0], cu, cv])); t = t[t <= 1.0]\n"
        "mid = 0.5 * (t[:-1] + t[1:])\n"
        "qu = u[iu][np.minimum(np.searchsorted(cu, mid), len(u) - 1)]\n"
        "qv = v[iv][np.minimum(np.searchsorted(cv, mid), len(v) - 1)]\n"
        "print(repr(np.sqrt(np.sum(np.diff(t) * (qu - qv) ** 2))))\n");
    std::istringstream in(out);
    double w1 = NAN, w2 = NAN;
    in >> w1 >> w2;
    EXPECT_NEAR(wasserstein1d(x, a, y, b, 1), w1, 1e-12) << "trial " << trial;
    EXPECT_NEAR(wasserstein1d(x, a, y, b, 2), w2, 1e-12) << "trial " << trial;
  }
}

// The coupling is a certificate: marginals a and b, monotone in both indices' values, at
// most n + m − 1 entries, and its cost is the returned value [D].
TEST(Ot1dTest, CouplingIsMonotoneWithTheRightMarginals) {
  std::mt19937 rng(4);
  std::uniform_real_distribution<double> u(-1.0, 1.0), w(0.1, 1.0);
  const int n = 40, m = 25;
  std::vector<double> x(n), a(n), y(m), b(m);
  for (int i = 0; i < n; ++i) x[i] = u(rng), a[i] = w(rng);
  for (int j = 0; j < m; ++j) y[j] = u(rng), b[j] = w(rng);
  std::vector<PlanEntry> plan;
  Ot1dSolver solver;
  const double cost = solver.solve(x.data(), a.data(), n, y.data(), b.data(), m, 2.0, &plan);
  EXPECT_LE(plan.size(), std::size_t(n + m - 1));
  std::vector<double> rows(n, 0.0), cols(m, 0.0);
  double sum = 0.0, total = 0.0;
  double sa = 0, sb = 0;
  for (double v : a) sa += v;
  for (double v : b) sb += v;
  for (std::size_t k = 0; k < plan.size(); ++k) {
    rows[plan[k].i] += plan[k].mass;
    cols[plan[k].j] += plan[k].mass;
    total += plan[k].mass;
    sum += plan[k].mass * (x[plan[k].i] - y[plan[k].j]) * (x[plan[k].i] - y[plan[k].j]);
    if (k > 0) {
      EXPECT_LE(x[plan[k - 1].i], x[plan[k].i]);
      EXPECT_LE(y[plan[k - 1].j], y[plan[k].j]);
    }
  }
  for (int i = 0; i < n; ++i) EXPECT_NEAR(rows[i], a[i] / sa, 1e-15);
  for (int j = 0; j < m; ++j) EXPECT_NEAR(cols[j], b[j] / sb, 1e-15);
  EXPECT_NEAR(total, 1.0, 1e-15);
  EXPECT_NEAR(cost, sum, 1e-15);
}

// [D] translation: W_p(μ, μ + t) = |t| for every p (REFERENCES 5b in one dimension).
TEST(Ot1dTest, TranslationCostsTheShift) {
  std::mt19937 rng(5);
  std::uniform_real_distribution<double> u(0.0, 1.0);
  Eigen::VectorXd x(50), a(50);
  for (int i = 0; i < 50; ++i) x(i) = u(rng), a(i) = u(rng);
  const Eigen::VectorXd y = (x.array() + 0.37).matrix();
  for (double p : {1.0, 2.0, 3.0}) EXPECT_NEAR(wasserstein1d(x, a, y, a, p), 0.37, 1e-14) << "p " << p;
}

}  // namespace
}  // namespace barrow
