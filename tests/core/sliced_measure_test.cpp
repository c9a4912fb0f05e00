// Sliced Wasserstein (REFERENCES rows 1i, 8a, 8c; 1-D parts in ot_1d_test.cpp).
#include <gtest/gtest.h>

#include <atomic>
#include <cmath>
#include <cstring>
#include <random>
#include <sstream>

#include "measures/evaluate.h"
#include "measures/registry.h"
#include "measures/sliced_measure.h"
#include "support/test_support.h"
#include "transport/ot_1d.h"

namespace barrow {
namespace {

Cloud randomCloud(int n, unsigned seed, double shiftX = 0.0, bool weighted = true) {
  std::mt19937 rng(seed);
  std::normal_distribution<double> g(0.0, 1.0);
  std::uniform_real_distribution<double> w(0.2, 1.0);
  Eigen::MatrixX2d p(n, 2);
  Eigen::VectorXd wt(n);
  for (int i = 0; i < n; ++i) {
    const double x = g(rng);
    p.row(i) << shiftX + x, 0.5 * g(rng) + 0.3 * x;  // correlated, so no axis is special
    wt(i) = weighted ? w(rng) : 1.0;
  }
  return Cloud("c", p, wt);
}

Result sliced(const Cloud& a, const Cloud& b, int directions, int p) {
  EvalRequest req;
  req.params.set("sliced.directions", std::to_string(directions));
  req.params.set("sliced.p", std::to_string(p));
  return evaluateMeasure(SlicedMeasure(), a, b, req);
}

// REFERENCES 8a [P] Rabin et al. 2011; values [D]: a translation by t projects to a 1-D shift by
// ⟨t, θ⟩, so SW2² = |t|² mean cos²(φ − φ_t) = |t|²/2 exactly for the midpoint angles (a degree-2
// trigonometric polynomial, integrated exactly for K >= 2), and SW1 = |t| mean|cos| → 2|t|/π.
TEST(SlicedMeasureTest, TranslationGivesTheClosedForms) {
  const Cloud a = randomCloud(300, 1);
  Cloud b = a;
  const Eigen::RowVector2d t(0.7, -0.4);
  b.points.rowwise() += t;
  for (int k : {2, 3, 16, 64}) EXPECT_NEAR(sliced(a, b, k, 2).value, t.norm() / std::sqrt(2.0), 1e-12) << k;
  // Midpoint rule for mean|cos|: error O(1/K²); 1e-6 at K = 2000 (REFERENCES 8a: 1e-6 at 720).
  EXPECT_NEAR(sliced(a, b, 2000, 1).value, 2.0 * t.norm() / M_PI, 1e-6);
}

// REFERENCES 1i: the parallel lines P0 = (0, Z), Pθ = (θ, Z): SW1 = 2|θ|/π, SW2 = |θ|/√2 [D].
TEST(SlicedMeasureTest, ParallelLines) {
  std::mt19937 rng(2);
  std::uniform_real_distribution<double> u(0.0, 1.0);
  Eigen::MatrixX2d p(400, 2);
  for (int i = 0; i < 400; ++i) p.row(i) << 0.0, u(rng);
  const Cloud a("a", p);
  for (double theta : {1e-3, 0.3, 2.0}) {
    Cloud b = a;
    b.points.col(0).array() += theta;
    EXPECT_NEAR(sliced(a, b, 64, 2).value, theta / std::sqrt(2.0), 1e-12 * (1 + theta));
    EXPECT_NEAR(sliced(a, b, 2000, 1).value, 2.0 * theta / M_PI, 1e-6 * theta);
  }
}

// REFERENCES 8c: SW2 <= W2/√2 and SW1 <= W1 [D] (Jensen on the optimal coupling: projecting it
// gives a coupling of every pair of projections), W_p from scipy.optimize.linear_sum_assignment
// on equal-size uniform clouds ([P] Birkhoff 1946: the LP optimum is a permutation).
TEST(SlicedMeasureTest, BoundedByTheExactDistances) {
  if (!test::pythonHas("scipy, numpy")) GTEST_SKIP() << "needs python3-scipy";
  for (unsigned seed = 10; seed < 15; ++seed) {
    const Cloud a = randomCloud(60, seed, 0.0, false), b = randomCloud(60, seed + 100, 0.8, false);
    const std::string out = test::runPython(
        "import numpy as np\nfrom scipy.optimize import linear_sum_assignment\n"
        "from scipy.spatial.distance import cdist\n"
        "x, y = " + test::pyPoints(a) + ", " + test::pyPoints(b) + "\n"
        "d = cdist(x, y)\n"
        "r, c = linear_sum_assignment(d); print(repr(d[r, c].mean()))\n"
        "r, c = linear_sum_assignment(d ** 2); print(repr(np.sqrt((d[r, c] ** 2).mean())))\n");
    std::istringstream in(out);
    double w1 = NAN, w2 = NAN;
    in >> w1 >> w2;
    const double sw1 = sliced(a, b, 180, 1).value, sw2 = sliced(a, b, 180, 2).value;
    EXPECT_LE(sw2, w2 / std::sqrt(2.0) + 1e-12) << "seed " << seed;
    EXPECT_LE(sw1, w1 + 1e-12) << "seed " << seed;
    EXPECT_GT(sw2, 0.2 * w2) << "seed " << seed;  // and not trivially small
  }
}

// One direction (K = 1 uses φ = π/2, the y axis): the value is the weighted 1-D distance of the
// y coordinates, scipy.stats.wasserstein_distance for p = 1 (REFERENCES 3a).
TEST(SlicedMeasureTest, OneDirectionIsTheProjectedOneDimensionalDistance) {
  if (!test::pythonHas("scipy, numpy")) GTEST_SKIP() << "needs python3-scipy";
  const Cloud a = randomCloud(37, 20), b = randomCloud(23, 21, 0.5);
  const std::string out = test::runPython(
      "import numpy as np\nfrom scipy.stats import wasserstein_distance\n"
      "x, y = " + test::pyPoints(a) + ", " + test::pyPoints(b) + "\n"
      "print(repr(wasserstein_distance(x[:, 1], y[:, 1], " + test::pyWeights(a) + ", " + test::pyWeights(b) + ")))\n");
  EXPECT_NEAR(sliced(a, b, 1, 1).value, std::stod(out), 1e-12);
}

// [D] SW is a distance: 0 on identical clouds, symmetric, and blind to the order of points.
TEST(SlicedMeasureTest, ZeroOnIdenticalCloudsAndSymmetric) {
  const Cloud a = randomCloud(50, 30), b = randomCloud(40, 31, 1.0);
  EXPECT_NEAR(sliced(a, a, 64, 2).value, 0.0, 1e-15);
  EXPECT_NEAR(sliced(a, b, 64, 2).value, sliced(b, a, 64, 2).value, 1e-14);
  Cloud shuffled = a;
  shuffled.points = a.points.colwise().reverse();
  shuffled.weights = a.weights.reverse();
  EXPECT_NEAR(sliced(shuffled, b, 64, 1).value, sliced(a, b, 64, 1).value, 1e-14);
}

// Large clouds are split over the cores in blocks of directions; the value must equal the
// plain sum over directions of the 1-D solver's W2² [D] (the definition, one direction at a time).
TEST(SlicedMeasureTest, BlocksOnBothCoresGiveTheDirectSum) {
  const Cloud a = randomCloud(3000, 50), b = randomCloud(2500, 51, 0.3);
  const int k = 100;
  const Eigen::VectorXd wa = a.normalizedWeights(), wb = b.normalizedWeights();
  Ot1dSolver solver;
  double sum = 0.0;
  for (int d = 0; d < k; ++d) {
    const double phi = (d + 0.5) * M_PI / k;
    const Eigen::VectorXd pa = a.points * Eigen::Vector2d(std::cos(phi), std::sin(phi));
    const Eigen::VectorXd pb = b.points * Eigen::Vector2d(std::cos(phi), std::sin(phi));
    sum += solver.solve(pa.data(), wa.data(), 3000, pb.data(), wb.data(), 2500, 2.0);
  }
  EXPECT_NEAR(sliced(a, b, k, 2).value, std::sqrt(sum / k), 1e-14);
}

TEST(SlicedMeasureTest, CancelledAndBadParameters) {
  const Cloud a = randomCloud(20, 60), b = randomCloud(20, 61);
  std::atomic<bool> stop{true};
  RunControl c;
  c.cancel = &stop;
  EvalRequest req;
  req.control = &c;
  EXPECT_EQ(evaluateMeasure(SlicedMeasure(), a, b, req).status, Status::Cancelled);
  EvalRequest bad;
  bad.params.set("sliced.directions", "0");
  Result r = evaluateMeasure(SlicedMeasure(), a, b, bad);
  EXPECT_EQ(r.status, Status::InvalidInput);
  EXPECT_NE(r.message.find("sliced.directions"), std::string::npos) << r.message;
  bad.params.set("sliced.directions", "8");
  bad.params.set("sliced.p", "3");
  r = evaluateMeasure(SlicedMeasure(), a, b, bad);
  EXPECT_EQ(r.status, Status::InvalidInput);
  EXPECT_NE(r.message.find("sliced.p"), std::string::npos) << r.message;
}

TEST(SlicedMeasureTest, RegisteredWithTheContractKeys) {
  const Measure* m = MeasureRegistry::instance().find("sliced");
  ASSERT_NE(m, nullptr);
  std::vector<std::string> keys;
  for (const auto& p : m->params()) keys.push_back(p.key);
  EXPECT_NE(std::find(keys.begin(), keys.end(), "sliced.directions"), keys.end());
  EXPECT_NE(std::find(keys.begin(), keys.end(), "sliced.p"), keys.end());
  const Result r = evaluateMeasure(*m, randomCloud(10, 70), randomCloud(10, 71), {});
  EXPECT_EQ(r.status, Status::Ok);
  EXPECT_EQ(r.details["directions"], 64);
}

// [D] each direction's W_p^p depends only on its index and the sum runs in direction order, so
// the value may not depend on how many threads computed the directions: bit for bit equal,
// weighted and unweighted, unequal sizes, p = 1 and 2. Large enough for the team to start.
TEST(SlicedMeasureTest, OneAndTwoThreadsGiveTheSameBits) {
  for (bool weighted : {true, false}) {
    const Cloud a = randomCloud(20000, 80, 0.0, weighted), b = randomCloud(13000, 81, 0.4, weighted);
    for (int p : {1, 2}) {
      double value[2] = {0, 0};
      for (int threads : {1, 2}) {
        RunControl c;
        c.threads = threads;
        EvalRequest req;
        req.control = &c;
        req.params.set("sliced.directions", "37");
        req.params.set("sliced.p", std::to_string(p));
        const Result r = evaluateMeasure(SlicedMeasure(), a, b, req);
        ASSERT_EQ(r.status, Status::Ok) << r.message;
        value[threads - 1] = r.value;
      }
      EXPECT_EQ(std::memcmp(&value[0], &value[1], sizeof(double)), 0)
          << "weighted " << weighted << " p " << p << ": " << value[0] << " vs " << value[1];
      EXPECT_GT(value[0], 0.0);
    }
  }
}

}  // namespace
}  // namespace barrow
