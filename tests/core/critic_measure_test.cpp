// critic_clip / critic_gp / critic_sn as registered measures: outside the default set, the
// value is the critic's estimate, and warm starts carry the weights only when they fit.
#include <gtest/gtest.h>

#include "measures/evaluate.h"
#include "measures/registry.h"
#include "support/test_support.h"

namespace barrow {
namespace {

TEST(CriticMeasureTest, DefaultSetIsExactlyTheDesignListWithoutCritics) {
  const auto& reg = MeasureRegistry::instance();
  std::vector<std::string> ids;
  for (const Measure* m : reg.defaults()) ids.push_back(m->id());
  EXPECT_EQ(ids, designMeasureIds());  // [D] the documented list (DEVELOPERS.md, Measure conventions), in its order
  for (const char* id : {"critic_clip", "critic_gp", "critic_sn"}) {
    const Measure* m = reg.find(id);
    ASSERT_NE(m, nullptr) << id;
    EXPECT_FALSE(m->inDefaultSet());
    EXPECT_FALSE(m->cheap());
  }
}

EvalRequest shortRun(int steps) {
  EvalRequest req;
  req.params.set("critic.steps", std::to_string(steps));
  req.params.set("critic.lr", "0.001");
  return req;
}

TEST(CriticMeasureTest, ValueIsEstimateAndBoundStaysBelowW1) {
  const Cloud a = test::gaussianCloud(40, 3), b = test::gaussianCloud(30, 4, 2.0);
  const Result w1 = evaluateMeasure(*MeasureRegistry::instance().find("w1"), a, b, {});
  for (const char* id : {"critic_clip", "critic_gp", "critic_sn"}) {
    const Result r = evaluateMeasure(*MeasureRegistry::instance().find(id), a, b, shortRun(200));
    ASSERT_EQ(r.status, Status::Ok) << id << ": " << r.message;
    EXPECT_EQ(r.iterations, 200);
    EXPECT_LE(r.details["lower_bound"].get<double>(), w1.value * (1 + 1e-12)) << id;  // [P] KR duality (C1)
    EXPECT_NEAR(r.details["lower_bound"].get<double>() * r.details["lipschitz_upper"].get<double>(), r.value,
                1e-12 * (1 + std::abs(r.value)));
  }
}

TEST(CriticMeasureTest, WarmStartCarriesWeightsOnlyWhenSettingsMatch) {
  const Measure& m = *MeasureRegistry::instance().find("critic_gp");
  const Cloud a = test::gaussianCloud(40, 5), b = test::gaussianCloud(30, 6, 1.5);
  std::shared_ptr<WarmState> slot;
  EvalRequest req = shortRun(100);
  req.warm = &slot;
  const Result first = evaluateMeasure(m, a, b, req);
  EXPECT_FALSE(first.details["warm_start"].get<bool>());
  ASSERT_TRUE(slot);
  const Result second = evaluateMeasure(m, a, b, req);
  EXPECT_TRUE(second.details["warm_start"].get<bool>());
  EXPECT_NE(first.value, second.value);  // 200 steps in all, not the same 100 again
  req.params.set("critic.width", "32");  // another network shape: must start afresh
  const Result third = evaluateMeasure(m, a, b, req);
  EXPECT_FALSE(third.details["warm_start"].get<bool>());
  EvalRequest cold = shortRun(100);
  cold.params.set("critic.width", "32");
  EXPECT_EQ(third.value, evaluateMeasure(m, a, b, cold).value);  // [D] fresh start = cold run
}

// [D] Critics train on the input frame's coordinates (core/critic/input_frame.h), so moving both
// clouds leaves every critic's value unchanged and scaling them by k multiplies it by k, as for
// W1 (translation and homogeneity of the metric). A factor of 4 is exact in binary, and the
// frame removes it again before training; the shift costs rounding of order 1e-16·|shift|/s
// in the inputs, which the training run carries along without amplifying it noticeably.
TEST(CriticMeasureTest, CriticsMoveAndScaleWithTheCloudsLikeW1) {
  const Cloud a = test::gaussianCloud(40, 7), b = test::gaussianCloud(35, 8, 1.2);
  auto moved = [](Cloud c, double k, double dx, double dy) {
    c.points *= k;
    c.points.col(0).array() += dx;
    c.points.col(1).array() += dy;
    return c;
  };
  for (const char* id : {"critic_clip", "critic_gp", "critic_sn"}) {
    const Measure& m = *MeasureRegistry::instance().find(id);
    const double base = evaluateMeasure(m, a, b, shortRun(150)).value;
    const double scaled = evaluateMeasure(m, moved(a, 4.0, 0, 0), moved(b, 4.0, 0, 0), shortRun(150)).value;
    EXPECT_NEAR(scaled, 4.0 * base, 1e-12 * std::abs(base)) << id;
    for (double shift : {3.7, 1e6}) {
      const double far = evaluateMeasure(m, moved(a, 1.0, shift, -shift), moved(b, 1.0, shift, -shift), shortRun(150)).value;
      EXPECT_NEAR(far, base, 1e-6 * std::abs(base)) << id << " shifted by " << shift;
    }
  }
}

}  // namespace
}  // namespace barrow
