// The sweep engine on small test-only measures whose values and slopes are known in closed
// form, so that the engine (grid, gradients, frozen settings, warm starts, threads,
// cancellation, refinement) is checked independently of the real measures.
#include <gtest/gtest.h>

#include <atomic>
#include <cmath>

#include "cloud/cloud.h"
#include "sweep/continuity.h"
#include "sweep/sweep_engine.h"

namespace barrow {
namespace {

double meanX(const Cloud& c) { return c.mean().x(); }

// D = |mean(A) − mean(B)|² + 0.5, with ∂D/∂x_i = 2 w_i (mean(A) − mean(B)) [D].
class MeanGapMeasure : public Measure {
 public:
  std::string id() const override { return "t_gap"; }
  std::string displayName() const override { return "test: squared mean gap"; }
  std::string formula() const override { return "|mA - mB|^2 + 0.5"; }
  Result evaluate(const Cloud& a, const Cloud& b, const EvalContext&) const override {
    return Result::ok((a.mean() - b.mean()).squaredNorm() + 0.5);
  }
  std::optional<Eigen::MatrixX2d> gradientA(const Cloud& a, const Cloud& b, const EvalContext&,
                                            const Result&) const override {
    const Eigen::RowVector2d d = 2.0 * (a.mean() - b.mean()).transpose();
    return Eigen::MatrixX2d(a.normalizedWeights() * d);
  }
};

// A function of mean_x(A): a unit step at `cut`, a logistic of width `width`, or +∞ beyond.
class ShapeMeasure : public Measure {
 public:
  enum Kind { Step, Sigmoid, InfiniteBeyond, FailsInside, PlanTie };
  ShapeMeasure(std::string id, Kind k, double cut, double width = 0.0)
      : id_(std::move(id)), kind_(k), cut_(cut), width_(width) {}
  std::string id() const override { return id_; }
  std::string displayName() const override { return "test: " + id_; }
  std::string formula() const override { return "f(mean_x(A))"; }
  Result evaluate(const Cloud& a, const Cloud&, const EvalContext&) const override {
    const double x = meanX(a);
    switch (kind_) {
      case Step: return Result::ok(x > cut_ ? 1.0 : 0.0);
      case Sigmoid: return Result::ok(1.0 / (1.0 + std::exp(-(x - cut_) / width_)));
      case InfiniteBeyond: return Result::ok(x > cut_ ? INFINITY : x * x);
      case FailsInside:
        if (std::abs(x - cut_) < width_) return Result::invalid("test failure near the cut");
        return Result::ok(x);
      case PlanTie: {
        Result r = Result::ok(std::abs(x - cut_));
        r.details["plan_unique"] = std::abs(x - cut_) > 1e-9 && x < cut_ + 0.55;
        return r;
      }
    }
    return Result::invalid("unreachable");
  }

