// The jump test (step_rule.h judgeSteps, continuity.h) on curves whose answer is known by
// construction [D]: planted jumps of known size and place are found there; smooth curves,
// however steep, are never called jumps; an unfinished refinement gives "unresolved".
#include <gtest/gtest.h>

#include <cmath>
#include <random>

#include "sweep/continuity.h"
#include "io/findings_json.h"
#include "sweep/step_rule.h"
#include "support/test_support.h"
#include "sweep/sweep_engine.h"

namespace barrow {
namespace {

// D(θ) = smooth(θ) + J·[θ > θ*], θ read back from A_θ (a shift along x of a one-point cloud).
// smooth is a random sum of sines with slope at most `lipschitz` [D].
class PlantedJumpMeasure : public Measure {
 public:
  PlantedJumpMeasure(unsigned seed, double at, double size, double lipschitz) : at_(at), size_(size) {
    std::mt19937 rng(seed);
    std::uniform_real_distribution<double> u(0.0, 1.0);
    double slopeSum = 0.0;
    for (int k = 0; k < 4; ++k) {
      const double f = 0.5 + 3.0 * u(rng), a = u(rng), phase = 6.28 * u(rng);
      freq_.push_back(f), amp_.push_back(a), phase_.push_back(phase);
      slopeSum += a * f;
    }
    for (double& a : amp_) a *= lipschitz / slopeSum;  // |D'| <= lipschitz off the jump
  }
  std::string id() const override { return "t_planted"; }
  std::string displayName() const override { return "test: planted jump"; }
  std::string formula() const override { return "sum of sines + step"; }
  Result evaluate(const Cloud& a, const Cloud&, const EvalContext&) const override {
    const double t = a.points(0, 0);
    double v = 0.0;
    for (std::size_t k = 0; k < freq_.size(); ++k) v += amp_[k] * std::sin(freq_[k] * t + phase_[k]);
    return Result::ok(v + (t > at_ ? size_ : 0.0));
  }

 private:
  double at_, size_;
  std::vector<double> freq_, amp_, phase_;
};

// A steep but continuous ramp: rises by `rise` over [c − w/2, c + w/2], linear [D].
class RampMeasure : public Measure {
 public:
  RampMeasure(double center, double width, double rise) : c_(center), w_(width), rise_(rise) {}
  std::string id() const override { return "t_ramp"; }
  std::string displayName() const override { return "test: steep ramp"; }
  std::string formula() const override { return "piecewise linear"; }
  Result evaluate(const Cloud& a, const Cloud&, const EvalContext&) const override {
    const double t = a.points(0, 0);
    const double s = std::clamp((t - (c_ - w_ / 2)) / w_, 0.0, 1.0);
    return Result::ok(rise_ * s + 0.1 * t);
  }

