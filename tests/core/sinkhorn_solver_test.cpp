// Log-domain Sinkhorn solver: certificates (marginals, primal = dual), stability at small ε,
// honest non-convergence, warm starts, cancellation and bad input. Values against outside
// references live in sinkhorn_reference_test.cpp.
#include <gtest/gtest.h>

#include <atomic>
#include <cmath>
#include <random>

#include "transport/sinkhorn_plan.h"
#include "transport/sinkhorn_solver.h"

namespace barrow {
namespace {

struct Pair {
  Eigen::MatrixX2d x, y;
  Eigen::VectorXd a, b;
};

Pair randomPair(int n, int m, unsigned seed) {
  std::mt19937 rng(seed);
  std::uniform_real_distribution<double> u(0.0, 1.0), w(0.2, 1.0);
  Pair p{Eigen::MatrixX2d(n, 2), Eigen::MatrixX2d(m, 2), Eigen::VectorXd(n), Eigen::VectorXd(m)};
  for (int i = 0; i < n; ++i) {
    p.x.row(i) << u(rng), u(rng);
    p.a(i) = w(rng);
  }
  for (int j = 0; j < m; ++j) {
    p.y.row(j) << 0.3 + u(rng), u(rng);
    p.b(j) = w(rng);
  }
  p.a /= p.a.sum();
  p.b /= p.b.sum();
  return p;
}

Eigen::MatrixXd costMatrix(const Eigen::MatrixX2d& x, const Eigen::MatrixX2d& y, int p) {
  Eigen::MatrixXd c(x.rows(), y.rows());
  for (int i = 0; i < x.rows(); ++i)
    for (int j = 0; j < y.rows(); ++j) {
      const double d = (x.row(i) - y.row(j)).norm();
      c(i, j) = p == 2 ? d * d : d;
    }
  return c;
}

// Dense plan from the potentials, P_ij = a_i b_j exp((f_i + g_j − C_ij)/ε).
Eigen::MatrixXd densePlan(const Pair& q, const SinkhornResult& r, double eps, int p) {
  const Eigen::MatrixXd c = costMatrix(q.x, q.y, p);
  Eigen::MatrixXd plan(c.rows(), c.cols());
  for (int i = 0; i < c.rows(); ++i)
    for (int j = 0; j < c.cols(); ++j) plan(i, j) = q.a(i) * q.b(j) * std::exp((r.f(i) + r.g(j) - c(i, j)) / eps);
  return plan;
}

// Primal objective ⟨P, C⟩ + ε KL(P ‖ a⊗b) of a dense plan (convention (i)).
double primalObjective(const Eigen::MatrixXd& plan, const Eigen::MatrixXd& c, const Eigen::VectorXd& a,
                       const Eigen::VectorXd& b, double eps) {
  double primal = 0.0;
  for (int i = 0; i < plan.rows(); ++i)
    for (int j = 0; j < plan.cols(); ++j)
      if (plan(i, j) > 0) primal += plan(i, j) * (c(i, j) + eps * std::log(plan(i, j) / (a(i) * b(j))));
  return primal;
}

class SinkhornSolverTest : public ::testing::TestWithParam<int> {};

// [P] Peyré & Cuturi 2019, Prop. 4.4 / Remark 4.22 (mem): at the optimum the plan has
// marginals a, b, and the primal ⟨P,C⟩ + ε KL(P‖a⊗b) equals the dual ⟨a,f⟩ + ⟨b,g⟩.
TEST_P(SinkhornSolverTest, PlanHasTheMarginalsAndPrimalEqualsDual) {
  const int p = GetParam();
  const Pair q = randomPair(40, 31, 11);
  SinkhornOptions o;
  o.p = p;
  o.epsilon = p == 2 ? 0.01 : 0.03;
  o.tolerance = 1e-12;
  const SinkhornResult r = solveSinkhorn(q.x, q.a, q.y, q.b, o);
  ASSERT_EQ(r.status, SinkhornStatus::Converged) << r.message;
  const Eigen::MatrixXd plan = densePlan(q, r, o.epsilon, p);
  EXPECT_LT((plan.rowwise().sum() - q.a).lpNorm<1>(), 1e-12);
  EXPECT_LT((plan.colwise().sum().transpose() - q.b).lpNorm<1>(), 1e-12);
  EXPECT_NEAR(r.value, primalObjective(plan, costMatrix(q.x, q.y, p), q.a, q.b, o.epsilon), 1e-11);
  EXPECT_LE(r.marginalError, o.tolerance);
}

// Same certificate for the symmetric problem OT_ε(a, a): the plan from (f, f) has both
// marginals a and its primal objective equals the reported value. (Plain alternating
// Sinkhorn converges only like 1/k on this problem, checked with NumPy: marginal error 2e-6
// after 1e4 iterations; hence the averaged update of Feydy et al. 2019.)
TEST_P(SinkhornSolverTest, SymmetricSolvePassesTheSameCertificate) {
  const int p = GetParam();
  const Pair q = randomPair(35, 35, 12);
  SinkhornOptions o;
  o.p = p;
  o.epsilon = 0.02;
  o.tolerance = 1e-13;
  SinkhornResult sym = solveSinkhornSymmetric(q.x, q.a, o);
  ASSERT_EQ(sym.status, SinkhornStatus::Converged) << sym.message;
  EXPECT_LT(sym.iterations, 200);
  sym.g = sym.f;
  const Pair self{q.x, q.x, q.a, q.a};
  const Eigen::MatrixXd plan = densePlan(self, sym, o.epsilon, p);
  EXPECT_LT((plan.rowwise().sum() - q.a).lpNorm<1>(), 1e-12);
  EXPECT_NEAR(sym.value, primalObjective(plan, costMatrix(q.x, q.x, p), q.a, q.a, o.epsilon), 1e-12);
}

TEST_P(SinkhornSolverTest, PlanListAndGradientAgreeWithTheDensePlan) {
  const int p = GetParam();
  const Pair q = randomPair(20, 17, 13);
  SinkhornOptions o;
  o.p = p;
  o.epsilon = 0.05;
  o.tolerance = 1e-12;
  const SinkhornResult r = solveSinkhorn(q.x, q.a, q.y, q.b, o);
  const Eigen::MatrixXd plan = densePlan(q, r, o.epsilon, p);
  const EntropicPlan list = entropicPlan(q.x, q.a, q.y, q.b, r.f, r.g, o.epsilon, p, 1000000, 0.0);
  ASSERT_EQ(list.entries.size(), std::size_t(20 * 17));
  EXPECT_FALSE(list.truncated);
  for (const PlanEntry& e : list.entries) EXPECT_NEAR(e.mass, plan(e.i, e.j), 1e-15);
  EXPECT_NEAR(list.keptMass, 1.0, 1e-12);
  const EntropicPlan capped = entropicPlan(q.x, q.a, q.y, q.b, r.f, r.g, o.epsilon, p, 60, 0.0);
  EXPECT_EQ(capped.entries.size(), std::size_t(20 * 3));  // 3 per row
  EXPECT_TRUE(capped.truncated);
  EXPECT_LT(capped.keptMass, 1.0);

  const Eigen::MatrixX2d grad = entropicGradient(q.x, q.a, q.y, q.b, r.f, r.g, o.epsilon, p);
  for (int i = 0; i < 20; ++i) {
    Eigen::RowVector2d want = Eigen::RowVector2d::Zero();
    for (int j = 0; j < 17; ++j) {
      const Eigen::RowVector2d d = q.x.row(i) - q.y.row(j);
      want += plan(i, j) * (p == 2 ? Eigen::RowVector2d(2.0 * d) : Eigen::RowVector2d(d / d.norm()));
    }
    EXPECT_NEAR(grad(i, 0), want(0), 1e-13);
    EXPECT_NEAR(grad(i, 1), want(1), 1e-13);
  }
}

INSTANTIATE_TEST_SUITE_P(CostPowers, SinkhornSolverTest, ::testing::Values(1, 2));

// [P] REFERENCES "Sinkhorn": small ε needs the log domain; a kernel-domain solver underflows
// (exp(−C/ε) = 0 for C/ε > 745) and returns NaN. Here ε/D² ≈ 1e-5.
TEST(SinkhornSolverTest, StaysFiniteAtVerySmallEpsilon) {
  const Pair q = randomPair(60, 50, 14);
  SinkhornOptions o;
  o.epsilon = 2e-5;
  o.maxIterations = 3000;  // not enough to converge this far down: the status must say so
  const SinkhornResult r = solveSinkhorn(q.x, q.a, q.y, q.b, o);
  EXPECT_TRUE(r.usable()) << r.message;
  EXPECT_TRUE(std::isfinite(r.value));
  EXPECT_TRUE(r.f.allFinite());
  EXPECT_TRUE(r.g.allFinite());
  EXPECT_GT(r.stages, 10);  // annealed from the extent² down
}

TEST(SinkhornSolverTest, ReportsNonConvergenceWithTheMarginalError) {
  const Pair q = randomPair(30, 30, 15);
  SinkhornOptions o;
  o.epsilon = 1e-4;
  o.maxIterations = 5;
  const SinkhornResult r = solveSinkhorn(q.x, q.a, q.y, q.b, o);
  EXPECT_EQ(r.status, SinkhornStatus::MaxIterations);
  EXPECT_EQ(r.iterations, 5);
  EXPECT_GT(r.marginalError, o.tolerance);
  EXPECT_NE(r.message.find("marginal error"), std::string::npos) << r.message;
  EXPECT_TRUE(r.usable());
  const SinkhornResult s = solveSinkhornSymmetric(q.x, q.a, o);
  EXPECT_EQ(s.status, SinkhornStatus::MaxIterations);
  EXPECT_NE(s.message.find("marginal error"), std::string::npos) << s.message;
}

TEST(SinkhornSolverTest, WarmStartFromNearbyPotentialsSavesIterations) {
  Pair q = randomPair(50, 45, 16);
  SinkhornOptions o;
  o.epsilon = 0.005;
  o.tolerance = 1e-10;
  const SinkhornResult cold = solveSinkhorn(q.x, q.a, q.y, q.b, o);
  q.x.col(0).array() += 0.01;  // a sweep step
  const SinkhornResult fresh = solveSinkhorn(q.x, q.a, q.y, q.b, o);
  SinkhornStart start{&cold.f, &cold.g};
  const SinkhornResult warm = solveSinkhorn(q.x, q.a, q.y, q.b, o, nullptr, &start);
  ASSERT_EQ(warm.status, SinkhornStatus::Converged);
  EXPECT_TRUE(warm.warmStarted);
  EXPECT_EQ(warm.stages, 1);
  EXPECT_LT(warm.iterations, fresh.iterations);
  EXPECT_NEAR(warm.value, fresh.value, 1e-9);
  // Potentials of the wrong size are ignored, not trusted.
  const Eigen::VectorXd shortF = cold.f.head(10);
  SinkhornStart bad{&shortF, &cold.g};
  EXPECT_FALSE(solveSinkhorn(q.x, q.a, q.y, q.b, o, nullptr, &bad).warmStarted);
}

TEST(SinkhornSolverTest, StopsWhenCancelled) {
  const Pair q = randomPair(30, 30, 17);
  std::atomic<bool> cancel{true};
  RunControl c;
  c.cancel = &cancel;
  SinkhornOptions o;
  const SinkhornResult r = solveSinkhorn(q.x, q.a, q.y, q.b, o, &c);
  EXPECT_EQ(r.status, SinkhornStatus::Cancelled);
  EXPECT_FALSE(r.usable());
  int calls = 0;
  RunControl progress;
  progress.onProgress = [&](double f) {
    EXPECT_GE(f, 0.0);
    EXPECT_LE(f, 1.0);
    return ++calls < 3;
  };
  EXPECT_EQ(solveSinkhornSymmetric(q.x, q.a, o, &progress).status, SinkhornStatus::Cancelled);
  EXPECT_EQ(calls, 3);
}

TEST(SinkhornSolverTest, RejectsBadInputWithAReason) {
  const Pair q = randomPair(5, 4, 18);
  SinkhornOptions o;
  auto message = [&](const Eigen::MatrixX2d& x, const Eigen::VectorXd& a, const SinkhornOptions& opt) {
    const SinkhornResult r = solveSinkhorn(x, a, q.y, q.b, opt);
    EXPECT_EQ(r.status, SinkhornStatus::InvalidInput);
    return r.message;
  };
  EXPECT_NE(message(Eigen::MatrixX2d(0, 2), Eigen::VectorXd(0), o).find("no points"), std::string::npos);
  Eigen::MatrixX2d nanX = q.x;
  nanX(2, 1) = NAN;
  EXPECT_NE(message(nanX, q.a, o).find("non-finite"), std::string::npos);
  EXPECT_NE(message(q.x, Eigen::VectorXd::Zero(5), o).find("no mass"), std::string::npos);
  EXPECT_NE(message(q.x, -q.a, o).find("negative"), std::string::npos);
  SinkhornOptions bad = o;
  bad.epsilon = 0.0;
  EXPECT_NE(message(q.x, q.a, bad).find("epsilon"), std::string::npos);
  bad = o;
  bad.p = 3;
  EXPECT_NE(message(q.x, q.a, bad).find("p must be"), std::string::npos);
}

// [D] Zero-weight points carry no mass: the value equals the one without them.
TEST(SinkhornSolverTest, ZeroWeightPointsChangeNothing) {
  const Pair q = randomPair(12, 10, 19);
  Eigen::MatrixX2d x(13, 2);
  x << q.x, Eigen::RowVector2d(5.0, 5.0);
  Eigen::VectorXd a(13);
  a << q.a, 0.0;
  SinkhornOptions o;
  o.epsilon = 0.02;
  o.tolerance = 1e-13;
  const SinkhornResult with = solveSinkhorn(x, a, q.y, q.b, o);
  const SinkhornResult without = solveSinkhorn(q.x, q.a, q.y, q.b, o);
  ASSERT_EQ(with.status, SinkhornStatus::Converged) << with.message;
  EXPECT_NEAR(with.value, without.value, 1e-12);
}

}  // namespace
}  // namespace barrow
