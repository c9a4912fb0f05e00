// The exact solver against SciPy (Debian python3-scipy, run through /usr/bin/python3):
// scipy.optimize.linear_sum_assignment for equal-size uniform clouds, linprog(method='highs')
// on the transport LP otherwise, and scipy.stats.wasserstein_distance for 1-D data placed
// on a line in the plane. Instances are written to one file and solved in one Python run.
#include <gtest/gtest.h>

#include <cmath>
#include <cstdio>
#include <random>
#include <sstream>

#include "transport/exact_certificate.h"
#include "transport/exact_ot.h"
#include "support/test_support.h"

namespace barrow {
namespace {

enum class Shape { Uniform, Clustered, Collinear, Duplicates, ZeroWeights };

// Instance t of the batch: the shape cycles, sizes vary, one in four is equal-size with
// uniform weights (an assignment problem); the large ones (200..300 points) are assignment
// problems but one, a weighted 300 x 220 LP (HiGHS needs seconds for it).
struct Instance {
  Cloud a, b;
  bool assignment = false;
};

Cloud makeCloud(Shape shape, int n, bool uniform, std::mt19937_64& rng) {
  std::uniform_real_distribution<double> u(0.0, 1.0);
  std::normal_distribution<double> z(0.0, 0.05);
  Eigen::MatrixX2d p(n, 2);
  Eigen::VectorXd w = Eigen::VectorXd::Ones(n);
  const double angle = 3.0 * u(rng), ox = u(rng), oy = u(rng);
  for (int i = 0; i < n; ++i) {
    switch (shape) {
      case Shape::Uniform:
      case Shape::ZeroWeights: p.row(i) << u(rng), u(rng); break;
      case Shape::Clustered: {
        const int c = int(3 * u(rng));
        p.row(i) << 0.2 + 0.3 * c + z(rng), 0.5 + 0.2 * (c - 1) + z(rng);
        break;
      }
      case Shape::Collinear: {
        const double t = u(rng);
        p.row(i) << ox + t * std::cos(angle), oy + t * std::sin(angle);
        break;
      }
      case Shape::Duplicates: p.row(i) << std::floor(4 * u(rng)) / 4, std::floor(4 * u(rng)) / 4; break;
    }
    if (!uniform) w(i) = 0.05 + u(rng);
    if (shape == Shape::ZeroWeights && i % 3 == 1 && n > 1) w(i) = 0.0;
  }
  return Cloud("", p, w);
}

std::vector<Instance> batch(int count) {
  std::mt19937_64 rng(20240611);
  std::uniform_int_distribution<int> small(1, 60);
  std::vector<Instance> out;
  for (int t = 0; t < count; ++t) {
    const auto shape = Shape(t % 5);
    const bool largeLp = t == 13;
    const bool large = t % 40 == 7 || largeLp;
    const bool assignment = (t % 4 == 0 || large) && shape != Shape::ZeroWeights && !largeLp;
    const int n = largeLp ? 300 : large ? 200 + t % 100 : small(rng);
    const int m = assignment ? n : largeLp ? 220 : small(rng);
    Instance in;
    in.a = makeCloud(shape, n, assignment, rng);
    in.b = makeCloud(shape == Shape::ZeroWeights ? Shape::Uniform : shape, m, assignment, rng);
    in.assignment = assignment;
    out.push_back(std::move(in));
  }
  return out;
}

// Writes "kind n m" then the points and normalised weights of both sides, one instance per
// block, for the Python reference below.
std::string writeBatch(const std::vector<Instance>& all) {
  std::ostringstream s;
  s.precision(17);
  for (const auto& in : all) {
    s << (in.assignment ? "lsa" : "lp") << " " << in.a.size() << " " << in.b.size() << "\n";
    for (const Cloud* c : {&in.a, &in.b}) {
      const Eigen::VectorXd w = c->normalizedWeights();
      for (Eigen::Index i = 0; i < c->size(); ++i) s << c->points(i, 0) << " " << c->points(i, 1) << " " << w(i) << "\n";
    }
  }
  const std::string path = test::tempPath("ot-batch.txt");
  test::writeText(path, s.str());
  return path;
}

// [CP] reference optimum of the discrete transport LP for costs |x-y| and |x-y|^2, printed
// as W1 and W2 (sqrt of the optimal cost).
const char* kReferenceScript = R"PY(
import sys, numpy as np
from scipy.optimize import linear_sum_assignment, linprog
from scipy.sparse import coo_matrix
from scipy.spatial.distance import cdist
lines = open(sys.argv[1]).read().split("\n")
k = 0
while k < len(lines) and lines[k]:
    kind, n, m = lines[k].split(); n = int(n); m = int(m); k += 1
    A = np.array([[float(t) for t in lines[k + i].split()] for i in range(n)]); k += n
    B = np.array([[float(t) for t in lines[k + j].split()] for j in range(m)]); k += m
    out = []
    for p in (1, 2):
        C = cdist(A[:, :2], B[:, :2]) ** p
        if kind == "lsa":
            r, c = linear_sum_assignment(C)
            cost = C[r, c].sum() / n
        else:
            rows = np.concatenate([np.repeat(np.arange(n), m), n + np.tile(np.arange(m), n)])
            cols = np.concatenate([np.arange(n * m), np.arange(n * m)])
            Aeq = coo_matrix((np.ones(2 * n * m), (rows, cols)), shape=(n + m, n * m))
            res = linprog(C.ravel(), A_eq=Aeq, b_eq=np.concatenate([A[:, 2], B[:, 2]]), bounds=(0, None), method="highs",
                          options=dict(primal_feasibility_tolerance=1e-10, dual_feasibility_tolerance=1e-10))
            assert res.status == 0, res.message
            cost = res.fun
        out.append(repr(cost ** (1.0 / p)))
    print(" ".join(out))
)PY";

// [CP] SciPy linprog (HiGHS, feasibility tolerances tightened to 1e-10: at its defaults of
// 1e-7 it stops up to 3e-9 above the certified optimum) / linear_sum_assignment on 240
// instances of five shapes (uniform, clustered, collinear, repeated points, zero weights),
// sizes 1..300; relative agreement 1e-9, and every solve certified. [P] Birkhoff 1946 (mem)
// for the assignment case.
TEST(NetworkSimplexScipyTest, AgreesWithScipyOnVariedInstances) {
  if (!test::pythonHas("scipy, numpy")) GTEST_SKIP() << "python3-scipy not available";
  const auto all = batch(240);
  const std::string path = writeBatch(all);
  std::string script = std::string("import sys\nsys.argv = ['', '") + path + "']\n" + kReferenceScript;
  std::istringstream ref(test::runPython(script));
  std::remove(path.c_str());
  int compared = 0;
  for (std::size_t t = 0; t < all.size(); ++t) {
    double w[2];
    ASSERT_TRUE(ref >> w[0] >> w[1]) << "no reference for instance " << t;
    for (int k = 0; k < 2; ++k) {
      ExactOtOptions o;
      o.p = k + 1;
      const auto r = solveExactOt(all[t].a, all[t].b, o);
      ASSERT_EQ(r.status, ExactOtStatus::Optimal) << r.message;
      EXPECT_NEAR(r.value, w[k], 1e-9 * std::max(w[k], 1e-12)) << "instance " << t << " p=" << o.p;
      const auto cert = certifyTransport(all[t].a, all[t].b, o.p, r.plan, r.u, r.v);
      EXPECT_EQ(certificateFailure(cert), "") << "instance " << t;
      ++compared;
    }
  }
  EXPECT_EQ(compared, 480);
}

// 1-D data on a line at an angle, with an offset: the plane problem equals the 1-D one.
// [P] scipy.stats.wasserstein_distance (W1 = ∫|F − G|, Vallender 1973 (mem)) for W1; for
// W2 the quantile formula W2² = ∫₀¹ |F⁻¹ − G⁻¹|² (Villani 2003, Thm 2.18 (mem)).
TEST(NetworkSimplexScipyTest, OneDimensionalDataOnAnyLineMatchesScipy) {
  if (!test::pythonHas("scipy, numpy")) GTEST_SKIP() << "python3-scipy not available";
  std::mt19937_64 rng(7);
  std::uniform_real_distribution<double> u(0.0, 1.0);
  std::ostringstream py;
  py.precision(17);
  py << "import numpy as np\nfrom scipy.stats import wasserstein_distance\n"
        "def w2(x, y, a, b):\n"
        "    a = np.asarray(a) / np.sum(a); b = np.asarray(b) / np.sum(b)\n"
        "    ix = np.argsort(x); iy = np.argsort(y)\n"
        "    qa = np.cumsum(a[ix]); qb = np.cumsum(b[iy])\n"
        "    cuts = np.unique(np.concatenate([[0.0], qa, qb]))\n"
        "    cuts = cuts[cuts <= 1.0]\n"
        "    mids = (cuts[:-1] + cuts[1:]) / 2\n"
        "    fx = np.asarray(x)[ix][np.minimum(np.searchsorted(qa, mids), len(x) - 1)]\n"
        "    fy = np.asarray(y)[iy][np.minimum(np.searchsorted(qb, mids), len(y) - 1)]\n"
        "    return np.sqrt(np.sum(np.diff(cuts) * (fx - fy) ** 2))\n";
  struct Case {
    Cloud a, b;
  };
  std::vector<Case> cases;
  for (int t = 0; t < 8; ++t) {
    const int n = 3 + 5 * t, m = 2 + 7 * t;
    const double angle = 0.4 * t + 0.1, ox = 3 * u(rng) - 1, oy = 3 * u(rng) - 1;
    std::vector<double> x(static_cast<std::size_t>(n)), y(static_cast<std::size_t>(m));
    std::vector<double> wa(x.size()), wb(y.size());
    for (auto& s : x) s = 4 * u(rng);
    for (auto& s : y) s = 4 * u(rng) + 0.5;
    for (auto& s : wa) s = 0.1 + u(rng);
    for (auto& s : wb) s = 0.1 + u(rng);
    auto place = [&](const std::vector<double>& s, const std::vector<double>& w) {
      Eigen::MatrixX2d p(Eigen::Index(s.size()), 2);
      for (std::size_t i = 0; i < s.size(); ++i) p.row(Eigen::Index(i)) << ox + s[i] * std::cos(angle), oy + s[i] * std::sin(angle);
      return Cloud("", p, Eigen::Map<const Eigen::VectorXd>(w.data(), Eigen::Index(w.size())));
    };
    cases.push_back({place(x, wa), place(y, wb)});
    auto list = [&](const std::vector<double>& v) {
      std::ostringstream s;
      s.precision(17);
      s << "[";
      for (double q : v) s << q << ",";
      s << "]";
      return s.str();
    };
    py << "x, y, a, b = " << list(x) << ", " << list(y) << ", " << list(wa) << ", " << list(wb) << "\n"
       << "print(repr(wasserstein_distance(x, y, a, b)), repr(w2(x, y, a, b)))\n";
  }
  std::istringstream ref(test::runPython(py.str()));
  for (const auto& c : cases) {
    double w1, w2;
    ASSERT_TRUE(ref >> w1 >> w2);
    ExactOtOptions o;
    EXPECT_NEAR(solveExactOt(c.a, c.b, o).value, w1, 1e-10 * w1);
    o.p = 2;
    EXPECT_NEAR(solveExactOt(c.a, c.b, o).value, w2, 1e-10 * w2);
  }
}

}  // namespace
}  // namespace barrow
