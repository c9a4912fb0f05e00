// The `sinkhorn` measure (debiased Sinkhorn divergence): REFERENCES row 6c properties,
// gradient, potentials, warm start, statuses. Values against NumPy/SciPy and the ε limits:
// sinkhorn_reference_test.cpp.
#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <random>

#include "measures/evaluate.h"
#include "measures/registry.h"
#include "support/shared_solves_off.h"
#include "support/test_support.h"
#include "measures/sinkhorn_measure.h"

namespace barrow {
namespace {

Cloud cloud(int n, unsigned seed, double shiftX, double spread = 1.0) {
  std::mt19937 rng(seed);
  std::normal_distribution<double> g(0.0, spread);
  std::uniform_real_distribution<double> w(0.2, 1.0);
  Eigen::MatrixX2d p(n, 2);
  Eigen::VectorXd wt(n);
  for (int i = 0; i < n; ++i) {
    p.row(i) << shiftX + g(rng), g(rng);
    wt(i) = w(rng);
  }
  return Cloud("c", p, wt);
}

EvalRequest request(double eps, int p, double tolerance = 1e-11) {
  return test::entropicRequest("sinkhorn", eps, p, tolerance);
}

// A request for p = 2 that keeps its solver state in `*warm`, after one evaluation on (a, b)
// has filled it: what a sweep holds before its next step.
EvalRequest primedRequest(const Cloud& a, const Cloud& b, double eps, double tolerance, std::shared_ptr<WarmState>* warm) {
  EvalRequest req = request(eps, 2, tolerance);
  req.warm = warm;
  evaluateMeasure(SinkhornMeasure(), a, b, req);
  return req;
}

double divergence(const Cloud& a, const Cloud& b, double eps, int p) {
  const Result r = evaluateMeasure(SinkhornMeasure(), a, b, request(eps, p));
  EXPECT_EQ(r.status, Status::Ok) << r.message;
  return r.value;
}

TEST(SinkhornMeasureTest, RegisteredWithTheContractKeys) {
  const Measure* m = MeasureRegistry::instance().find("sinkhorn");
  ASSERT_NE(m, nullptr);
  std::vector<std::string> keys;
  for (const auto& p : m->params()) keys.push_back(p.key);
  for (const char* k : {"sinkhorn.epsilon", "sinkhorn.p", "sinkhorn.max_iterations", "sinkhorn.tolerance"})
    EXPECT_NE(std::find(keys.begin(), keys.end(), k), keys.end()) << k;
}

// REFERENCES 6c [P] Feydy et al. 2019 Thm 1: S_ε(A, A) = 0.
TEST(SinkhornMeasureTest, VanishesOnIdenticalClouds) {
  const Cloud a = cloud(60, 1, 0.0);
  for (int p : {1, 2})
    for (double eps : {1.0, 0.05, 0.002}) EXPECT_NEAR(divergence(a, a, eps, p), 0.0, 1e-9) << p << " " << eps;
}

// REFERENCES 6c [P] Feydy et al. 2019 Thm 1: S_ε >= 0 (positive definite for these costs).
TEST(SinkhornMeasureTest, NonNegativeOnRandomPairs) {
  for (unsigned seed = 0; seed < 20; ++seed) {
    const Cloud a = cloud(15 + seed, 100 + seed, 0.0, 1.0), b = cloud(20, 200 + seed, 0.1 * seed, 0.5 + 0.1 * seed);
    const int p = 1 + seed % 2;
    const double eps = seed % 3 == 0 ? 0.01 : (seed % 3 == 1 ? 0.3 : 5.0);
    EXPECT_GE(divergence(a, b, eps, p), -1e-12) << "seed " << seed;
  }
}

// REFERENCES 6c: for two Diracs S_ε = C(x, y) for all ε [D] (every OT_ε term is its cost:
// the only plan is the product).
TEST(SinkhornMeasureTest, DiracPairCostsTheGroundCost) {
  const Cloud a("a", (Eigen::MatrixX2d(1, 2) << 0.2, -0.3).finished());
  const Cloud b("b", (Eigen::MatrixX2d(1, 2) << 1.4, 0.6).finished());
  const double d = (a.point(0) - b.point(0)).norm();
  for (int p : {1, 2})
    for (double eps : {0.01, 1.0, 100.0}) EXPECT_NEAR(divergence(a, b, eps, p), p == 2 ? d * d : d, 1e-12);
}

// [D] The debiased potentials u = f_ab − f_aa, v = g_ab − g_bb: for identical clouds the two
// problems coincide, so u and v are constants summing to zero (the (f + k, g − k) freedom).
TEST(SinkhornMeasureTest, DebiasedPotentialsAreFlatOnIdenticalClouds) {
  const Cloud a = cloud(30, 7, 0.0);
  const Result r = evaluateMeasure(SinkhornMeasure(), a, a, request(0.05, 2));
  ASSERT_EQ(r.u.size(), 30);
  EXPECT_LT(r.u.maxCoeff() - r.u.minCoeff(), 1e-8);
  EXPECT_LT(r.v.maxCoeff() - r.v.minCoeff(), 1e-8);
  EXPECT_NEAR(r.u(0) + r.v(0), 0.0, 1e-8);
  EXPECT_NEAR(r.details["ot_ab"].get<double>(), r.details["ot_aa"].get<double>(), 1e-9);
}

// A sweep step: the state left in ctx.warm makes the next evaluation cheaper and the same as
// a cold solve of the moved clouds (the cold solve is the reference; common practice).
TEST(SinkhornMeasureTest, WarmStartThroughTheContext) {
  // The warm start itself is under test: with the shared store on, the second request on the
  // same clouds would be answered by the first solve (sinkhorn_cache_test.cpp checks that).
  const test::SharedSolvesOff off;
  Cloud a = cloud(70, 8, 0.0);
  const Cloud b = cloud(60, 9, 0.5);
  std::shared_ptr<WarmState> warm;
  const EvalRequest req = primedRequest(a, b, 0.01, 1e-9, &warm);
  a.points.col(0).array() += 0.01;
  const Result cold = evaluateMeasure(SinkhornMeasure(), a, b, request(0.01, 2, 1e-9));
  const Result hot = evaluateMeasure(SinkhornMeasure(), a, b, req);
  EXPECT_TRUE(hot.details["ab_warm_start"].get<bool>());
  // A shift moves A rigidly and B stays: both self terms are taken over, not solved again.
  EXPECT_TRUE(hot.details["aa_reused"].get<bool>());
  EXPECT_TRUE(hot.details["bb_reused"].get<bool>());
  EXPECT_FALSE(cold.details["aa_reused"].get<bool>());
  EXPECT_LT(hot.iterations, cold.iterations);
  EXPECT_NEAR(hot.value, cold.value, 1e-9);
}

// Self terms depend only on distances within a cloud (the cost is |x−y|^p), so a rotated A
// keeps OT_ε(a, a) and its potentials point by point; a stretched A does not [D]; the reused
// values are checked against a cold solve of the moved clouds.
TEST(SinkhornMeasureTest, SelfTermReusedOnlyAfterARigidMove) {
  const Cloud a = cloud(50, 14, 0.0);
  const Cloud b = cloud(40, 15, 0.7);
  std::shared_ptr<WarmState> warm;
  const EvalRequest req = primedRequest(a, b, 0.05, 1e-10, &warm);

  const double t = 0.4;  // radians, about the origin
  Cloud rotated = a;
  rotated.points.col(0) = std::cos(t) * a.points.col(0) - std::sin(t) * a.points.col(1);
  rotated.points.col(1) = std::sin(t) * a.points.col(0) + std::cos(t) * a.points.col(1);
  const Result hot = evaluateMeasure(SinkhornMeasure(), rotated, b, req);
  const Result cold = evaluateMeasure(SinkhornMeasure(), rotated, b, request(0.05, 2, 1e-10));
  EXPECT_TRUE(hot.details["aa_reused"].get<bool>());
  EXPECT_NEAR(hot.details["ot_aa"].get<double>(), cold.details["ot_aa"].get<double>(), 1e-9);
  EXPECT_NEAR(hot.value, cold.value, 1e-9);
  // Potentials agree up to the additive constant the dual leaves free.
  const Eigen::VectorXd du = hot.u - cold.u;
  EXPECT_LT((du.array() - du.mean()).abs().maxCoeff(), 1e-7);

  Cloud stretched = rotated;
  stretched.points.col(0) *= 1.05;
  const Result moved = evaluateMeasure(SinkhornMeasure(), stretched, b, req);
  EXPECT_FALSE(moved.details["aa_reused"].get<bool>());
  EXPECT_TRUE(moved.details["aa_warm_start"].get<bool>());  // solved, from the old potentials
  EXPECT_NEAR(moved.value, evaluateMeasure(SinkhornMeasure(), stretched, b, request(0.05, 2, 1e-10)).value, 1e-9);
}

TEST(SinkhornMeasureTest, RunningOutOfIterationsNamesTheTerm) {
  const Cloud a = cloud(40, 10, 0.0), b = cloud(40, 11, 0.3);
  EvalRequest req = request(1e-4, 1, 1e-12);
  req.params.set("sinkhorn.max_iterations", "4");
  const Result r = evaluateMeasure(SinkhornMeasure(), a, b, req);
  EXPECT_EQ(r.status, Status::NotConverged);
  EXPECT_NE(r.message.find("OT_eps(A,B)"), std::string::npos) << r.message;
  EXPECT_NE(r.message.find("marginal error"), std::string::npos) << r.message;
}

TEST(SinkhornMeasureTest, BadSettingsGiveAReason) {
  const Cloud a = cloud(10, 12, 0.0), b = cloud(10, 13, 0.2);
  EvalRequest req;
  req.params.set("sinkhorn.epsilon", "-0.1");
  const Result r = evaluateMeasure(SinkhornMeasure(), a, b, req);
  EXPECT_EQ(r.status, Status::InvalidInput);
  EXPECT_NE(r.message.find("sinkhorn.epsilon"), std::string::npos) << r.message;
}

}  // namespace
}  // namespace barrow
