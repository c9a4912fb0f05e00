// The `entropic` measure: settings (auto ε, freezing, keys), plan and potentials, gradient,
// warm start, honest statuses. Values against outside references: sinkhorn_reference_test.cpp.
#include <gtest/gtest.h>

#include <algorithm>
#include <atomic>
#include <cmath>
#include <random>

#include "measures/entropic_measure.h"
#include "measures/evaluate.h"
#include "measures/registry.h"
#include "support/shared_solves_off.h"
#include "support/test_support.h"

namespace barrow {
namespace {

Cloud cloud(int n, unsigned seed, double shiftX) {
  std::mt19937 rng(seed);
  std::uniform_real_distribution<double> u(0.0, 1.0), w(0.2, 1.0);
  Eigen::MatrixX2d p(n, 2);
  Eigen::VectorXd wt(n);
  for (int i = 0; i < n; ++i) {
    p.row(i) << shiftX + u(rng), u(rng);
    wt(i) = w(rng);
  }
  return Cloud("c", p, wt);
}

EvalRequest request(double eps, int p, double tolerance = 1e-12) {
  return test::entropicRequest("entropic", eps, p, tolerance);
}

TEST(EntropicMeasureTest, RegisteredWithTheContractKeys) {
  const Measure* m = MeasureRegistry::instance().find("entropic");
  ASSERT_NE(m, nullptr);
  std::vector<std::string> keys;
  for (const auto& p : m->params()) keys.push_back(p.key);
  for (const char* k : {"entropic.epsilon", "entropic.p", "entropic.max_iterations", "entropic.tolerance"})
    EXPECT_NE(std::find(keys.begin(), keys.end(), k), keys.end()) << k;
}

// The default ε is "auto" = (D/20)^p with D the joint diameter; details give it absolute and
// relative to D^p, and freeze() writes the number so a sweep keeps it.
TEST(EntropicMeasureTest, AutoEpsilonFollowsTheDiameterAndFreezes) {
  const Cloud a = cloud(30, 1, 0.0), b = cloud(20, 2, 2.0);
  const double d = jointDiameter(a, b);
  const EntropicMeasure m;
  for (int p : {1, 2}) {
    EvalRequest req;
    req.params.set("entropic.p", std::to_string(p));
    const Result r = evaluateMeasure(m, a, b, req);
    ASSERT_EQ(r.status, Status::Ok) << r.message;
    EXPECT_NEAR(r.details["epsilon"].get<double>(), std::pow(d / 20.0, p), 1e-15);
    EXPECT_NEAR(r.details["epsilon_relative"].get<double>(), std::pow(1.0 / 20.0, p), 1e-15);
    EXPECT_EQ(r.details["epsilon_rule"], "auto: (D/20)^p");
    const ParamSet frozen = m.freeze(a, b, resolveParams(m, req.params, nullptr));
    EXPECT_NEAR(frozen.real("entropic.epsilon"), std::pow(d / 20.0, p), 1e-15);
    // Moving A does not move a frozen ε.
    Cloud moved = a;
    moved.points *= 3.0;
    EvalRequest again;
    again.params = frozen;
    EXPECT_NEAR(evaluateMeasure(m, moved, b, again).details["epsilon"].get<double>(), std::pow(d / 20.0, p), 1e-15);
  }
}

// Plan entries from the potentials: masses sum to 1 with marginals a and b, and the primal
// objective Σ P (C + ε log(P / (a b))) equals the reported dual value ([P] strong duality,
// Peyré & Cuturi 2019 Prop. 4.4 (mem)).
TEST(EntropicMeasureTest, PlanAndPotentialsCertifyTheValue) {
  const Cloud a = cloud(25, 3, 0.0), b = cloud(18, 4, 0.5);
  for (int p : {1, 2}) {
    EvalRequest req = request(0.02, p);
    req.wantPlan = true;
    const Result r = evaluateMeasure(EntropicMeasure(), a, b, req);
    ASSERT_EQ(r.status, Status::Ok) << r.message;
    ASSERT_EQ(r.u.size(), 25);
    ASSERT_EQ(r.v.size(), 18);
    const Eigen::VectorXd wa = a.normalizedWeights(), wb = b.normalizedWeights();
    Eigen::VectorXd rows = Eigen::VectorXd::Zero(25), cols = Eigen::VectorXd::Zero(18);
    double primal = 0.0;
    for (const PlanEntry& e : r.plan) {
      rows(e.i) += e.mass;
      cols(e.j) += e.mass;
      const double d = (a.point(e.i) - b.point(e.j)).norm();
      primal += e.mass * ((p == 2 ? d * d : d) + 0.02 * std::log(e.mass / (wa(e.i) * wb(e.j))));
    }
    EXPECT_LT((rows - wa).lpNorm<1>(), 1e-9);  // entries below 1e-12 are left out
    EXPECT_LT((cols - wb).lpNorm<1>(), 1e-9);
    EXPECT_NEAR(primal, r.value, 1e-9);
    EXPECT_NEAR(r.value, wa.dot(r.u) + wb.dot(r.v), 1e-12);
    EXPECT_EQ(r.details["plan_entries"].get<std::size_t>(), r.plan.size());
  }
}

TEST(EntropicMeasureTest, WarmStartThroughTheContextSavesWork) {
  // The warm start itself is under test: with the shared store on, the second request on the
  // same clouds would be answered by the first solve (sinkhorn_cache_test.cpp checks that).
  const test::SharedSolvesOff off;
  Cloud a = cloud(80, 7, 0.0);
  const Cloud b = cloud(70, 8, 0.4);
  const EntropicMeasure m;
  std::shared_ptr<WarmState> warm;
  EvalRequest req = request(0.003, 2, 1e-10);
  req.warm = &warm;
  const Result first = evaluateMeasure(m, a, b, req);
  ASSERT_TRUE(warm);
  EXPECT_FALSE(first.details["warm_start"].get<bool>());
  a.points.col(0).array() += 0.005;
  const Result cold = evaluateMeasure(m, a, b, request(0.003, 2, 1e-10));
  const Result hot = evaluateMeasure(m, a, b, req);
  EXPECT_TRUE(hot.details["warm_start"].get<bool>());
  EXPECT_LT(hot.iterations, cold.iterations);
  EXPECT_NEAR(hot.value, cold.value, 1e-9);
  // A different ε does not reuse the state.
  EvalRequest other = request(0.01, 2);
  other.warm = &warm;
  EXPECT_FALSE(evaluateMeasure(m, a, b, other).details["warm_start"].get<bool>());
}

TEST(EntropicMeasureTest, RunningOutOfIterationsIsReportedNotHidden) {
  const Cloud a = cloud(40, 9, 0.0), b = cloud(40, 10, 0.2);
  EvalRequest req = request(1e-4, 1, 1e-10);
  req.params.set("entropic.max_iterations", "5");
  const Result r = evaluateMeasure(EntropicMeasure(), a, b, req);
  EXPECT_EQ(r.status, Status::NotConverged);
  EXPECT_TRUE(std::isfinite(r.value));
  EXPECT_NE(r.message.find("marginal error"), std::string::npos) << r.message;
  EXPECT_GT(r.details["marginal_error"].get<double>(), 1e-10);
  EXPECT_EQ(r.iterations, 5);
}

TEST(EntropicMeasureTest, BadSettingsAndCancellationGiveAStatus) {
  const Cloud a = cloud(10, 11, 0.0), b = cloud(10, 12, 0.2);
  for (const char* bad : {"0", "-1", "abc", "nan"}) {
    EvalRequest req;
    req.params.set("entropic.epsilon", bad);
    const Result r = evaluateMeasure(EntropicMeasure(), a, b, req);
    EXPECT_EQ(r.status, Status::InvalidInput) << bad;
    EXPECT_NE(r.message.find("entropic.epsilon"), std::string::npos) << r.message;
  }
  EvalRequest p3;
  p3.params.set("entropic.p", "3");
  EXPECT_EQ(evaluateMeasure(EntropicMeasure(), a, b, p3).status, Status::InvalidInput);
  Cloud nan = a;
  nan.points(3, 0) = NAN;
  const Result r = evaluateMeasure(EntropicMeasure(), nan, b, {});
  EXPECT_EQ(r.status, Status::InvalidInput);
  EXPECT_NE(r.message.find("row 4"), std::string::npos) << r.message;

  std::atomic<bool> stop{true};
  RunControl c;
  c.cancel = &stop;
  EvalRequest req;
  req.control = &c;
  EXPECT_EQ(evaluateMeasure(EntropicMeasure(), a, b, req).status, Status::Cancelled);
}

// [D] one point each: the only plan is the product, so OT_ε = c(x, y) for every ε.
TEST(EntropicMeasureTest, SinglePointsCostTheirDistance) {
  const Cloud a("a", Eigen::MatrixX2d::Constant(1, 2, 0.5)), b("b", (Eigen::MatrixX2d(1, 2) << 1.5, 2.5).finished());
  for (int p : {1, 2})
    for (double eps : {1e-3, 1.0, 1e3})
      EXPECT_NEAR(evaluateMeasure(EntropicMeasure(), a, b, request(eps, p)).value, p == 2 ? 5.0 : std::sqrt(5.0),
                  1e-12);
}

}  // namespace
}  // namespace barrow