 private:
  std::string id_;
  Kind kind_;
  double cut_, width_;
};

// A data-dependent setting: test.scale = "auto" means the joint diameter of (A, B).
class ScaledMeanMeasure : public Measure {
 public:
  std::string id() const override { return "t_scaled"; }
  std::string displayName() const override { return "test: mean_x / scale"; }
  std::string formula() const override { return "mean_x(A) / scale"; }
  std::vector<ParamSpec> params() const override {
    ParamSpec s;
    s.key = "test.scale";
    s.defaultValue = "auto";
    s.min = 0;
    s.minExclusive = true;
    s.choices = {"auto"};
    return {s};
  }
  ParamSet freeze(const Cloud& a, const Cloud& b, const ParamSet& resolved) const override {
    ParamSet p = resolved;
    if (p.isWord("test.scale", "auto")) p.set("test.scale", std::to_string(jointDiameter(a, b)));
    return p;
  }
  Result evaluate(const Cloud& a, const Cloud& b, const EvalContext& ctx) const override {
    const double scale = ctx.params.isWord("test.scale", "auto") ? jointDiameter(a, b) : ctx.params.real("test.scale");
    return Result::ok(meanX(a) / scale);
  }
};

// Counts the calls that found warm state left by the previous call.
struct CountState : WarmState {
  int calls = 0;
};
class WarmCountingMeasure : public Measure {
 public:
  mutable std::atomic<int> warmHits{0};
  std::string id() const override { return "t_warm"; }
  std::string displayName() const override { return "test: warm counter"; }
  std::string formula() const override { return "mean_x(A)"; }
  Result evaluate(const Cloud& a, const Cloud&, const EvalContext& ctx) const override {
    if (ctx.warm) {
      if (auto* s = dynamic_cast<CountState*>(ctx.warm->get())) {
        ++warmHits;
        ++s->calls;
      } else {
        *ctx.warm = std::make_shared<CountState>();
      }
    }
    return Result::ok(meanX(a));
  }
};

Cloud cloudA() {
  Eigen::MatrixX2d p(3, 2);
  p << 0, 0, 1, 0, 0, 1;
  return Cloud("A", p);
}
Cloud cloudB() {
  Eigen::MatrixX2d p(2, 2);
  p << 2, 1, 3, 2;
  return Cloud("B", p);
}

SweepRequest request(std::vector<const Measure*> ms, int steps = 41) {
  SweepRequest req;
  req.settings.family = Family::Shift;
  req.settings.from = -1;
  req.settings.to = 1;
  req.settings.steps = steps;
  req.measureObjects = std::move(ms);
  req.threads = 2;
  return req;
}

TEST(SweepEngineTest, GridIsEvenAndIncreasingWithEverySeriesFilled) {
  MeanGapMeasure gap;
  auto req = request({&gap}, 21);
  req.refineJumps = false;
  const SweepResult r = runSweep(cloudA(), cloudB(), req);
  ASSERT_TRUE(r.message.empty()) << r.message;
  ASSERT_EQ(r.theta.size(), 21u);
  EXPECT_EQ(r.theta.front(), -1.0);
  EXPECT_EQ(r.theta.back(), 1.0);
  for (std::size_t k = 0; k < r.theta.size(); ++k) EXPECT_NEAR(r.theta[k], -1.0 + 0.1 * double(k), 1e-15);
  ASSERT_EQ(r.series.size(), 1u);
  const auto& s = r.series[0];
  EXPECT_EQ(s.value.size(), 21u);
  EXPECT_EQ(s.slope.size(), 21u);
  EXPECT_EQ(s.status.size(), 21u);
  EXPECT_EQ(s.seconds.size(), 21u);
  EXPECT_EQ(s.oneSided.size(), 21u);
  EXPECT_EQ(r.threads, 2);
  EXPECT_FALSE(r.cancelled);
}

// Shift by θ along x: D(θ) = (mAx + θ − mBx)² + (mAy − mBy)² + 0.5 and
// dD/dθ = 2(mAx + θ − mBx) [D], through the chain rule with velocity (1, 0) per point.
TEST(SweepEngineTest, AnalyticSlopeFollowsChainRuleThroughTheFamilyVelocity) {
  MeanGapMeasure gap;
  auto req = request({&gap});
  req.settings.direction = {3.0, 0.0};  // normalised at use
  const SweepResult r = runSweep(cloudA(), cloudB(), req);
  ASSERT_TRUE(r.message.empty()) << r.message;
  const auto& s = r.series[0];
  EXPECT_EQ(s.gradientMethod, "analytic");
  const double gx = 1.0 / 3.0 - 2.5, gy = 1.0 / 3.0 - 1.5;
  for (std::size_t k = 0; k < r.theta.size(); ++k) {
    const double t = r.theta[k];
    EXPECT_NEAR(s.value[k], (gx + t) * (gx + t) + gy * gy + 0.5, 1e-12);
    EXPECT_NEAR(s.slope[k], 2.0 * (gx + t), 1e-12);
    EXPECT_EQ(s.status[k], Status::Ok);
  }
}

// The three-point formula is exact for quadratics [D], also at the ends (one-sided there is
// only first order, so the ends are checked against the secant).
TEST(SweepEngineTest, FiniteDifferencesAreExactForAQuadraticInside) {
  MeanGapMeasure gap;
  auto req = request({&gap});
  req.analyticGradients = false;
  const SweepResult r = runSweep(cloudA(), cloudB(), req);
  const auto& s = r.series[0];
  EXPECT_EQ(s.gradientMethod, "finite-difference");
  const double gx = 1.0 / 3.0 - 2.5;
  for (std::size_t k = 1; k + 1 < r.theta.size(); ++k) EXPECT_NEAR(s.slope[k], 2.0 * (gx + r.theta[k]), 1e-9);
  EXPECT_NEAR(s.slope[0], (s.value[1] - s.value[0]) / (r.theta[1] - r.theta[0]), 1e-9);
}

// Rotation about a pivot away from A's centroid moves the mean on a circle; the analytic
// slope (velocity (π/180)·J·R(θ)(x − c)) must match finite differences of the values.
TEST(SweepEngineTest, RotationAndScaleAnalyticSlopesMatchFiniteDifferences) {
  MeanGapMeasure gap;
  for (const Family family : {Family::Rotate, Family::Scale}) {
    auto req = request({&gap}, 801);
    req.settings.family = family;
    req.settings.center = std::array<double, 2>{-1.0, 0.5};
    req.settings.from = family == Family::Rotate ? -90.0 : 0.5;
    req.settings.to = family == Family::Rotate ? 90.0 : 1.5;
    req.refineJumps = false;
    const SweepResult an = runSweep(cloudA(), cloudB(), req);
    req.analyticGradients = false;
    const SweepResult fd = runSweep(cloudA(), cloudB(), req);
    ASSERT_EQ(an.series[0].gradientMethod, "analytic");
    double scale = 0;
    for (double v : an.series[0].slope) scale = std::max(scale, std::abs(v));
    for (std::size_t k = 1; k + 1 < an.theta.size(); ++k)
      EXPECT_NEAR(an.series[0].slope[k], fd.series[0].slope[k], 1e-5 * scale) << familyName(family) << " θ=" << an.theta[k];
  }
}

TEST(SweepEngineTest, MixAlwaysUsesFiniteDifferences) {
  MeanGapMeasure gap;
  auto req = request({&gap});
  req.settings.family = Family::Mix;
  req.settings.from = 0;
  req.settings.to = 1;
  const SweepResult r = runSweep(cloudA(), cloudB(), req);
  ASSERT_TRUE(r.message.empty()) << r.message;
  EXPECT_EQ(r.series[0].gradientMethod, "finite-difference");
  // mean((1−θ)A + θB) = (1−θ)mA + θmB, so D = (1−θ)²|mA − mB|² + 0.5 [D].
  const double g2 = (cloudA().mean() - cloudB().mean()).squaredNorm();
  for (std::size_t k = 0; k < r.theta.size(); ++k) {
    const double t = r.theta[k];
    EXPECT_NEAR(r.series[0].value[k], (1 - t) * (1 - t) * g2 + 0.5, 1e-12);
    if (k > 0 && k + 1 < r.theta.size()) {
      EXPECT_NEAR(r.series[0].slope[k], -2 * (1 - t) * g2, 1e-9);
    }
  }
}

// "auto" resolves once, on (A_θ0, B); evaluating "auto" at each θ would drift with the diameter.
TEST(SweepEngineTest, DataDependentSettingIsFrozenAtTheReference) {
  ScaledMeanMeasure scaled;
  auto req = request({&scaled});
  req.settings.reference = 0.5;
  const SweepResult r = runSweep(cloudA(), cloudB(), req);
  ASSERT_TRUE(r.message.empty()) << r.message;
  const auto& s = r.series[0];
  Cloud a0 = cloudA();
  a0.points.col(0).array() += 0.5;
  const double scale0 = jointDiameter(a0, cloudB());
  ASSERT_TRUE(s.frozen.has("test.scale"));
  EXPECT_NEAR(s.frozen.real("test.scale"), scale0, 1e-5);
  const double used = s.frozen.real("test.scale");
  for (std::size_t k = 0; k < r.theta.size(); ++k) EXPECT_NEAR(s.value[k], (1.0 / 3.0 + r.theta[k]) / used, 1e-12);
  // The record says where the number came from.
  EXPECT_EQ(s.rules.text("test.scale"), "auto");
}

TEST(SweepEngineTest, WarmStatePassesBetweenNeighboursWithinEachThread) {
  WarmCountingMeasure warm;
  auto req = request({&warm}, 41);
  req.refineJumps = false;
  runSweep(cloudA(), cloudB(), req);
  // The probe at the reference has no slot; each of the 2 chunks starts cold once.
  EXPECT_EQ(warm.warmHits.load(), 41 - 2);
  warm.warmHits = 0;
  req.warmStart = false;
  runSweep(cloudA(), cloudB(), req);
  EXPECT_EQ(warm.warmHits.load(), 0);
}

TEST(SweepEngineTest, ThreadCountDoesNotChangeDeterministicValues) {
  MeanGapMeasure gap;
  ShapeMeasure step("t_step", ShapeMeasure::Step, 0.2);
  auto req = request({&gap, &step}, 61);
  req.threads = 1;
  const SweepResult one = runSweep(cloudA(), cloudB(), req);
  req.threads = 2;
  const SweepResult two = runSweep(cloudA(), cloudB(), req);
  ASSERT_EQ(one.theta, two.theta);
  for (std::size_t j = 0; j < 2; ++j) {
    EXPECT_EQ(one.series[j].value, two.series[j].value);
    EXPECT_EQ(one.series[j].slope, two.series[j].slope);
  }
}

TEST(SweepEngineTest, CancelStopsEarlyAndMarksTheRest) {
  MeanGapMeasure gap;
  auto req = request({&gap}, 2001);
  req.threads = 1;
  std::atomic<bool> cancel{false};
  RunControl control;
  control.cancel = &cancel;
  double last = 0;
  control.onProgress = [&](double f) {
    last = f;
    if (f > 0.1) cancel = true;
    return true;
  };
  const SweepResult r = runSweep(cloudA(), cloudB(), req, &control);
  EXPECT_TRUE(r.cancelled);
  EXPECT_FALSE(r.message.empty());
  ASSERT_EQ(r.theta.size(), 2001u);
  const auto& s = r.series[0];
  EXPECT_EQ(s.status.back(), Status::Cancelled);
  EXPECT_TRUE(std::isnan(s.value.back()));
  EXPECT_EQ(s.status.front(), Status::Ok);
  EXPECT_LT(last, 0.5);

  // A progress callback that answers "stop" cancels too.
  RunControl stopper;
  stopper.onProgress = [](double f) { return f < 0.2; };
  EXPECT_TRUE(runSweep(cloudA(), cloudB(), req, &stopper).cancelled);
}

TEST(SweepEngineTest, BadInputGivesAMessageAndNoRows) {
  MeanGapMeasure gap;
  auto expectFails = [&](const Cloud& a, const SweepRequest& req, const std::string& needle) {
    const SweepResult r = runSweep(a, cloudB(), req);
    EXPECT_TRUE(r.theta.empty());
    EXPECT_NE(r.message.find(needle), std::string::npos) << r.message;
  };
  auto req = request({&gap});
  expectFails(Cloud("E", Eigen::MatrixX2d(0, 2)), req, "empty");
  Cloud nan = cloudA();
  nan.points(1, 1) = NAN;
  expectFails(nan, req, "row 2");
  auto bad = req;
  bad.settings.steps = 1;
  expectFails(cloudA(), bad, "at least 2 steps");
  bad = req;
  bad.settings.direction = {0.0, 0.0};
  expectFails(cloudA(), bad, "direction");
  bad = req;
  bad.measureObjects.clear();
  bad.settings.measures = {"no_such_measure"};
  expectFails(cloudA(), bad, "no_such_measure");
  bad = req;
  bad.settings.family = Family::Mix;
  bad.settings.to = 2;
  expectFails(cloudA(), bad, "[0, 1]");
  bad = req;
  bad.stepRule.factor = 0.5;
  expectFails(cloudA(), bad, "factor");
}

TEST(SweepEngineTest, BadParameterFailsThatMeasureOnly) {
  MeanGapMeasure gap;
  ScaledMeanMeasure scaled;
  auto req = request({&gap, &scaled}, 11);
  req.params.set("test.scale", "-3");
  const SweepResult r = runSweep(cloudA(), cloudB(), req);
  ASSERT_EQ(r.series.size(), 2u);
  EXPECT_EQ(r.series[0].status[0], Status::Ok);
  EXPECT_EQ(r.series[1].status[0], Status::InvalidInput);
  EXPECT_TRUE(std::isnan(r.series[1].value[0]));
  EXPECT_NE(r.series[1].message.find("test.scale"), std::string::npos) << r.series[1].message;
}

TEST(SweepEngineTest, FailureAtSomeThetaIsKeptWithItsReason) {
  ShapeMeasure failing("t_fail", ShapeMeasure::FailsInside, 1.0 / 3.0 + 0.25, 0.06);
  const SweepResult r = runSweep(cloudA(), cloudB(), request({&failing}));
  const auto& s = r.series[0];
  int failed = 0;
  for (std::size_t k = 0; k < r.theta.size(); ++k) {
    const bool inside = std::abs(r.theta[k] - 0.25) < 0.06 - 1e-12;
    EXPECT_EQ(s.status[k], inside ? Status::InvalidInput : Status::Ok) << r.theta[k];
    EXPECT_EQ(std::isnan(s.value[k]), inside);
    failed += inside;
  }
  EXPECT_GT(failed, 0);
  EXPECT_NE(s.message.find("test failure"), std::string::npos);
}

TEST(SweepEngineTest, RefinementInsertsThetaForEverySeriesAndLocatesTheJump) {
  MeanGapMeasure gap;
  const double cut = 0.2371;  // in θ: mean_x(A_θ) = 1/3 + θ
  ShapeMeasure step("t_step", ShapeMeasure::Step, 1.0 / 3.0 + cut);
  auto req = request({&gap, &step});
  const SweepResult r = runSweep(cloudA(), cloudB(), req);
  ASSERT_TRUE(r.message.empty()) << r.message;
  EXPECT_GT(r.refinedPoints, 0);
  EXPECT_FALSE(r.refineBudgetHit);
  EXPECT_EQ(r.theta.size(), 41u + std::size_t(r.refinedPoints));
  EXPECT_NEAR(r.refineTolerance, 2e-5, 1e-18);
  for (std::size_t k = 1; k < r.theta.size(); ++k) ASSERT_LT(r.theta[k - 1], r.theta[k]);
  for (const auto& s : r.series) {
    ASSERT_EQ(s.value.size(), r.theta.size());
    for (std::size_t k = 0; k < r.theta.size(); ++k) EXPECT_EQ(s.status[k], Status::Ok);
  }
  // The bracket around the cut is no wider than the tolerance.
  std::size_t k = 0;
  while (r.theta[k + 1] < cut) ++k;
  EXPECT_LE(r.theta[k + 1] - r.theta[k], r.refineTolerance);
  EXPECT_EQ(r.series[1].value[k], 0.0);
  EXPECT_EQ(r.series[1].value[k + 1], 1.0);
}

// The brief's two cases: a steep but continuous change is never a jump; a step always is.
TEST(SweepEngineTest, SteepSigmoidIsContinuousAndStepIsAJump) {
  const double at = 1.0 / 3.0 + 0.3;
  ShapeMeasure step("t_step", ShapeMeasure::Step, at);
  ShapeMeasure steep("t_steep", ShapeMeasure::Sigmoid, at, 2e-3);  // 10× steeper than the grid
  const SweepResult r = runSweep(cloudA(), cloudB(), request({&step, &steep}));
  const auto f = findContinuity(r);
  ASSERT_EQ(f.size(), 2u);
  EXPECT_FALSE(f[0].continuous);
  ASSERT_EQ(f[0].jumps.size(), 1u);
  EXPECT_NEAR(f[0].jumps[0].theta, 0.3, 2e-5);
  EXPECT_DOUBLE_EQ(f[0].jumps[0].size, 1.0);
  EXPECT_TRUE(f[1].continuous) << f[1].summary;
  // Its steepest slope is 1/(4w) = 125 [D]; the estimate sees most of it after refinement.
  EXPECT_GT(f[1].lipschitz, 100.0);
  EXPECT_LE(f[1].lipschitz, 125.0 + 1e-9);
  // Without refinement the grid alone cannot tell the two apart: both stay unresolved, neither
  // is called a jump, and the findings say so.
  auto req = request({&step, &steep});
  req.refineJumps = false;
  const auto g = findContinuity(runSweep(cloudA(), cloudB(), req));
  for (const auto& fg : g) {
    EXPECT_FALSE(fg.continuous);
    EXPECT_TRUE(fg.jumps.empty()) << fg.summary;
    EXPECT_GE(fg.unresolved.size(), 1u) << fg.summary;
    EXPECT_NE(fg.summary.find("without refinement"), std::string::npos) << fg.summary;
  }
}

TEST(SweepEngineTest, JumpToInfinityIsLocatedAndCounted) {
  ShapeMeasure inf("t_inf", ShapeMeasure::InfiniteBeyond, 1.0 / 3.0 + 0.41);
  const SweepResult r = runSweep(cloudA(), cloudB(), request({&inf}));
  const auto f = findContinuity(r);
  ASSERT_EQ(f[0].jumps.size(), 1u);
  EXPECT_TRUE(std::isinf(f[0].jumps[0].size));
  EXPECT_GT(f[0].jumps[0].size, 0);
  EXPECT_NEAR(f[0].jumps[0].theta, 0.41, 2e-5);
  EXPECT_EQ(r.series[0].status.back(), Status::Infinite);
  EXPECT_TRUE(std::isnan(r.series[0].slope.back()));
  ASSERT_FALSE(f[0].flat.empty());
  EXPECT_EQ(f[0].flat.back().second, 1.0);  // +∞ to the end: no gradient there
}

TEST(SweepEngineTest, NonUniquePlanMarksOneSidedPoints) {
  ShapeMeasure tie("t_tie", ShapeMeasure::PlanTie, 1.0 / 3.0);
  auto req = request({&tie}, 21);
  req.refineJumps = false;
  const SweepResult r = runSweep(cloudA(), cloudB(), req);
  for (std::size_t k = 0; k < r.theta.size(); ++k) {
    const bool unique = std::abs(r.theta[k]) > 1e-9 && r.theta[k] < 0.55;
    EXPECT_EQ(r.series[0].oneSided[k], !unique) << r.theta[k];
  }
}

TEST(SweepEngineTest, RefinementBudgetIsRespected) {
  ShapeMeasure s1("a", ShapeMeasure::Step, 1.0 / 3.0 - 0.51), s2("b", ShapeMeasure::Step, 1.0 / 3.0 + 0.13);
  auto req = request({&s1, &s2});
  req.maxRefinePoints = 5;
  const SweepResult r = runSweep(cloudA(), cloudB(), req);
  EXPECT_EQ(r.refinedPoints, 5);
  EXPECT_TRUE(r.refineBudgetHit);
  EXPECT_EQ(r.theta.size(), 46u);
}

}  // namespace
}  // namespace barrow