 private:
  double c_, w_, rise_;
};

Cloud origin() { return Cloud("A", Eigen::MatrixX2d::Zero(1, 2)); }

SweepResult sweepWith(const Measure& m, int budget, bool refine = true) {
  SweepRequest req;
  req.settings.family = Family::Shift;
  req.settings.from = -1;
  req.settings.to = 1;
  req.settings.steps = 41;
  req.measureObjects = {&m};
  req.refineJumps = refine;
  req.maxRefinePoints = budget;
  req.threads = 1;
  return runSweep(origin(), origin(), req);
}

// A seeded "mutation" check: 60 random curves (slope at most L = 0.5) with a planted jump of a
// known size at a known θ. Every jump is found, at the right place (within the resolution) and
// with the right size (within the slope's share over the bracket), for sizes down to the
// stated detection limit: a suspect must stand out on the grid, |J| > 4·L·Δθ = 0.1 here
// (findings --help).
TEST(JumpJudgementTest, PlantedJumpsAreFoundWhereAndAsLargeAsPlanted) {
  std::mt19937 rng(20261203);
  std::uniform_real_distribution<double> where(-0.9, 0.9);
  const double sizes[] = {1.0, 0.3, 0.15};
  int checked = 0;
  for (int trial = 0; trial < 20; ++trial)
    for (double size : sizes) {
      const double at = where(rng);
      const PlantedJumpMeasure m(unsigned(trial), at, size * (trial % 2 ? 1 : -1), 0.5);
      const SweepResult r = sweepWith(m, 0);
      ASSERT_TRUE(r.message.empty()) << r.message;
      const Finding f = findContinuity(r)[0];
      ASSERT_EQ(f.jumps.size(), 1u) << "trial " << trial << " size " << size << " at " << at << ": " << f.summary;
      EXPECT_TRUE(f.unresolved.empty()) << f.summary;
      EXPECT_NEAR(f.jumps[0].theta, at, r.refineTolerance) << f.summary;
      EXPECT_NEAR(f.jumps[0].size, size * (trial % 2 ? 1 : -1), 2.0 * r.refineTolerance) << f.summary;
      EXPECT_FALSE(f.continuous);
      ++checked;
    }
  EXPECT_EQ(checked, 60);
}

// A ramp 100x steeper than the grid can see, but continuous: with refinement it is resolved
// and never reported as a jump; without refinement, or with a budget too small to reach the
// resolution, it is "unresolved" — never a jump.
TEST(JumpJudgementTest, SteepContinuousRampIsNeverAJump) {
  const RampMeasure ramp(0.3071, 1e-3, 1.0);
  for (int budget : {0, 1, 4, 10, 200}) {
    const SweepResult r = sweepWith(ramp, budget);
    const Finding f = findContinuity(r)[0];
    EXPECT_TRUE(f.jumps.empty()) << "budget " << budget << ": " << f.summary;
  }
  const Finding full = findContinuity(sweepWith(ramp, 200))[0];
  EXPECT_TRUE(full.continuous) << full.summary;
  EXPECT_NEAR(full.lipschitz, 1.0 / 1e-3 + 0.1, 1.0) << full.summary;  // the ramp's slope [D]

  const SweepResult grid = sweepWith(ramp, 0, false);
  const Finding g = findContinuity(grid)[0];
  EXPECT_TRUE(g.jumps.empty());
  ASSERT_EQ(g.unresolved.size(), 1u) << g.summary;
  EXPECT_FALSE(g.continuous);
  EXPECT_NE(g.summary.find("unresolved at θ ≈"), std::string::npos) << g.summary;
  const auto json = findingsToJson({g});
  EXPECT_EQ(json["findings"][0]["jumps"].size(), 0u);
  EXPECT_EQ(json["findings"][0]["unresolved"].size(), 1u);
}

// A budget too small for a true jump: the suspect stays unresolved and the summary says the
// budget ran out; the sweep records that it did.
TEST(JumpJudgementTest, BudgetTooSmallLeavesTheJumpUnresolved) {
  const PlantedJumpMeasure m(7, 0.123, 0.5, 1.0);
  const SweepResult r = sweepWith(m, 3);
  EXPECT_TRUE(r.refineBudgetHit);
  EXPECT_EQ(r.refineBudget, 3);
  const Finding f = findContinuity(r)[0];
  EXPECT_TRUE(f.jumps.empty()) << f.summary;
  ASSERT_EQ(f.unresolved.size(), 1u) << f.summary;
  EXPECT_NE(f.summary.find("budget ran out"), std::string::npos) << f.summary;
}

// The budget is shared in turns: a measure with many suspects cannot take it all [D].
TEST(JumpJudgementTest, BudgetIsSharedBetweenMeasures) {
  class Staircase : public Measure {  // 12 unit steps across the range
   public:
    std::string id() const override { return "t_stairs"; }
    std::string displayName() const override { return "test: staircase"; }
    std::string formula() const override { return "floor"; }
    Result evaluate(const Cloud& a, const Cloud&, const EvalContext&) const override {
      return Result::ok(std::floor(6.0 * a.points(0, 0) + 0.013));
    }
  } stairs;
  const PlantedJumpMeasure single(3, 0.4567, 1.0, 0.5);
  SweepRequest req;
  req.settings.family = Family::Shift;
  req.settings.from = -1;
  req.settings.to = 1;
  req.settings.steps = 41;
  req.measureObjects = {&stairs, &single};
  req.maxRefinePoints = 30;  // far less than the 12 × 9 bisections the staircase wants
  req.threads = 1;
  const SweepResult r = runSweep(origin(), origin(), req);
  const auto f = findContinuity(r);
  ASSERT_EQ(f.size(), 2u);
  EXPECT_EQ(f[1].jumps.size(), 1u) << f[1].summary;  // the single jump got its share
  EXPECT_TRUE(r.refineBudgetHit);
  EXPECT_FALSE(f[0].unresolved.empty()) << f[0].summary;
  // Depth first: the staircase's share (15 points) bisects one of its steps all the way down
  // (about 12 levels from Δθ = 0.05 to 2e-5) instead of every step a little [D].
  EXPECT_GE(f[0].jumps.size(), 1u) << f[0].summary;
}

// judgeSteps directly: the rule's three outcomes on three-point neighbourhoods [D].
TEST(JumpJudgementTest, JudgeStepsNeedsResolutionAndAStepBeyondTheLocalSlope) {
  std::vector<double> theta, value;
  for (int k = 0; k <= 10; ++k) theta.push_back(k * 1e-3);
  for (double t : theta) value.push_back(t > 4.5e-3 ? 1.0 + t : t);  // slope 1, jump 1 at 4.5e-3
  // Every interval gets a verdict; only the one holding the step (θ 4e-3 … 5e-3) is flagged.
  auto verdicts = [&](const JumpTest& t) {
    std::vector<StepVerdict> v;
    for (const JudgedStep& j : judgeSteps(theta, value, StepRule{}, t)) v.push_back(j.verdict);
    return v;
  };
  auto only = [](StepVerdict at4) {
    std::vector<StepVerdict> v(10, StepVerdict::Smooth);
    v[4] = at4;
    return v;
  };
  JumpTest test;
  test.resolution = 1e-3;
  EXPECT_EQ(verdicts(test), only(StepVerdict::Jump));
  test.resolution = 0.5e-3;  // the bracket is wider than the resolution
  EXPECT_EQ(verdicts(test), only(StepVerdict::Unresolved));
  test.resolution = 1e-3;
  test.accuracy = 0.6;  // the solver cannot vouch for a change of 1
  EXPECT_EQ(verdicts(test), only(StepVerdict::Smooth));
}

}  // namespace
}  // namespace barrow

