// Exact W2 at 10^4 + 10^4 points (uniform weights, equal sizes) against SciPy's assignment
// solver on the same points (issue 13). The run's slowest engine test: ~20 s on a loaded
// 2-core machine, most of it SciPy's 10^4 x 10^4 distance matrix and assignment.
#include <gtest/gtest.h>

#include <cmath>
#include <cstdio>
#include <random>
#include <sstream>
#include <string>

#include "measures/evaluate.h"
#include "measures/registry.h"
#include "support/test_support.h"

namespace barrow {
namespace {

// [CP] scipy.optimize.linear_sum_assignment (Debian python3-scipy) on the squared distances:
// for equal sizes and uniform weights the optimal plan may be taken as a permutation
// (Birkhoff 1946 (mem)), so W2² is the optimal assignment's mean cost. B is A moved by
// Gaussian noise of half the points' spacing, which keeps SciPy's solver within seconds
// (a shifted copy takes it minutes) while leaving more than half the points matched to
// another point than their own origin.
TEST(ExactW2AssignmentTest, TenThousandPointsMatchScipyAssignment) {
  if (!test::pythonHas("scipy, numpy")) GTEST_SKIP() << "python3-scipy not available";
  const int n = 10000;
  std::mt19937_64 rng(1301);
  std::uniform_real_distribution<double> u(0.0, 1.0);
  std::normal_distribution<double> z(0.0, 0.005);
  Eigen::MatrixX2d pa(n, 2), pb(n, 2);
  for (int i = 0; i < n; ++i) {
    pa.row(i) << u(rng), u(rng);
    pb.row(i) << pa(i, 0) + z(rng), pa(i, 1) + z(rng);
  }
  std::ostringstream s;
  s.precision(17);
  for (const Eigen::MatrixX2d* p : {&pa, &pb})
    for (int i = 0; i < n; ++i) s << (*p)(i, 0) << " " << (*p)(i, 1) << "\n";
  const std::string path = test::tempPath("w2-assignment.txt");
  test::writeText(path, s.str());
  const std::string out = test::runPython(
      "import numpy as np\n"
      "from scipy.optimize import linear_sum_assignment\n"
      "from scipy.spatial.distance import cdist\n"
      "P = np.loadtxt('" + path + "')\n"
      "n = len(P) // 2\n"
      "C = cdist(P[:n], P[n:], 'sqeuclidean')\n"
      "r, c = linear_sum_assignment(C)\n"
      "print(repr(float(np.sqrt(C[r, c].sum() / n))), float(np.mean(r != c)))\n");
  std::remove(path.c_str());
  std::istringstream ref(out);
  double w2 = NAN, moved = NAN;
  ASSERT_TRUE(ref >> w2 >> moved) << out;
  EXPECT_GT(moved, 0.5) << "the assignment should not be the identity";

  const Measure* m = MeasureRegistry::instance().find("w2");
  ASSERT_NE(m, nullptr);
  EvalRequest req;
  req.params.set("w2.exact_limit", "2000000000");  // exact, whatever the default threshold
  const Result r = evaluateMeasure(*m, Cloud("A", pa), Cloud("B", pb), req);
  ASSERT_EQ(r.status, Status::Ok) << r.message;
  EXPECT_NEAR(r.value, w2, 1e-9 * w2);
  std::printf("[assignment] n=%d scipy W2=%.15g barrow W2=%.15g (%.2f s), %.0f%% of points matched elsewhere\n", n, w2,
              r.value, r.seconds, 100 * moved);
}

}  // namespace
}  // namespace barrow
