// The w1 and w2 measures behind the Measure interface: registry entries, result fields,
// warm starts through EvalContext, statuses, and the envelope-theorem gradient.
#include <gtest/gtest.h>

#include <atomic>
#include <cmath>
#include <random>

#include "measures/evaluate.h"
#include "measures/registry.h"
#include "transport/exact_ot.h"

namespace barrow {
namespace {

Cloud scatter(int n, std::uint64_t seed, double dx = 0.0) {
  std::mt19937_64 rng(seed);
  std::normal_distribution<double> z(0.0, 1.0);
  std::uniform_real_distribution<double> w(0.5, 2.0);
  Eigen::MatrixX2d p(n, 2);
  Eigen::VectorXd wt(n);
  for (int i = 0; i < n; ++i) {
    p.row(i) << z(rng) + dx, 0.5 * z(rng);
    wt(i) = w(rng);
  }
  return Cloud("", p, wt);
}

const Measure& measure(const char* id) {
  const Measure* m = MeasureRegistry::instance().find(id);
  EXPECT_NE(m, nullptr) << id;
  return *m;
}

TEST(WassersteinMeasureTest, RegisteredFirstWithNamesAndFormulas) {
  const auto& all = MeasureRegistry::instance().all();
  ASSERT_GE(all.size(), 2u);
  EXPECT_EQ(all[0]->id(), "w1");
  EXPECT_EQ(all[1]->id(), "w2");
  for (const char* id : {"w1", "w2"}) {
    EXPECT_FALSE(measure(id).displayName().empty());
    EXPECT_FALSE(measure(id).formula().empty());
  }
}

// Result fields: value as solveExactOt gives it (w2 = sqrt of the cost), potentials always,
// the plan only when asked, pivots as iterations, and the documented details.
TEST(WassersteinMeasureTest, ResultCarriesValuePotentialsPlanAndDetails) {
  const Cloud a = scatter(80, 1), b = scatter(60, 2, 0.7);
  for (int p : {1, 2}) {
    const Measure& m = measure(p == 1 ? "w1" : "w2");
    EvalRequest req;
    const Result r = evaluateMeasure(m, a, b, req);
    ASSERT_EQ(r.status, Status::Ok) << r.message;
    const auto s = solveExactOt(a, b, exactOtOptionsFor(p));  // the options the measure uses
    EXPECT_DOUBLE_EQ(r.value, s.value);
    if (p == 2) {
      EXPECT_NEAR(r.value * r.value, s.cost, 1e-14);
    }
    EXPECT_TRUE(r.plan.empty());
    EXPECT_EQ(r.u.size(), a.size());
    EXPECT_EQ(r.v.size(), b.size());
    EXPECT_EQ(r.iterations, s.pivots);
    EXPECT_EQ(r.details["solver"], "network-simplex");
    EXPECT_EQ(r.details["cost"], p == 1 ? "|x-y|" : "|x-y|^2");
    EXPECT_EQ(r.details["warm_start"], false);
    EXPECT_TRUE(r.details.contains("pivots"));
    EXPECT_TRUE(r.details.contains("plan_unique"));
    req.wantPlan = true;
    const Result withPlan = evaluateMeasure(m, a, b, req);
    EXPECT_FALSE(withPlan.plan.empty());
    EXPECT_LE(withPlan.plan.size(), std::size_t(a.size() + b.size() - 1));
    double total = 0;
    for (const auto& e : withPlan.plan) total += e.mass;
    EXPECT_NEAR(total, 1.0, 1e-14);
  }
}

TEST(WassersteinMeasureTest, WarmStartThroughTheContextSlot) {
  const Cloud a = scatter(300, 3), b = scatter(300, 4, 0.2);
  std::shared_ptr<WarmState> slot;
  EvalRequest req;
  req.warm = &slot;
  const Result first = evaluateMeasure(measure("w2"), a, b, req);
  EXPECT_EQ(first.details["warm_start"], false);
  ASSERT_NE(slot, nullptr);
  Cloud moved = a;
  moved.points.col(0).array() += 0.03;
  const Result warm = evaluateMeasure(measure("w2"), moved, b, req);
  EXPECT_EQ(warm.details["warm_start"], true);
  EXPECT_NEAR(warm.value, evaluateMeasure(measure("w2"), moved, b, EvalRequest{}).value, 1e-13);
}

TEST(WassersteinMeasureTest, BadInputAndCancelBecomeStatuses) {
  Cloud a = scatter(10, 5);
  a.points(3, 1) = NAN;
  const Result bad = evaluateMeasure(measure("w1"), a, scatter(10, 6), EvalRequest{});
  EXPECT_EQ(bad.status, Status::InvalidInput);
  EXPECT_NE(bad.message.find("row 4"), std::string::npos) << bad.message;
  std::atomic<bool> stop{true};
  RunControl ctl;
  ctl.cancel = &stop;
  EvalRequest req;
  req.control = &ctl;
  EXPECT_EQ(evaluateMeasure(measure("w2"), scatter(50, 7), scatter(50, 8), req).status, Status::Cancelled);
}

// [D] Envelope theorem: with a unique optimal plan, W_p is differentiable in x_i and its
// gradient is the plan-weighted derivative of the cost; checked against central differences
// of the measure itself (step 1e-6, the plan does not change within it).
TEST(WassersteinMeasureTest, GradientMatchesFiniteDifferences) {
  const Cloud a = scatter(25, 9), b = scatter(30, 10, 0.4);
  for (const char* id : {"w1", "w2"}) {
    const Measure& m = measure(id);
    EvalRequest req;
    req.wantPlan = true;
    const Result r = evaluateMeasure(m, a, b, req);
    ASSERT_EQ(r.details["plan_unique"], true) << id;
    EvalContext ctx;
    const auto g = m.gradientA(a, b, ctx, r);
    ASSERT_TRUE(g.has_value());
    const double h = 1e-6;
    for (int i = 0; i < a.size(); i += 4)
      for (int k = 0; k < 2; ++k) {
        Cloud plus = a, minus = a;
        plus.points(i, k) += h;
        minus.points(i, k) -= h;
        const double fd = (evaluateMeasure(m, plus, b, {}).value - evaluateMeasure(m, minus, b, {}).value) / (2 * h);
        EXPECT_NEAR((*g)(i, k), fd, 1e-6) << id << " point " << i << " axis " << k;
      }
  }
}

// [D] W2 = 0 is a kink (|t| near t = 0): no gradient there; no plan, no gradient either.
TEST(WassersteinMeasureTest, NoGradientWithoutPlanOrAtZeroW2) {
  const Cloud a = scatter(12, 11);
  EvalRequest req;
  req.wantPlan = true;
  const Result same = evaluateMeasure(measure("w2"), a, a, req);
  EXPECT_EQ(same.value, 0.0);
  EXPECT_FALSE(measure("w2").gradientA(a, a, {}, same).has_value());
  const Result noPlan = evaluateMeasure(measure("w1"), a, scatter(12, 12), EvalRequest{});
  EXPECT_FALSE(measure("w1").gradientA(a, scatter(12, 12), {}, noPlan).has_value());
}

}  // namespace
}  // namespace barrow
