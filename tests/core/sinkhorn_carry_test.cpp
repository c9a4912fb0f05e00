// carryPotentials: after a pure translation of either cloud the carried potentials are already
// the solution (the algebra is in sinkhorn_carry.h; checked here against a cold solve of the
// moved problem), other moves still converge to the cold value, and p = 1 is left alone.
#include <gtest/gtest.h>

#include <random>

#include "transport/sinkhorn_carry.h"
#include "transport/sinkhorn_solver.h"

namespace barrow {
namespace {

Eigen::MatrixX2d points(int n, unsigned seed, double dx) {
  std::mt19937 rng(seed);
  std::normal_distribution<double> g(0.0, 0.4);
  Eigen::MatrixX2d p(n, 2);
  for (int i = 0; i < n; ++i) p.row(i) << dx + g(rng), g(rng);
  return p;
}

Eigen::VectorXd weights(int n, unsigned seed) {
  std::mt19937 rng(seed);
  std::uniform_real_distribution<double> u(0.2, 1.0);
  Eigen::VectorXd w(n);
  for (int i = 0; i < n; ++i) w(i) = u(rng);
  return w / w.sum();
}

struct Case {
  Eigen::MatrixX2d x0 = points(80, 1, 0.0), y0 = points(70, 2, 0.8);
  Eigen::VectorXd a = weights(80, 3), b = weights(70, 4);
  SinkhornOptions o;
  SinkhornResult before;
  Case() {
    o.epsilon = 0.01;
    o.tolerance = 1e-9;
    before = solveSinkhorn(x0, a, y0, b, o);
  }
  // Solve (x, y) from the carried potentials; also the cold solve for comparison.
  std::pair<SinkhornResult, SinkhornResult> moveTo(const Eigen::MatrixX2d& x, const Eigen::MatrixX2d& y) const {
    Eigen::VectorXd f = before.f, g = before.g;
    carryPotentials(x0, y0, x, y, o.p, f, g);
    SinkhornStart start{&f, &g};
    return {solveSinkhorn(x, a, y, b, o, nullptr, &start), solveSinkhorn(x, a, y, b, o)};
  }
};

TEST(SinkhornCarryTest, TranslationOfEitherCloudIsCarriedExactly) {
  Case c;
  ASSERT_EQ(c.before.status, SinkhornStatus::Converged);
  const Eigen::MatrixX2d x = c.x0.rowwise() + Eigen::RowVector2d(0.3, -0.1);
  const Eigen::MatrixX2d y = c.y0.rowwise() + Eigen::RowVector2d(-0.05, 0.2);
  for (const auto& [nx, ny] : {std::pair{x, c.y0}, std::pair{c.x0, y}, std::pair{x, y}}) {
    const auto [warm, cold] = c.moveTo(nx, ny);
    ASSERT_EQ(warm.status, SinkhornStatus::Converged);
    EXPECT_LE(warm.iterations, 2);  // the start already meets the tolerance
    EXPECT_GT(cold.iterations, 10);
    EXPECT_NEAR(warm.value, cold.value, 1e-8 * std::abs(cold.value));
  }
}

TEST(SinkhornCarryTest, OtherMovesStillConvergeToTheColdValue) {
  Case c;
  Eigen::MatrixX2d x = c.x0;
  x.col(0) *= 1.1;  // stretch plus the mean shift it causes
  x.rowwise() += Eigen::RowVector2d(0.2, 0.0);
  const auto [warm, cold] = c.moveTo(x, c.y0);
  ASSERT_EQ(warm.status, SinkhornStatus::Converged);
  EXPECT_NEAR(warm.value, cold.value, 1e-8 * std::abs(cold.value));
}

TEST(SinkhornCarryTest, DistanceCostIsLeftAlone) {
  Case c;
  Eigen::VectorXd f = c.before.f, g = c.before.g;
  carryPotentials(c.x0, c.y0, c.x0.rowwise() + Eigen::RowVector2d(1.0, 1.0), c.y0, 1, f, g);
  EXPECT_EQ(f, c.before.f);
  EXPECT_EQ(g, c.before.g);
}

// Along a path of stretches (not a translation: no exact carry), extrapolating from the last
// two solves starts closer than the last solve alone; the value is that of a cold solve.
// (Common practice for continuation methods; the counts are checked, not assumed.)
TEST(SinkhornCarryTest, ExtrapolationAlongAPathSavesIterations) {
  Case c;
  const auto stretched = [&](double s) {
    Eigen::MatrixX2d x = c.x0;
    x.col(0) *= s;
    return x;
  };
  SinkhornResult r0 = solveSinkhorn(stretched(1.00), c.a, c.y0, c.b, c.o);
  SinkhornStart from0{&r0.f, &r0.g};
  SinkhornResult r1 = solveSinkhorn(stretched(1.01), c.a, c.y0, c.b, c.o, nullptr, &from0);  // as a sweep does
  const SolvedPotentials p0{stretched(1.00), c.y0, r0.f, r0.g}, p1{stretched(1.01), c.y0, r1.f, r1.g};
  const Eigen::MatrixX2d next = stretched(1.02);
  Eigen::VectorXd fe, ge, fl, gl;
  startFromPath(&p0, p1, next, c.y0, c.o.p, fe, ge);
  startFromPath(nullptr, p1, next, c.y0, c.o.p, fl, gl);
  SinkhornStart extrapolated{&fe, &ge}, last{&fl, &gl};
  const SinkhornResult re = solveSinkhorn(next, c.a, c.y0, c.b, c.o, nullptr, &extrapolated);
  const SinkhornResult rl = solveSinkhorn(next, c.a, c.y0, c.b, c.o, nullptr, &last);
  const SinkhornResult cold = solveSinkhorn(next, c.a, c.y0, c.b, c.o);
  ASSERT_EQ(re.status, SinkhornStatus::Converged);
  EXPECT_LT(re.iterations, rl.iterations);
  EXPECT_NEAR(re.value, cold.value, 1e-8 * std::abs(cold.value));
}

TEST(SinkhornCarryTest, NoExtrapolationWhenThePathTurnsBack) {
  Case c;
  const Eigen::MatrixX2d x1 = c.x0 * 1.05, back = c.x0 * 1.02;
  Eigen::VectorXd f = c.before.f, g = c.before.g;
  EXPECT_FALSE(extrapolatePotentials(c.x0, c.y0, c.before.f, c.before.g, x1, c.y0, c.before.f, c.before.g, back, c.y0, f, g));
  EXPECT_EQ(f, c.before.f);  // untouched
}

}  // namespace
}  // namespace barrow
