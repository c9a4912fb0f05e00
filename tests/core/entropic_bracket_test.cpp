// Certified bounds on OT_ε (transport/entropic_bounds.h) and the brackets of `entropic` and
// `sinkhorn` on large clouds (measures/entropic_bracket.h).
// References outside the project: OT_ε of small weighted problems by maximising the entropic
// semi-dual with scipy.optimize.minimize (L-BFGS-B, scipy.special.logsumexp), written here from
// the definition (Peyré & Cuturi 2019, Rem. 4.22 (mem); convention of REFERENCES 6a). The bounds
// must hold at any potentials (weak duality; a feasible coupling's objective, Altschuler, Weed
// & Rigollet 2017 (mem)); at sizes where the full solve is cheap, the brackets forced on
// (`exact_limit=0`) must contain the full solve's value. Widths are printed.
#include <gtest/gtest.h>

#include <cmath>
#include <cstdio>
#include <random>
#include <sstream>
#include <string>
#include <tuple>

#include "measures/entropic_bracket.h"
#include "measures/evaluate.h"
#include "measures/registry.h"
#include "support/test_support.h"
#include "transport/entropic_bounds.h"

namespace barrow {
namespace {

// A maximiser of the semi-dual F(f) = <a,f> + <b, g(f)>, g(f)_j = −ε logsumexp_i(log a_i +
// (f_i − C_ij)/ε), whose gradient is a − (row sums of the plan); F(f*) = OT_ε(a, b).
const char* kSemiDual = R"(
import numpy as np
from scipy.optimize import minimize
from scipy.special import logsumexp
from scipy.spatial.distance import cdist
def ot_eps(x, a, y, b, eps, p):
    C = cdist(x, y) ** p
    la = np.log(a)
    def neg(f):
        t = la[:, None] + (f[:, None] - C) / eps
        g = -eps * logsumexp(t, axis=0)
        P = np.exp(t + (g[None, :] + eps * np.log(b)[None, :]) / eps)
        return -(a @ f + b @ g), -(a - P.sum(1))
    r = minimize(neg, np.zeros(len(a)), jac=True, method='L-BFGS-B',
                 options={'maxiter': 100000, 'ftol': 1e-15, 'gtol': 1e-13, 'maxcor': 30})
    return -r.fun
)";

Cloud blob(int n, unsigned seed, double shift, bool weighted) {
  std::mt19937 rng(seed);
  std::uniform_real_distribution<double> u(0.0, 1.0);
  std::normal_distribution<double> z(0.0, 0.12);
  Eigen::MatrixX2d p(n, 2);
  Eigen::VectorXd w = Eigen::VectorXd::Ones(n);
  for (int i = 0; i < n; ++i) {
    const int c = int(3 * u(rng));
    p.row(i) << shift + 0.3 * c + z(rng), 0.5 * (c == 1) + z(rng);
    if (weighted) w(i) = 0.1 + u(rng);
  }
  return Cloud("", p, w);
}

double reference(const Cloud& a, const Cloud& b, double eps, int p) {
  std::ostringstream s;
  s.precision(17);
  s << kSemiDual << "x, a = " << test::pyPoints(a) << ", " << test::pyWeights(a) << "\ny, b = " << test::pyPoints(b)
    << ", " << test::pyWeights(b) << "\nprint('%.17g' % ot_eps(x, a, y, b, " << eps << ", " << p << "))\n";
  return std::stod(test::runPython(s.str()));
}

// [P] weak duality and [D] the rounded coupling: at zero, noisy and solved potentials, low <= OT_ε
// <= high against the SciPy semi-dual; at the solved potentials both are within 1e-7 of it.
TEST(EntropicBoundsTest, BoundsHoldAtAnyPotentialsAgainstScipy) {
  if (!test::pythonHas("scipy, numpy")) GTEST_SKIP() << "needs SciPy";
  kernel::RowWorkers team(2);
  for (int p : {1, 2})
    for (double eps : {0.02, 0.2}) {
      const Cloud a = blob(70, 3 + p, 0.0, true), b = blob(90, 11 + p, 0.25, true);
      const Eigen::VectorXd wa = a.normalizedWeights(), wb = b.normalizedWeights();
      const double ref = reference(a, b, eps, p);
      SinkhornOptions o;
      o.epsilon = eps;
      o.p = p;
      o.tolerance = 1e-12;
      o.maxIterations = 1000000;
      const SinkhornResult solved = solveSinkhorn(a.points, wa, b.points, wb, o);
      ASSERT_EQ(solved.status, SinkhornStatus::Converged);
      std::mt19937 rng(7);
      std::normal_distribution<double> z(0.0, 0.3 * eps);
      Eigen::VectorXd nf = solved.f, ng = solved.g;
      for (Eigen::Index i = 0; i < nf.size(); ++i) nf(i) += z(rng);
      for (Eigen::Index j = 0; j < ng.size(); ++j) ng(j) += z(rng);
      const std::pair<Eigen::VectorXd, Eigen::VectorXd> starts[] = {
          {Eigen::VectorXd::Zero(a.size()), Eigen::VectorXd::Zero(b.size())}, {nf, ng}, {solved.f, solved.g}};
      for (int k = 0; k < 3; ++k) {
        const auto& [f, g] = starts[k];
        const EntropicDualBound lo = entropicDualBound(a.points, wa, b.points, wb, f, g, eps, p, team);
        const EntropicRoundedBound hi = entropicRoundedBound(a.points, wa, b.points, wb, f, g, eps, p, team);
        ASSERT_TRUE(lo.complete && hi.complete);
        const double tol = 1e-10 * (1.0 + std::abs(ref));  // the reference's own accuracy
        EXPECT_LE(lo.low, ref + tol) << "p=" << p << " eps=" << eps << " start " << k;
        EXPECT_LE(hi.low, ref + tol) << "p=" << p << " eps=" << eps << " start " << k;
        EXPECT_GE(hi.high, ref - tol) << "p=" << p << " eps=" << eps << " start " << k;
        if (k == 2) {
          EXPECT_NEAR(lo.low, ref, 1e-7);
          EXPECT_NEAR(hi.high, ref, 1e-7);
        }
        std::printf("p=%d eps=%g start %d: ref %.10f  [%.10f, %.10f] (deficit %.2e)\n", p, eps, k, ref, lo.low,
                    hi.high, hi.deficit);
      }
    }
}

// The symmetric term OT_ε(a, a) through the same bounds (y = x), against SciPy [P].
TEST(EntropicBoundsTest, SelfTermBoundsAgainstScipy) {
  if (!test::pythonHas("scipy, numpy")) GTEST_SKIP() << "needs SciPy";
  kernel::RowWorkers team(2);
  const Cloud a = blob(80, 5, 0.0, true);
  const Eigen::VectorXd wa = a.normalizedWeights();
  for (int p : {1, 2}) {
    const double eps = 0.05;
    const double ref = reference(a, a, eps, p);
    SinkhornOptions o;
    o.epsilon = eps;
    o.p = p;
    o.tolerance = 1e-3;  // loosely solved: the bounds must hold all the same
    const SinkhornResult s = solveSinkhornSymmetric(a.points, wa, o);
    ASSERT_TRUE(s.usable());
    const EntropicDualBound lo = entropicDualBound(a.points, wa, a.points, wa, s.f, s.f, eps, p, team);
    const EntropicRoundedBound hi = entropicRoundedBound(a.points, wa, a.points, wa, s.f, s.f, eps, p, team);
    EXPECT_LE(lo.low, ref + 1e-10);
    EXPECT_GE(hi.high, ref - 1e-10);
    std::printf("self p=%d: ref %.10f  [%.10f, %.10f]\n", p, ref, lo.low, hi.high);
  }
}

Result run(const char* id, const Cloud& a, const Cloud& b, int p, bool bracket, int representatives) {
  const Measure* m = MeasureRegistry::instance().find(id);
  EXPECT_NE(m, nullptr) << id;
  if (!m) return Result::invalid("missing");
  EvalRequest req;
  req.params.set(std::string(id) + ".p", std::to_string(p));
  req.params.set(std::string(id) + ".tolerance", "1e-10");
  req.params.set(std::string(id) + ".exact_limit", bracket ? "0" : "2000000000");
  req.params.set(std::string(id) + ".representatives", std::to_string(representatives));
  return evaluateMeasure(*m, a, b, req);
}

// [D] At 2 500 + 3 000 weighted points, p = 1 and 2, two representative counts: the bracket of
// `entropic` and of `sinkhorn` contains the full solve's value (tolerance 1e-10, accurate far
// beyond the widths); the finer quantisation gives the narrower bracket.
TEST(EntropicBracketTest, BracketsContainTheFullSolve) {
  const Cloud a = blob(2500, 21, 0.0, true), b = blob(3000, 22, 0.35, true);
  for (int p : {1, 2})
    for (const char* id : {"entropic", "sinkhorn"}) {
      const Result full = run(id, a, b, p, false, 1);
      ASSERT_EQ(full.status, Status::Ok) << id << " " << full.message;
      double lastWidth = INFINITY;
      for (int k : {200, 800}) {
        const Result r = run(id, a, b, p, true, k);
        ASSERT_EQ(r.status, Status::Bracketed) << id << " " << r.message;
        EXPECT_LE(r.low, full.value) << id << " p=" << p << " k=" << k;
        EXPECT_GE(r.high, full.value) << id << " p=" << p << " k=" << k;
        EXPECT_LE(r.low, r.value);
        EXPECT_GE(r.high, r.value);
        EXPECT_DOUBLE_EQ(r.details.at("width").get<double>(), r.high - r.low);
        const double width = r.high - r.low;
        EXPECT_LT(width, lastWidth) << id << " p=" << p << " k=" << k;
        lastWidth = width;
        std::printf("%s p=%d k=%d: full %.8f  [%.8f, %.8f] width %.2e (%.2e relative)\n", id, p, k, full.value,
                    r.low, r.high, width, width / std::abs(full.value));
      }
    }
}

// A mass mixture (the `mix` family near its start): A's points plus B's points at a thousandth
// of the mass, so some points of tiny weight lie far from every representative of any weight.
// The bracket must still contain the full solve and stay narrow (sinkhorn's was 1.6e14 wide when the low
// end used potentials carried to both sides instead of a c-transform on all points) [D].
TEST(EntropicBracketTest, TinyWeightsFarFromTheRepresentatives) {
  // Two Gaussian clusters each, B with one cluster where A has none (seeded, weights random).
  std::mt19937 rng(11);
  std::normal_distribution<double> z(0.0, 1.0);
  std::uniform_real_distribution<double> u(0.0, 1.0);
  const auto mixture = [&](std::initializer_list<std::tuple<double, double, double, int>> parts) {
    int n = 0;
    for (const auto& part : parts) n += std::get<3>(part);
    Eigen::MatrixX2d p(n, 2);
    Eigen::VectorXd w(n);
    int k = 0;
    for (const auto& [cx, cy, sd, count] : parts)
      for (int i = 0; i < count; ++i, ++k) {
        p.row(k) << cx + sd * z(rng), cy + sd * z(rng);
        w(k) = 0.05 + u(rng);
      }
    return Cloud("", p, w);
  };
  const Cloud a0 = mixture({{0.0, 0.0, 0.3, 500}, {1.0, 1.0, 0.2, 400}});
  const Cloud b = mixture({{0.5, 0.3, 0.4, 700}, {-0.5, 1.0, 0.2, 300}});
  const double theta = 1e-3;
  Eigen::MatrixX2d pts(a0.size() + b.size(), 2);
  pts << a0.points, b.points;
  Eigen::VectorXd w(pts.rows());
  w << (1 - theta) * a0.normalizedWeights(), theta * b.normalizedWeights();
  const Cloud a("", pts, w);
  for (const char* id : {"entropic", "sinkhorn"}) {
    const Result full = run(id, a, b, 2, false, 1);
    const Result r = run(id, a, b, 2, true, 250);
    ASSERT_EQ(r.status, Status::Bracketed) << r.message;
    EXPECT_LE(r.low, full.value) << id;
    EXPECT_GE(r.high, full.value) << id;
    EXPECT_LT(r.high - r.low, 0.05 * std::abs(full.value)) << id << " [" << r.low << ", " << r.high << "]";
    std::printf("%s mixture: full %.8f  [%.8f, %.8f]\n", id, full.value, r.low, r.high);
  }
}

// Two identical requests give the same bracket (the second from the shared store), and a
// cancelled request gives no value.
TEST(EntropicBracketTest, SharedStoreAndCancel) {
  const Cloud a = blob(1500, 31, 0.0, false), b = blob(1700, 32, 0.2, true);
  SinkhornOptions o;
  o.epsilon = 0.01;
  kernel::RowWorkers team(2);
  const EntropicBracket one = bracketEntropicShared(a, b, false, o, 300, nullptr, team);
  const EntropicBracket two = bracketEntropicShared(a, b, false, o, 300, nullptr, team);
  ASSERT_TRUE(one.usable && two.usable);
  EXPECT_EQ(one.low, two.low);
  EXPECT_EQ(one.high, two.high);
  const EntropicBracket fresh = bracketEntropic(a, b, false, o, 300, nullptr, team);
  EXPECT_EQ(fresh.low, one.low);
  EXPECT_EQ(fresh.high, one.high);
  std::atomic<bool> stop{true};
  RunControl c;
  c.cancel = &stop;
  const EntropicBracket none = bracketEntropic(a, b, false, o, 300, &c, team);
  EXPECT_TRUE(none.cancelled);
  EXPECT_FALSE(none.usable);
}

// One thread or two: the same bracket to the last bit (every sum is split by rows and added in
// a fixed order) [CP].
TEST(EntropicBracketTest, ThreadCountDoesNotChangeTheBracket) {
  const Cloud a = blob(2200, 41, 0.0, true), b = blob(1900, 42, 0.3, true);
  for (int p : {1, 2}) {
    SinkhornOptions o;
    o.p = p;
    o.epsilon = p == 2 ? 0.004 : 0.06;
    double low[2], high[2];
    for (int t : {1, 2}) {
      kernel::RowWorkers team(t);
      RunControl c;
      c.threads = t;
      const EntropicBracket e = bracketEntropic(a, b, false, o, 400, &c, team);
      ASSERT_TRUE(e.usable) << e.message;
      low[t - 1] = e.low;
      high[t - 1] = e.high;
    }
    EXPECT_EQ(low[0], low[1]) << "p=" << p;
    EXPECT_EQ(high[0], high[1]) << "p=" << p;
  }
}

}  // namespace
}  // namespace barrow
