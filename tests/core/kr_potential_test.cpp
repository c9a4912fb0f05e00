// The Kantorovich–Rubinstein potential φ(z) = min_j (‖z − y_j‖ − v_j) built from the w1
// potentials: the duality identity, the Lipschitz bound, and the grid layout.
#include <gtest/gtest.h>

#include <cmath>
#include <random>

#include "transport/exact_ot.h"
#include "transport/kr_potential.h"

namespace barrow {
namespace {

Cloud blob(int n, std::uint64_t seed, double cx) {
  std::mt19937_64 rng(seed);
  std::normal_distribution<double> z(0.0, 0.6);
  std::uniform_real_distribution<double> w(0.0, 1.0);
  Eigen::MatrixX2d p(n, 2);
  Eigen::VectorXd wt(n);
  for (int i = 0; i < n; ++i) {
    p.row(i) << cx + z(rng), z(rng);
    wt(i) = i % 7 == 3 ? 0.0 : w(rng);  // some rows of zero weight
  }
  return Cloud("", p, wt);
}

// [P] Kantorovich & Rubinstein 1958; Villani 2003, Thm 1.14 (mem); REFERENCES 4c:
// Σ a_i φ(x_i) − Σ b_j φ(y_j) = W1, and φ is 1-Lipschitz.
TEST(KrPotentialTest, DualityIdentityGivesW1) {
  for (std::uint64_t seed : {1u, 2u, 3u}) {
    const Cloud a = blob(90, seed, 0.0), b = blob(70, seed + 10, 1.3);
    const auto r = solveExactOt(a, b);
    ASSERT_EQ(r.status, ExactOtStatus::Optimal) << r.message;
    const Eigen::VectorXd wa = a.normalizedWeights(), wb = b.normalizedWeights();
    double dual = 0;
    for (Eigen::Index i = 0; i < a.size(); ++i) dual += wa(i) * krPotential(b, r.v, a.point(i));
    for (Eigen::Index j = 0; j < b.size(); ++j) dual -= wb(j) * krPotential(b, r.v, b.point(j));
    EXPECT_NEAR(dual, r.value, 1e-12 * r.value);
  }
}

TEST(KrPotentialTest, IsOneLipschitzEverywhere) {
  const Cloud a = blob(60, 4, 0.0), b = blob(50, 5, 2.0);
  const auto r = solveExactOt(a, b);
  std::mt19937_64 rng(6);
  std::uniform_real_distribution<double> u(-4.0, 6.0), s(-1e-3, 1e-3);
  for (int t = 0; t < 2000; ++t) {
    const Eigen::Vector2d z(u(rng), u(rng));
    const Eigen::Vector2d w = t % 2 ? Eigen::Vector2d(u(rng), u(rng)) : Eigen::Vector2d(z + Eigen::Vector2d(s(rng), s(rng)));
    EXPECT_LE(std::abs(krPotential(b, r.v, z) - krPotential(b, r.v, w)), (z - w).norm() * (1 + 1e-12) + 1e-15);
  }
}

TEST(KrPotentialTest, GridRowsAreYAndColumnsAreX) {
  const Cloud b = blob(20, 7, 0.0);
  const Eigen::VectorXd v = Eigen::VectorXd::LinSpaced(20, -0.5, 0.5);
  const Eigen::MatrixXd g = krPotentialGrid(b, v, -1.0, 2.0, 0.25, -0.5, 7, 4);
  ASSERT_EQ(g.rows(), 4);
  ASSERT_EQ(g.cols(), 7);
  for (int r = 0; r < 4; ++r)
    for (int c = 0; c < 7; ++c)
      EXPECT_DOUBLE_EQ(g(r, c), krPotential(b, v, Eigen::Vector2d(-1.0 + 0.25 * c, 2.0 - 0.5 * r)));
  // [D] One site: φ(z) = ‖z − y‖ − v.
  const Cloud one("", Eigen::MatrixX2d::Constant(1, 2, 1.0));
  EXPECT_DOUBLE_EQ(krPotential(one, Eigen::VectorXd::Constant(1, 0.5), Eigen::Vector2d(4.0, 5.0)), 4.5);
}

TEST(KrPotentialTest, MismatchedInputGivesNanOrEmpty) {
  const Cloud b = blob(5, 8, 0.0);
  EXPECT_TRUE(std::isnan(krPotential(b, Eigen::VectorXd::Zero(4), Eigen::Vector2d::Zero())));
  EXPECT_EQ(krPotentialGrid(b, Eigen::VectorXd::Zero(4), 0, 0, 1, 1, 3, 3).size(), 0);
  EXPECT_EQ(krPotentialGrid(b, Eigen::VectorXd::Zero(5), 0, 0, 1, 1, 0, 3).size(), 0);
}

}  // namespace
}  // namespace barrow
