// Entropic OT and the Sinkhorn divergence against references outside the project
// (REFERENCES rows 6a, 6c, 6d): a NumPy/SciPy Sinkhorn written here from the definition
// (scipy.special.logsumexp), the exact transport LP (scipy.optimize.linprog, HiGHS), and the
// energy distance from its definition.
#include <gtest/gtest.h>

#include <cmath>
#include <random>
#include <sstream>

#include "measures/entropic_measure.h"
#include "measures/evaluate.h"
#include "measures/sinkhorn_measure.h"
#include "support/test_support.h"

namespace barrow {
namespace {

Cloud weightedCloud(int n, unsigned seed, double shiftX) {
  std::mt19937 rng(seed);
  std::uniform_real_distribution<double> u(0.0, 1.0), w(0.2, 1.0);
  Eigen::MatrixX2d p(n, 2);
  Eigen::VectorXd wt(n);
  for (int i = 0; i < n; ++i) {
    p.row(i) << shiftX + u(rng), u(rng) * u(rng);
    wt(i) = w(rng);
  }
  return Cloud("c", p, wt);
}

Result run(const Measure& m, const Cloud& a, const Cloud& b, const std::string& group, double eps, int p,
           double tolerance = 1e-12) {
  EvalRequest req = test::entropicRequest(group, eps, p, tolerance);
  req.params.set(group + ".max_iterations", "1000000");
  return evaluateMeasure(m, a, b, req);
}

// Shannon entropy of the normalised weights, nats [D].
double entropy(const Cloud& c) {
  const Eigen::VectorXd w = c.normalizedWeights();
  double h = 0.0;
  for (Eigen::Index i = 0; i < w.size(); ++i)
    if (w(i) > 0) h -= w(i) * std::log(w(i));
  return h;
}

std::string pyPair(const Cloud& a, const Cloud& b) {
  return "x, a = " + test::pyPoints(a) + ", " + test::pyWeights(a) + "\ny, b = " + test::pyPoints(b) + ", " +
         test::pyWeights(b) + "\n";
}

// OT_ε by log-domain Sinkhorn written from the definition (Cuturi 2013; convention (i) of
// REFERENCES "Sinkhorn"): alternating softmin updates, or for a symmetric problem the averaged
// fixed-point update f ← (f + T f)/2 (Feydy et al. 2019), run to a 1e-14 marginal error; the
// value returned is the PRIMAL objective <P,C> + ε KL(P | a⊗b) of the resulting plan.
const char* kNumpySinkhorn = R"(
import numpy as np
from scipy.special import logsumexp
from scipy.spatial.distance import cdist
def ot_eps(x, a, y, b, eps, p, symmetric=False):
    C = cdist(x, y) ** p
    la, lb = np.log(a), np.log(b)
    f, g = np.zeros(len(a)), np.zeros(len(b))
    for it in range(200000):
        if symmetric:
            f = 0.5 * (f - eps * logsumexp(lb[None, :] + (f[None, :] - C) / eps, axis=1))
            g = f
        else:
            f = -eps * logsumexp(lb[None, :] + (g[None, :] - C) / eps, axis=1)
            g = -eps * logsumexp(la[:, None] + (f[:, None] - C) / eps, axis=0)
        logP = la[:, None] + lb[None, :] + (f[:, None] + g[None, :] - C) / eps
        P = np.exp(logP)
        if np.abs(P.sum(1) - a).sum() + np.abs(P.sum(0) - b).sum() < 1e-14:
            break
    return np.sum(P * C) + eps * np.sum(P * (logP - la[:, None] - lb[None, :]))
)";

// Exact OT by the transport LP (HiGHS), REFERENCES 4a/4b.
const char* kLinprog = R"(
from scipy.optimize import linprog
def ot_lp(x, a, y, b, p):
    C = cdist(x, y) ** p
    n, m = C.shape
    A = np.zeros((n + m, n * m))
    for i in range(n): A[i, i * m:(i + 1) * m] = 1.0
    for j in range(m): A[n + j, j::m] = 1.0
    res = linprog(C.ravel(), A_eq=A, b_eq=np.concatenate([a, b]), bounds=(0, None), method='highs')
    assert res.status == 0
    return res.fun
)";

class SinkhornReferenceTest : public ::testing::TestWithParam<int> {
 protected:
  void SetUp() override {
    if (!test::pythonHas("scipy, numpy")) GTEST_SKIP() << "needs python3-scipy";
  }
};