namespace barrow {
namespace {

// Measures that are Lipschitz in a shift or a rotation by their definitions (a rigid move of
// A by δ changes W1, W2, Hausdorff, Chamfer, sliced W2 by at most δ, MMD and energy by at most
// a constant times δ [D: triangle inequality / Kantorovich–Rubinstein]) are never reported as
// jumping on random clouds, whatever the refinement budget: an unfinished refinement can only
// give "unresolved".
TEST(JumpJudgementTest, LipschitzMeasuresNeverJumpOnRandomClouds) {
  for (unsigned seed : {5u, 6u}) {
    const Cloud a = test::gaussianCloud(30, seed, 0.0, 1.0, true);
    const Cloud b = test::gaussianCloud(25, seed + 50, 0.5, 0.5, true);
    for (Family family : {Family::Shift, Family::Rotate})
      for (int budget : {-1, 3, 0}) {  // -1: no refinement; 0: the default budget
        SweepRequest req;
        req.settings.family = family;
        req.settings.from = family == Family::Shift ? -1.0 : -180.0;
        req.settings.to = -req.settings.from;
        req.settings.steps = 61;
        req.settings.measures = {"w1", "w2", "hausdorff", "chamfer", "sliced", "mmd", "energy"};
        req.refineJumps = budget >= 0;
        req.maxRefinePoints = std::max(budget, 0);
        const SweepResult r = runSweep(a, b, req);
        ASSERT_TRUE(r.message.empty()) << r.message;
        for (const Finding& f : findContinuity(r))
          EXPECT_TRUE(f.jumps.empty()) << familyName(family) << " budget " << budget << " seed " << seed << ": " << f.summary;
      }
  }
}

}  // namespace
}  // namespace barrow
