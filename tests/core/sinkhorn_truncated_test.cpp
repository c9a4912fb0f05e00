// Truncated-kernel Sinkhorn (transport/sinkhorn_truncated.h) against the dense log-domain
// solver and against the definitions written out densely here: same value within the
// tolerance, the kept set contains every pair above the threshold, the bound on the
// neglected mass holds against the true neglected mass, warm starts and thread counts
// change only the speed. Sources: Schmitzer 2019 (truncation, the kept-set rule), Peyré &
// Cuturi 2019 (log-domain updates, dual objective); the bound is [D] (REFERENCES.md,
// "Truncated kernels").
#include <gtest/gtest.h>

#include <atomic>
#include <cmath>
#include <cstdio>
#include <random>

#include "spatial/box_tree.h"
#include "transport/sinkhorn_solver.h"
#include "transport/sinkhorn_truncated.h"

namespace barrow {
namespace {

struct Pair {
  Eigen::MatrixX2d x, y;
  Eigen::VectorXd a, b;
};

// A uniform on the unit square, B uniform on a square shifted by (0.3, 0.1); random weights
// (a few zeros on each side).
Pair randomPair(int n, int m, unsigned seed) {
  std::mt19937 rng(seed);
  std::uniform_real_distribution<double> u(0.0, 1.0), w(0.2, 1.0);
  Pair p{Eigen::MatrixX2d(n, 2), Eigen::MatrixX2d(m, 2), Eigen::VectorXd(n), Eigen::VectorXd(m)};
  for (int i = 0; i < n; ++i) {
    p.x.row(i) << u(rng), u(rng);
    p.a(i) = i % 97 == 5 ? 0.0 : w(rng);
  }
  for (int j = 0; j < m; ++j) {
    p.y.row(j) << 0.3 + u(rng), 0.1 + u(rng);
    p.b(j) = j % 89 == 7 ? 0.0 : w(rng);
  }
  p.a /= p.a.sum();
  p.b /= p.b.sum();
  return p;
}

double cost(const Eigen::MatrixX2d& x, int i, const Eigen::MatrixX2d& y, int j, int p) {
  const double d2 = (x.row(i) - y.row(j)).squaredNorm();
  return p == 2 ? d2 : std::sqrt(d2);
}

// L1 error of the row marginals of the full plan a_i b_j exp((f_i + g_j − c_ij)/ε), summed
// directly over all pairs in long double.
double fullRowError(const Pair& q, const Eigen::VectorXd& f, const Eigen::VectorXd& g, double eps, int p) {
  long double err = 0;
  for (int i = 0; i < q.x.rows(); ++i) {
    if (q.a(i) == 0) continue;
    long double row = 0;
    for (int j = 0; j < q.y.rows(); ++j)
      if (q.b(j) > 0) row += q.b(j) * std::exp((long double)(f(i) + g(j) - cost(q.x, i, q.y, j, p)) / eps);
    err += q.a(i) * std::abs(row - 1.0L);
  }
  return double(err);
}

double largestCost(const Pair& q, int p) {
  const Eigen::RowVector2d lo = q.x.colwise().minCoeff().cwiseMin(q.y.colwise().minCoeff());
  const Eigen::RowVector2d hi = q.x.colwise().maxCoeff().cwiseMax(q.y.colwise().maxCoeff());
  return std::pow((hi - lo).norm(), p);
}

struct Case {
  int p;
  double eps;
};

TEST(TruncatedSinkhornTest, MatchesTheDenseSolverAtSmallEpsilon) {
  const Pair q = randomPair(2000, 2000, 11);
  for (const Case c : {Case{2, 1e-3}, Case{2, 1e-4}, Case{1, 2e-3}}) {
    SCOPED_TRACE("p = " + std::to_string(c.p) + ", eps = " + std::to_string(c.eps));
    SinkhornOptions o;
    o.p = c.p;
    o.epsilon = c.eps;
    SinkhornOptions dense = o;
    dense.truncation = false;
    const SinkhornResult t = solveSinkhorn(q.x, q.a, q.y, q.b, o);
    const SinkhornResult d = solveSinkhorn(q.x, q.a, q.y, q.b, dense);
    ASSERT_EQ(d.status, SinkhornStatus::Converged) << d.message;
    ASSERT_EQ(t.status, SinkhornStatus::Converged) << t.message;
    EXPECT_TRUE(t.truncated);
    EXPECT_FALSE(d.truncated);
    EXPECT_TRUE(t.fullCheck);
    EXPECT_LT(double(t.keptPairs), 0.5 * 2000.0 * 2000.0);  // truly sparse
    // Same value within the accuracy both report: marginal error × largest cost [CP].
    EXPECT_NEAR(t.value, d.value, o.tolerance * largestCost(q, c.p));
    // The stated tolerance holds on the full problem, summed here over all pairs.
    const double full = fullRowError(q, t.f, t.g, c.eps, c.p);
    EXPECT_LE(full, o.tolerance * (1 + 1e-6));
    EXPECT_NEAR(full, t.marginalError, 1e-9);
  }
}

TEST(TruncatedSinkhornTest, SymmetricProblemMatchesTheDenseSolver) {
  const Pair q = randomPair(2000, 10, 12);
  for (const Case c : {Case{2, 2e-4}, Case{1, 3e-3}}) {
    SinkhornOptions o;
    o.p = c.p;
    o.epsilon = c.eps;
    SinkhornOptions dense = o;
    dense.truncation = false;
    const SinkhornResult t = solveSinkhornSymmetric(q.x, q.a, o);
    const SinkhornResult d = solveSinkhornSymmetric(q.x, q.a, dense);
    ASSERT_EQ(t.status, SinkhornStatus::Converged) << t.message;
    ASSERT_EQ(d.status, SinkhornStatus::Converged) << d.message;
    EXPECT_TRUE(t.truncated);
    Pair self{q.x, q.x, q.a, q.a};
    EXPECT_NEAR(t.value, d.value, o.tolerance * largestCost(self, c.p));
    EXPECT_LE(fullRowError(self, t.f, t.f, c.eps, c.p), o.tolerance * (1 + 1e-6));
  }
}

TEST(TruncatedKernelTest, KeepsEveryPairAboveTheThresholdAndBoundsTheRest) {
  const Pair q = randomPair(1500, 1300, 13);
  for (const Case c : {Case{2, 1e-3}, Case{1, 1e-2}}) {
    SCOPED_TRACE("p = " + std::to_string(c.p));
    SinkhornOptions o;
    o.p = c.p;
    o.epsilon = c.eps;
    o.truncation = false;
    const SinkhornResult d = solveSinkhorn(q.x, q.a, q.y, q.b, o);
    ASSERT_TRUE(d.usable());
    kernel::RowWorkers team(2);
    TruncatedKernel k(q.x, q.a, q.y, q.b, c.p);
    Eigen::VectorXd f = d.f, g = d.g;
    const double theta = 6.0;  // small, so that the dropped mass is far from 0 and the check bites
    k.build(f, g, c.eps, theta, team);
    EXPECT_EQ(f, d.f);  // converged potentials: no row or column was empty
    // Exactly the pairs above the threshold are kept (the tree's pruning loses none).
    long long above = 0, wrong = 0;
    for (int i = 0; i < q.x.rows(); ++i)
      for (int j = 0; j < q.y.rows(); ++j) {
        const bool in = f(i) + g(j) - cost(q.x, i, q.y, j, c.p) >= -theta * c.eps;
        above += in;
        wrong += in != k.kept(i, j);
      }
    EXPECT_EQ(wrong, 0);
    EXPECT_EQ(k.pairs(), above);
    // Potentials moved after the truncation (up by up to 1.5 ε, some down), and a smaller ε:
    // the bound must still cover the true mass of the full plan on the dropped pairs.
    std::mt19937 rng(5);
    std::uniform_real_distribution<double> move(-0.5, 1.5);
    for (const double epsNow : {c.eps, 0.7 * c.eps}) {
      Eigen::VectorXd f2 = f, g2 = g;
      for (Eigen::Index i = 0; i < f2.size(); ++i) f2(i) += move(rng) * c.eps;
      for (Eigen::Index j = 0; j < g2.size(); ++j) g2(j) += 0.5 * move(rng) * c.eps;
      long double dropped = 0;
      for (int i = 0; i < q.x.rows(); ++i)
        for (int j = 0; j < q.y.rows(); ++j)
          if (!k.kept(i, j))
            dropped += q.a(i) * q.b(j) * std::exp((long double)(f2(i) + g2(j) - cost(q.x, i, q.y, j, c.p)) / epsNow);
      const double bound = k.neglectedBound(f2, g2, epsNow);
      EXPECT_GT(double(dropped), 0.0);
      EXPECT_LE(double(dropped), bound);
      char line[96];
      std::snprintf(line, sizeof line, "%.3g <= %.3g", double(dropped), bound);
      RecordProperty("p" + std::to_string(c.p) + (epsNow == c.eps ? "_eps" : "_0.7eps"), line);
    }
  }
}

TEST(TruncatedKernelTest, EmptyRowsGetTheirPotentialFromTheExactTransform) {
  const Pair q = randomPair(300, 280, 14);
  kernel::RowWorkers team(1);
  TruncatedKernel k(q.x, q.a, q.y, q.b, 2);
  // Potentials far too low: every pair is below the threshold at first.
  Eigen::VectorXd f = Eigen::VectorXd::Constant(300, -5.0), g = Eigen::VectorXd::Constant(280, -5.0);
  k.build(f, g, 1e-3, 20.0, team);
  for (int i = 0; i < 300; ++i) {
    bool any = false;
    for (int j = 0; j < 280 && !any; ++j) any = q.b(j) > 0 && k.kept(i, j);
    EXPECT_TRUE(any) << "row " << i;
  }
}

TEST(TruncatedSinkhornTest, WarmStartAndThreadsChangeOnlyTheSpeed) {
  const Pair q = randomPair(2000, 2000, 15);
  SinkhornOptions o;
  o.epsilon = 2e-4;
  RunControl one, two;
  one.threads = 1;
  two.threads = 2;
  const SinkhornResult cold1 = solveSinkhorn(q.x, q.a, q.y, q.b, o, &one);
  const SinkhornResult cold2 = solveSinkhorn(q.x, q.a, q.y, q.b, o, &two);
  ASSERT_EQ(cold1.status, SinkhornStatus::Converged);
  ASSERT_TRUE(cold1.truncated);
  const double accuracy = o.tolerance * largestCost(q, 2);
  EXPECT_NEAR(cold1.value, cold2.value, accuracy);
  // From its own solution a warm start has almost nothing left to do.
  const SinkhornStart own{&cold1.f, &cold1.g};
  const SinkhornResult again = solveSinkhorn(q.x, q.a, q.y, q.b, o, &two, &own);
  ASSERT_EQ(again.status, SinkhornStatus::Converged) << again.message;
  EXPECT_TRUE(again.warmStarted);
  EXPECT_TRUE(again.truncated);
  EXPECT_NEAR(again.value, cold1.value, accuracy);
  EXPECT_LE(again.iterations, 3);
  // From another problem's potentials (A moved by about one kernel length): the same value
  // as a cold solve of the moved problem. (Not necessarily faster: without annealing the
  // smooth part of the mismatch decays slowly at small ε.)
  Pair moved = q;
  moved.x.col(0).array() += std::sqrt(o.epsilon);
  const SinkhornResult warm = solveSinkhorn(moved.x, moved.a, moved.y, moved.b, o, &two, &own);
  const SinkhornResult cold = solveSinkhorn(moved.x, moved.a, moved.y, moved.b, o, &two);
  ASSERT_EQ(warm.status, SinkhornStatus::Converged) << warm.message;
  ASSERT_EQ(cold.status, SinkhornStatus::Converged) << cold.message;
  EXPECT_NEAR(warm.value, cold.value, accuracy);
  EXPECT_LE(fullRowError(moved, warm.f, warm.g, o.epsilon, 2), o.tolerance * (1 + 1e-6));
}

TEST(TruncatedSinkhornTest, StopsWhenCancelledAndReportsProgress) {
  const Pair q = randomPair(2000, 2000, 17);
  SinkhornOptions o;
  o.epsilon = 1e-4;
  std::atomic<bool> cancel{false};
  double lastFraction = -1.0;
  int late = 0;
  RunControl control;
  control.cancel = &cancel;
  control.onProgress = [&](double fraction) {
    lastFraction = fraction;
    if (fraction >= 0.2 && ++late == 20) cancel = true;  // inside the truncated stages
    return true;
  };
  const SinkhornResult r = solveSinkhorn(q.x, q.a, q.y, q.b, o, &control);
  EXPECT_EQ(r.status, SinkhornStatus::Cancelled);
  EXPECT_TRUE(r.truncated);
  EXPECT_GE(lastFraction, 0.2);
  EXPECT_LE(lastFraction, 1.0);
  EXPECT_EQ(r.f.size(), 2000);
  // Cancelled during the coarse start: the potentials still have the clouds' sizes.
  cancel = false;
  control.onProgress = [&](double) { return !(cancel = true); };
  const SinkhornResult early = solveSinkhorn(q.x, q.a, q.y, q.b, o, &control);
  EXPECT_EQ(early.status, SinkhornStatus::Cancelled);
  EXPECT_EQ(early.f.size(), 2000);
  EXPECT_EQ(early.g.size(), 2000);
}

TEST(BoxTreeTest, NodeMaximaAndBoxesCoverTheirPoints) {
  const Pair q = randomPair(500, 1, 16);
  const BoxTree t(q.x, 7);
  Eigen::VectorXd v = q.x.col(0) - q.x.col(1);
  const std::vector<double> mx = t.nodeMaxima(v);
  for (std::size_t k = 0; k < t.nodes().size(); ++k) {
    const auto& n = t.nodes()[k];
    double best = -1e300;
    for (int s = n.begin; s < n.end; ++s) {
      const int i = t.order()[s];
      best = std::max(best, v(i));
      EXPECT_EQ(BoxTree::boxDistance2(n, q.x(i, 0), q.x(i, 1)), 0.0);
    }
    EXPECT_EQ(mx[k], best);
    if (n.left >= 0) {
      EXPECT_GT(n.left, int(k));
    }
  }
}

}  // namespace
}  // namespace barrow