// Agreement with the NumPy reference to 1e-8 (brief); in practice ~1e-13.
TEST_P(SinkhornReferenceTest, EntropicAndDivergenceMatchTheNumpyReference) {
  const int p = GetParam();
  const Cloud a = weightedCloud(30, 1, 0.0), b = weightedCloud(25, 2, 0.4);
  for (double eps : {0.2, 0.03}) {
    std::ostringstream s;
    s.precision(17);
    s << kNumpySinkhorn << pyPair(a, b) << "eps, p = " << eps << ", " << p << "\n"
      << "ab, aa, bb = ot_eps(x, a, y, b, eps, p), ot_eps(x, a, x, a, eps, p, True), ot_eps(y, b, y, b, eps, p, True)\n"
      << "print(repr(ab)); print(repr(ab - 0.5 * aa - 0.5 * bb))\n";
    std::istringstream in(test::runPython(s.str()));
    double otRef = NAN, divRef = NAN;
    in >> otRef >> divRef;
    const Result ot = run(EntropicMeasure(), a, b, "entropic", eps, p);
    const Result div = run(SinkhornMeasure(), a, b, "sinkhorn", eps, p);
    ASSERT_EQ(ot.status, Status::Ok) << ot.message;
    ASSERT_EQ(div.status, Status::Ok) << div.message;
    EXPECT_NEAR(ot.value, otRef, 1e-8) << "eps " << eps;
    EXPECT_NEAR(div.value, divRef, 1e-8) << "eps " << eps;
  }
}

// REFERENCES 6a: 0 <= OT_ε − OT <= ε·min(H(a), H(b)) [P] Cuturi 2013; bound [D] since
// KL(P‖a⊗b) = H(a) + H(b) − H(P) <= min H. OT from the LP.
// For S_ε this gives [D]: −ε(H(a) + H(b))/2 <= S_ε − OT <= ε·min H, so S_ε → OT as ε → 0
// (REFERENCES 6d).
TEST_P(SinkhornReferenceTest, BracketsTheExactCostAndTendsToItAsEpsilonShrinks) {
  const int p = GetParam();
  const Cloud a = weightedCloud(20, 3, 0.0), b = weightedCloud(16, 4, 0.7);
  std::ostringstream s;
  s << kNumpySinkhorn << kLinprog << pyPair(a, b) << "print(repr(ot_lp(x, a, y, b, " << p << ")))\n";
  const double ot = std::stod(test::runPython(s.str()));
  const double ha = entropy(a), hb = entropy(b);
  double lastGap = INFINITY;
  for (double eps : {1.0, 0.1, 0.01, 0.002}) {
    const Result e = run(EntropicMeasure(), a, b, "entropic", eps, p, 1e-10);
    const Result d = run(SinkhornMeasure(), a, b, "sinkhorn", eps, p, 1e-10);
    ASSERT_EQ(e.status, Status::Ok) << e.message;
    ASSERT_EQ(d.status, Status::Ok) << d.message;
    EXPECT_GE(e.value, ot - 1e-9) << "eps " << eps;
    EXPECT_LE(e.value, ot + eps * std::min(ha, hb) + 1e-9) << "eps " << eps;
    EXPECT_GE(d.value, ot - 0.5 * eps * (ha + hb) - 1e-9) << "eps " << eps;
    EXPECT_LE(d.value, ot + eps * std::min(ha, hb) + 1e-9) << "eps " << eps;
    EXPECT_LT(std::abs(e.value - ot), lastGap) << "eps " << eps;
    lastGap = std::abs(e.value - ot);
  }
  EXPECT_LT(lastGap, 0.002 * std::min(ha, hb) + 1e-9);
}

INSTANTIATE_TEST_SUITE_P(CostPowers, SinkhornReferenceTest, ::testing::Values(1, 2));

// REFERENCES 6d [P] Feydy et al. 2019 (limit ε → ∞); Ramdas, García Trillos, Cuturi 2017:
// S_ε → ½ MMD² with kernel −C. For C = |x−y| that is half the energy distance
// E = 2E|X−Y| − E|X−X'| − E|Y−Y'| (V-statistics, REFERENCES 7c), error ~1/ε; for C = |x−y|²
// it is |m_a − m_b|² [D] (the quadratic parts cancel).
TEST(SinkhornLimitTest, LargeEpsilonGivesHalfTheEnergyDistanceOrTheMeanGap) {
  if (!test::pythonHas("scipy, numpy")) GTEST_SKIP() << "needs python3-scipy";
  const Cloud a = weightedCloud(25, 5, 0.0), b = weightedCloud(20, 6, 0.5);
  const std::string out = test::runPython(
      std::string("import numpy as np\nfrom scipy.spatial.distance import cdist\n") + pyPair(a, b) +
      "print(repr(0.5 * (2 * a @ cdist(x, y) @ b - a @ cdist(x, x) @ a - b @ cdist(y, y) @ b)))\n");
  const double halfEnergy = std::stod(out);
  const double e4 = run(SinkhornMeasure(), a, b, "sinkhorn", 1e4, 1).value;
  const double e5 = run(SinkhornMeasure(), a, b, "sinkhorn", 1e5, 1).value;
  EXPECT_NEAR(e4, halfEnergy, 1e-4 * halfEnergy);
  EXPECT_NEAR(e5, halfEnergy, 1e-5 * halfEnergy);
  EXPECT_LT(std::abs(e5 - halfEnergy), std::abs(e4 - halfEnergy));  // error shrinks like 1/ε

  const double meanGap = (a.mean() - b.mean()).squaredNorm();
  EXPECT_NEAR(run(SinkhornMeasure(), a, b, "sinkhorn", 1e5, 2).value, meanGap, 1e-5 * meanGap);
}

}  // namespace
}  // namespace barrow
