// The exact solver on cases whose answer is known in closed form or published: SciPy's
// documented 1-D examples, quantile values, translations, the W2 mean split, a Brenier map,
// and a W1 problem with many optimal plans.
#include <gtest/gtest.h>

#include <cmath>
#include <algorithm>
#include <numeric>
#include <random>

#include "transport/exact_ot.h"

namespace barrow {
namespace {

// 1-D values s with weights w, placed on the line through (ox, oy) at angle `angle`.
Cloud onLine(std::vector<double> s, std::vector<double> w, double angle, double ox, double oy) {
  Eigen::MatrixX2d p(Eigen::Index(s.size()), 2);
  for (std::size_t i = 0; i < s.size(); ++i) p.row(Eigen::Index(i)) << ox + s[i] * std::cos(angle), oy + s[i] * std::sin(angle);
  if (w.empty()) return Cloud("", p);
  return Cloud("", p, Eigen::Map<Eigen::VectorXd>(w.data(), Eigen::Index(w.size())));
}

double solve(const Cloud& a, const Cloud& b, double p) {
  ExactOtOptions o;
  o.p = p;
  const auto r = solveExactOt(a, b, o);
  EXPECT_EQ(r.status, ExactOtStatus::Optimal) << r.message;
  return r.value;
}

Cloud weightedBlob(int n, std::uint64_t seed) {
  std::mt19937_64 rng(seed);
  std::normal_distribution<double> z(0.0, 1.0);
  std::uniform_real_distribution<double> w(0.2, 1.0);
  Eigen::MatrixX2d p(n, 2);
  Eigen::VectorXd wt(n);
  for (int i = 0; i < n; ++i) {
    p.row(i) << z(rng), 0.6 * z(rng) + 0.3 * p(i, 0);
    wt(i) = w(rng);
  }
  return Cloud("", p, wt);
}

// [P] SciPy docs examples of scipy.stats.wasserstein_distance (REFERENCES 3a; values
// reproduced by running SciPy 1.10), placed on tilted, offset lines in the plane.
TEST(NetworkSimplexClosedFormTest, ScipyDocumentedOneDimensionalExamples) {
  for (double angle : {0.0, 0.7, 2.9}) {
    EXPECT_NEAR(solve(onLine({0, 1, 3}, {}, angle, 1, -2), onLine({5, 6, 8}, {}, angle, 1, -2), 1), 5.0, 1e-13);
    EXPECT_NEAR(solve(onLine({0, 1}, {3, 1}, angle, -4, 0.5), onLine({0, 1}, {2, 2}, angle, -4, 0.5), 1), 0.25, 1e-14);
    EXPECT_NEAR(solve(onLine({3.4, 3.9, 7.5, 7.8}, {1.4, 0.9, 3.1, 7.2}, angle, 0, 3),
                      onLine({4.5, 1.4}, {3.2, 3.5}, angle, 0, 3), 1),
                4.078133143804786, 1e-12);
  }
}

// [P] Quantile formula W2² = ∫|F⁻¹ − G⁻¹|² (Villani 2003, Thm 2.18 (mem); REFERENCES 3b):
// W2({0,1},{1/2}) = 1/2 and W2({0,1},{0,3}) = √2.
TEST(NetworkSimplexClosedFormTest, QuantileValuesOfW2) {
  EXPECT_NEAR(solve(onLine({0, 1}, {}, 0.3, 2, 2), onLine({0.5}, {}, 0.3, 2, 2), 2), 0.5, 1e-14);
  EXPECT_NEAR(solve(onLine({0, 1}, {}, 1.1, 0, 0), onLine({0, 3}, {}, 1.1, 0, 0), 2), std::sqrt(2.0), 1e-14);
}

// [P] Arjovsky, Chintala & Bottou 2017, Sec. 2, Example 1 (parallel lines) with the same
// z-samples on both lines (REFERENCES 1b): W1 = W2 = |θ| exactly, θ = 1e-3 … 2.
TEST(NetworkSimplexClosedFormTest, ParallelLinesAreAtDistanceTheta) {
  std::mt19937_64 rng(3);
  std::uniform_real_distribution<double> u(0.0, 1.0);
  Eigen::MatrixX2d p(400, 2);
  for (int i = 0; i < 400; ++i) p.row(i) << 0.0, u(rng);
  const Cloud a("", p);
  for (double theta : {1e-3, 0.01, 0.13, 0.5, 2.0}) {
    Cloud b = a;
    b.points.col(0).array() += theta;
    EXPECT_NEAR(solve(a, b, 1), theta, 1e-12);
    EXPECT_NEAR(solve(a, b, 2), theta, 1e-12);
  }
}

// [D] Pure translation (REFERENCES 5b): W_p(μ, μ + t) = ‖t‖ for p = 1, 2, 3, down to
// ‖t‖ = 1e-4 — W_p >= W1 >= ‖mean difference‖ = ‖t‖ and the shift itself costs ‖t‖^p.
TEST(NetworkSimplexClosedFormTest, TranslationMovesEverythingByT) {
  const Cloud a = weightedBlob(120, 4);
  for (double len : {1e-4, 0.02, 1.0, 7.5}) {
    const Eigen::RowVector2d t = len * Eigen::RowVector2d(0.6, -0.8);
    Cloud b = a;
    b.points.rowwise() += t;
    for (double p : {1.0, 2.0, 3.0}) EXPECT_NEAR(solve(a, b, p), len, 1e-9 * len) << "p=" << p << " |t|=" << len;
  }
}

// [D] W2²(μ + t, ν) = ‖m_μ + t − m_ν‖² + W2²(μ̄, ν̄) with bars the centred measures
// (REFERENCES 5a; Peyré & Cuturi 2019, Rem. 2.19 (mem)): weighted 40 vs 30 points.
TEST(NetworkSimplexClosedFormTest, W2SplitsIntoMeansAndCentredParts) {
  const Cloud mu = weightedBlob(40, 5), nu = weightedBlob(30, 6);
  Cloud muBar = mu, nuBar = nu;
  muBar.points.rowwise() -= mu.mean().transpose();
  nuBar.points.rowwise() -= nu.mean().transpose();
  const double centred = std::pow(solve(muBar, nuBar, 2), 2);
  for (const Eigen::Vector2d& t : {Eigen::Vector2d(0, 0), Eigen::Vector2d(0.3, 0.1), Eigen::Vector2d(-2, 5),
                                  Eigen::Vector2d(1e-3, -1e-3)}) {
    Cloud shifted = mu;
    shifted.points.rowwise() += t.transpose();
    const double expected = (mu.mean() + t - nu.mean()).squaredNorm() + centred;
    EXPECT_NEAR(std::pow(solve(shifted, nu, 2), 2), expected, 1e-12 * expected);
  }
}

// [P] Brenier 1991; Knott & Smith 1984 (mem): the gradient of a convex function, here
// T(x) = Mx + c with M symmetric positive definite, is the unique optimal W2 map between X
// and T(X). With Y = T(X) shuffled, the plan must undo the shuffle exactly: n entries of
// mass 1/n (a permutation, Birkhoff), W2² = mean ‖x − Tx‖².
TEST(NetworkSimplexClosedFormTest, AffineBrenierMapIsRecoveredExactly) {
  const int n = 200;
  std::mt19937_64 rng(8);
  std::normal_distribution<double> z(0.0, 1.0);
  Eigen::MatrixX2d x(n, 2);
  for (int i = 0; i < n; ++i) x.row(i) << z(rng), z(rng);
  Eigen::Matrix2d m;
  m << 1.5, 0.4, 0.4, 0.7;
  const Eigen::RowVector2d c(1.0, -1.0);
  std::vector<int> shuffle(n);
  std::iota(shuffle.begin(), shuffle.end(), 0);
  std::shuffle(shuffle.begin(), shuffle.end(), rng);
  Eigen::MatrixX2d y(n, 2);
  double cost = 0;
  for (int i = 0; i < n; ++i) {
    const Eigen::RowVector2d tx = x.row(i) * m + c;  // m symmetric: (Mx)^T = x^T M
    y.row(shuffle[std::size_t(i)]) = tx;
    cost += (tx - x.row(i)).squaredNorm() / n;
  }
  ExactOtOptions o;
  o.p = 2;
  const auto r = solveExactOt(Cloud("", x), Cloud("", y), o);
  ASSERT_EQ(r.status, ExactOtStatus::Optimal);
  ASSERT_EQ(r.plan.size(), std::size_t(n));
  for (const auto& e : r.plan) {
    EXPECT_EQ(e.j, shuffle[std::size_t(e.i)]);
    EXPECT_NEAR(e.mass, 1.0 / n, 1e-15);
  }
  EXPECT_NEAR(r.cost, cost, 1e-12 * cost);
  EXPECT_EQ(r.planUnique, true);
}

// [D] REFERENCES pitfall: {0,1} → {1,2} on a line costs 1 under both plans (shift each by 1,
// or move 0 → 2 and keep 1): W1 = 1 and the plan is reported as not unique.
TEST(NetworkSimplexClosedFormTest, W1TieBetweenPlansIsFlagged) {
  const auto r = solveExactOt(onLine({0, 1}, {}, 0, 0, 0), onLine({1, 2}, {}, 0, 0, 0));
  ASSERT_EQ(r.status, ExactOtStatus::Optimal);
  EXPECT_NEAR(r.value, 1.0, 1e-15);
  EXPECT_EQ(r.planUnique, false);
}

}  // namespace
}  // namespace barrow
