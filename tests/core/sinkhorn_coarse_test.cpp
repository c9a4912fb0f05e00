// The coarse-to-fine start of the Sinkhorn solver (transport/sinkhorn_coarse.h): the grid
// summary keeps mass and mean, the c-transform extension is the dense formula, and solves
// that start coarse agree with the plain path (annealing on the full clouds) and with a
// NumPy/SciPy Sinkhorn written from the definition, with marginals within the tolerance
// checked on the dense plan.
#include <gtest/gtest.h>

#include <cmath>
#include <random>
#include <sstream>

#include "support/test_support.h"
#include "transport/sinkhorn_coarse.h"
#include "transport/sinkhorn_solver.h"

namespace barrow {
namespace {

struct Pair {
  Eigen::MatrixX2d x, y;
  Eigen::VectorXd a, b;
};

// A: uniform on the unit square; B: a Gaussian blob or a uniform square shifted, random
// weights (some zero), so the instances differ in shape as well as in draw.
Pair instance(int n, int m, unsigned seed) {
  std::mt19937 rng(seed);
  std::uniform_real_distribution<double> u(0.0, 1.0), w(0.0, 1.0);
  std::normal_distribution<double> g(0.0, 0.3);
  Pair q{Eigen::MatrixX2d(n, 2), Eigen::MatrixX2d(m, 2), Eigen::VectorXd(n), Eigen::VectorXd(m)};
  for (int i = 0; i < n; ++i) {
    q.x.row(i) << u(rng), u(rng);
    q.a(i) = i % 17 == 0 ? 0.0 : w(rng);
  }
  for (int j = 0; j < m; ++j) {
    if (seed % 2) q.y.row(j) << 0.5 + g(rng), 0.8 + g(rng);
    else q.y.row(j) << 0.3 + u(rng), 0.2 + u(rng);
    q.b(j) = 0.1 + w(rng);
  }
  q.a /= q.a.sum();
  q.b /= q.b.sum();
  return q;
}

double cost(const Eigen::RowVector2d& u, const Eigen::RowVector2d& v, int p) {
  const double d = (u - v).norm();
  return p == 2 ? d * d : d;
}

// L1 errors of the row and the column marginals of the dense plan
// P_ij = a_i b_j exp((f_i + g_j − C_ij)/ε), from the definition (convention (i), REFERENCES
// "Sinkhorn").
std::pair<double, double> denseMarginalErrors(const Pair& q, const SinkhornResult& r, double eps, int p) {
  Eigen::VectorXd rows = Eigen::VectorXd::Zero(q.a.size()), cols = Eigen::VectorXd::Zero(q.b.size());
  for (Eigen::Index i = 0; i < q.x.rows(); ++i)
    for (Eigen::Index j = 0; j < q.y.rows(); ++j) {
      const double pij = q.a(i) * q.b(j) * std::exp((r.f(i) + r.g(j) - cost(q.x.row(i), q.y.row(j), p)) / eps);
      rows(i) += pij;
      cols(j) += pij;
    }
  return {(rows - q.a).lpNorm<1>(), (cols - q.b).lpNorm<1>()};
}

// The largest cost on the instance: value accuracy = marginal error × this, as the measures
// report it (entropic_measure.cpp, [CP]).
double costBound(const Pair& q, int p) {
  double c = 0.0;
  for (Eigen::Index i = 0; i < q.x.rows(); ++i)
    for (Eigen::Index j = 0; j < q.y.rows(); ++j) c = std::max(c, cost(q.x.row(i), q.y.row(j), p));
  return c;
}

// [D] Summing a cell's masses and taking their weighted mean keeps the total mass and the
// cloud's weighted mean; every coarse point lies in its cell's bounding box, so inside the cloud's.
TEST(SinkhornCoarseTest, GridSummaryKeepsMassAndMean) {
  const Pair q = instance(3000, 10, 1);
  for (int side : {1, 7, 32}) {
    const CoarseCloud c = coarsenOnGrid(q.x, q.a, side);
    EXPECT_LE(c.x.rows(), side * side);
    EXPECT_NEAR(c.w.sum(), q.a.sum(), 1e-12);
    const Eigen::RowVector2d mean = (q.x.array().colwise() * q.a.array()).colwise().sum();
    const Eigen::RowVector2d coarseMean = (c.x.array().colwise() * c.w.array()).colwise().sum();
    EXPECT_NEAR((mean - coarseMean).norm(), 0.0, 1e-12) << side;
    EXPECT_GE(c.x.col(0).minCoeff(), q.x.col(0).minCoeff());
    EXPECT_LE(c.x.col(1).maxCoeff(), q.x.col(1).maxCoeff());
  }
  EXPECT_EQ(coarsenOnGrid(q.x, q.a, 1).x.rows(), 1);
}

// [D] The extension is the entropic c-transform: checked against the formula summed directly.
TEST(SinkhornCoarseTest, ExtensionIsTheCTransform) {
  const Pair q = instance(200, 300, 2);
  const CoarseCloud c = coarsenOnGrid(q.y, q.b, 6);
  std::mt19937 rng(3);
  std::uniform_real_distribution<double> u(-0.2, 0.2);
  Eigen::VectorXd g(c.x.rows());
  for (Eigen::Index j = 0; j < g.size(); ++j) g(j) = u(rng);
  kernel::RowWorkers team(2);
  for (int p : {1, 2})
    for (double eps : {0.5, 0.01}) {
      const Eigen::VectorXd f = extendPotential(q.x, c, g, eps, p, team);
      for (Eigen::Index i = 0; i < q.x.rows(); i += 13) {
        long double s = 0.0L, mx = -INFINITY;
        for (Eigen::Index j = 0; j < g.size(); ++j)
          mx = std::max<long double>(mx, (g(j) - cost(q.x.row(i), c.x.row(j), p)) / eps);
        for (Eigen::Index j = 0; j < g.size(); ++j)
          s += (c.w(j) / c.w.sum()) * std::exp((g(j) - cost(q.x.row(i), c.x.row(j), p)) / eps - mx);
        const double want = double(-eps * (mx + std::log(s)));
        EXPECT_NEAR(f(i), want, 1e-12 * (1.0 + std::abs(want))) << p << " " << eps << " " << i;
      }
    }
}

SinkhornOptions options(double eps, int p, bool coarse) {
  SinkhornOptions o;
  o.epsilon = eps;
  o.p = p;
  o.coarseFrom = 300;  // smaller instances than the default allows, so the dense checks stay cheap
  o.coarseGrid = coarse ? 32 : 0;
  return o;
}

// New path (coarse start) against the old one (annealing on the full clouds) on several
// random instances, both cost powers and several ε: values within the value accuracy the
// measures report, marginals of the dense plan within the tolerance (and the tolerance is
// what the solver claims).
TEST(SinkhornCoarseTest, CoarseStartAgreesWithThePlainPathWithinTheTolerance) {
  int checked = 0, coarseUsed = 0;
  for (unsigned seed = 10; seed < 13; ++seed) {
    const Pair q = instance(1000 + 20 * int(seed), 900, seed);
    for (int p : {1, 2}) {
      const double d = 1.5;  // about the joint diameter here
      // (D/20)^p is the measures' "auto" ε; the smaller one leaves the grid too coarse for
      // the kernel on some instances, where the plain path runs (coarsePoints = 0).
      for (double eps : {std::pow(d / 20, p), std::pow(d / (p == 2 ? 50 : 100), p)}) {
        const SinkhornResult plain = solveSinkhorn(q.x, q.a, q.y, q.b, options(eps, p, false));
        const SinkhornResult coarse = solveSinkhorn(q.x, q.a, q.y, q.b, options(eps, p, true));
        ASSERT_EQ(plain.status, SinkhornStatus::Converged) << seed << " " << p << " " << eps;
        ASSERT_EQ(coarse.status, SinkhornStatus::Converged) << seed << " " << p << " " << eps;
        EXPECT_EQ(plain.coarsePoints, 0);
        const double bound = costBound(q, p);
        const double accuracy = (plain.marginalError + coarse.marginalError) * bound;
        EXPECT_NEAR(coarse.value, plain.value, accuracy) << seed << " " << p << " " << eps;
        EXPECT_LE(coarse.marginalError, 1e-6);
        const auto [rowsOff, colsOff] = denseMarginalErrors(q, coarse, eps, p);
        EXPECT_LE(rowsOff, 1e-6 * (1 + 1e-9)) << seed << " " << p << " " << eps;
        // Over-relaxed g-steps leave the columns off by about as much as the rows (measured
        // 0.7–3× on the plain path as well), hence the looser bound on them.
        EXPECT_LE(colsOff, 4e-6) << seed << " " << p << " " << eps;
        coarseUsed += coarse.coarsePoints > 0;
        ++checked;
      }
    }
  }
  EXPECT_EQ(checked, 12);
  EXPECT_GE(coarseUsed, 6);  // the cases whose grid cells are fine enough for ε
}

// The self term by the symmetric update, coarse start against plain, likewise.
TEST(SinkhornCoarseTest, SymmetricCoarseStartAgreesWithThePlainPath) {
  for (unsigned seed = 20; seed < 23; ++seed) {
    const Pair q = instance(1000, 1000, seed);
    for (int p : {1, 2}) {
      const double eps = p == 2 ? 0.0056 : 0.075;  // (D/20)^p, D about 1.5
      const SinkhornResult plain = solveSinkhornSymmetric(q.y, q.b, options(eps, p, false));
      const SinkhornResult coarse = solveSinkhornSymmetric(q.y, q.b, options(eps, p, true));
      ASSERT_EQ(coarse.status, SinkhornStatus::Converged);
      EXPECT_GT(coarse.coarsePoints, 0);
      Pair self{q.y, q.y, q.b, q.b};
      SinkhornResult both = coarse;
      both.g = both.f;
      const double accuracy = (plain.marginalError + coarse.marginalError) * costBound(self, p);
      EXPECT_NEAR(coarse.value, plain.value, accuracy) << seed << " " << p;
      const auto [rowsOff, colsOff] = denseMarginalErrors(self, both, eps, p);
      EXPECT_LE(rowsOff, 1e-6 * (1 + 1e-9)) << seed << " " << p;
      EXPECT_NEAR(colsOff, rowsOff, 1e-15);  // the plan of (f, f) is symmetric
    }
  }
}

// Against an outside reference: the NumPy/SciPy log-domain Sinkhorn of
// sinkhorn_reference_test.cpp (from the definition, Cuturi 2013; primal value of its plan) on
// one instance solved with the coarse start.
TEST(SinkhornCoarseTest, CoarseStartMatchesTheNumpyReference) {
  if (!test::pythonHas("scipy, numpy")) GTEST_SKIP() << "needs python3-scipy";
  const Pair q = instance(400, 350, 31);
  const double eps = 0.01;
  SinkhornOptions o = options(eps, 2, true);
  o.tolerance = 1e-11;
  const SinkhornResult r = solveSinkhorn(q.x, q.a, q.y, q.b, o);
  ASSERT_EQ(r.status, SinkhornStatus::Converged) << r.message;
  ASSERT_GT(r.coarsePoints, 0);
  std::ostringstream s;
  s.precision(17);
  s << "import numpy as np\nfrom scipy.special import logsumexp\nfrom scipy.spatial.distance import cdist\n";
  s << "x = np.array([";
  for (Eigen::Index i = 0; i < q.x.rows(); ++i) s << "[" << q.x(i, 0) << "," << q.x(i, 1) << "],";
  s << "])\na = np.array([";
  for (Eigen::Index i = 0; i < q.a.size(); ++i) s << q.a(i) << ",";
  s << "])\ny = np.array([";
  for (Eigen::Index j = 0; j < q.y.rows(); ++j) s << "[" << q.y(j, 0) << "," << q.y(j, 1) << "],";
  s << "])\nb = np.array([";
  for (Eigen::Index j = 0; j < q.b.size(); ++j) s << q.b(j) << ",";
  s << "])\neps = " << eps << R"(
C = cdist(x, y) ** 2
keep = a > 0
x, a, C = x[keep], a[keep], C[keep]
la, lb = np.log(a), np.log(b)
f, g = np.zeros(len(a)), np.zeros(len(b))
for it in range(200000):
    f = -eps * logsumexp(lb[None, :] + (g[None, :] - C) / eps, axis=1)
    g = -eps * logsumexp(la[:, None] + (f[:, None] - C) / eps, axis=0)
    logP = la[:, None] + lb[None, :] + (f[:, None] + g[None, :] - C) / eps
    P = np.exp(logP)
    if np.abs(P.sum(1) - a).sum() + np.abs(P.sum(0) - b).sum() < 1e-13:
        break
print(repr(np.sum(P * C) + eps * np.sum(P * (logP - la[:, None] - lb[None, :]))))
)";
  const double ref = std::stod(test::runPython(s.str()));
  EXPECT_NEAR(r.value, ref, 1e-8);
}

}  // namespace
}  // namespace barrow
