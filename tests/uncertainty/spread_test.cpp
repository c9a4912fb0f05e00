// Resampling intervals: coverage of a known population value, frozen settings, reproducibility.
#include <gtest/gtest.h>

#include <cmath>

#include "measures/evaluate.h"
#include "measures/registry.h"
#include "support/test_support.h"
#include "uncertainty/spread.h"
#include "uncertainty/weighted_draw.h"
#include "uncertainty_test_data.h"

namespace barrow {
namespace {

const Measure& measure(const std::string& id) { return *MeasureRegistry::instance().find(id); }

// W2 between N(μa, Σa) and N(μb, Σb) (Dowson & Landau 1982, J. Multivariate Anal. 12:450) [P]:
// |μa − μb|² + tr(Σa + Σb − 2(Σa^½ Σb Σa^½)^½); for diagonal Σ the trace is
// Σ_i (√a_i − √b_i)². A = N(0, diag(1, 0.25)), B = N((0.8, 0), diag(0.25, 1)):
// 0.64 + 0.25 + 0.25 = 1.14, W2 ≈ 1.068. The 95 % percentile interval from 500 + 500 points
// and 200 resamples should cover it in about 95 of 100 replicates; 88–99 allows for the
// binomial spread (sd ≈ 2.2) and the interval's own O(1/n) error (Efron & Tibshirani 1993,
// ch. 13) [P].
TEST(SpreadTest, FrechetIntervalCoversPopulationValue) {
  const double population = std::sqrt(0.64 + std::pow(1.0 - 0.5, 2) + std::pow(0.5 - 1.0, 2));
  SpreadRequest req;
  req.measures = {&measure("frechet")};
  req.resamples = 200;
  int covered = 0;
  for (int rep = 0; rep < 100; ++rep) {
    const Cloud a = test::diagonalGaussian(500, 2 * unsigned(rep) + 1, 0, 0, 1, 0.25);
    const Cloud b = test::diagonalGaussian(500, 2 * unsigned(rep) + 2, 0.8, 0, 0.25, 1);
    req.seed = std::uint64_t(rep);
    const SpreadResult r = runSpread(a, b, req);
    ASSERT_EQ(r.rows[0].status, Status::Ok) << r.rows[0].message;
    covered += r.rows[0].low <= population && population <= r.rows[0].high;
  }
  EXPECT_GE(covered, 88);
  EXPECT_LE(covered, 99);
}

// The σ of "median" is fixed on the original pair and reused: a resample's value equals the
// measure evaluated by hand on the same draws with that number [D].
TEST(SpreadTest, SettingsAreFrozenOnTheOriginalPair) {
  const Cloud a = test::gaussianCloud(40, 8), b = test::gaussianCloud(45, 9, 0.5);
  SpreadRequest req;
  req.measures = {&measure("mmd")};
  req.params.set("mmd.sigma", "median");
  req.resamples = 5;
  req.seed = 3;
  const SpreadResult r = runSpread(a, b, req);
  const ParamSet& frozen = r.rows[0].settings;
  ASSERT_TRUE(frozen.has("mmd.sigma"));
  EXPECT_TRUE(parseNumber(frozen.text("mmd.sigma")).has_value()) << frozen.text("mmd.sigma");
  for (int rep = 0; rep < req.resamples; ++rep) {
    ReplicateRng rng(req.seed, std::uint64_t(rep));
    const Cloud ra = drawSample(a, WeightedSampler(a), int(a.size()), rng);
    const Cloud rb = drawSample(b, WeightedSampler(b), int(b.size()), rng);
    EvalRequest er;
    er.params = frozen;
    EXPECT_EQ(evaluateMeasure(measure("mmd"), ra, rb, er).value, r.rows[0].replicates[std::size_t(rep)]) << rep;
    er.params.set("mmd.sigma", "median");  // re-derived on the resample: a different number
    EXPECT_NE(evaluateMeasure(measure("mmd"), ra, rb, er).value, r.rows[0].replicates[std::size_t(rep)]) << rep;
  }
}

TEST(SpreadTest, SameSeedSameOutputWhateverTheThreadCount) {
  const Cloud a = test::gaussianCloud(60, 4), b = test::gaussianCloud(50, 5, 0.4);
  SpreadRequest req;
  for (const char* id : {"w1", "w2", "energy", "mmd", "sliced", "js", "hausdorff"}) req.measures.push_back(&measure(id));
  req.resamples = 24;
  req.seed = 123;
  req.threads = 1;
  const SpreadResult one = runSpread(a, b, req);
  req.threads = 2;
  const SpreadResult two = runSpread(a, b, req);
  for (std::size_t k = 0; k < one.rows.size(); ++k) {
    EXPECT_EQ(one.rows[k].replicates, two.rows[k].replicates) << one.rows[k].id;
    EXPECT_EQ(one.rows[k].low, two.rows[k].low);
    EXPECT_EQ(one.rows[k].high, two.rows[k].high);
    EXPECT_EQ(one.rows[k].failed, 0) << one.rows[k].message;
    EXPECT_LE(one.rows[k].low, one.rows[k].high);
  }
}

// The percentile interval is the resample quantiles themselves [D]; the basic interval is that
// one reflected about the value (Davison & Hinkley 1997, eq. 5.6) [P] (mem).
TEST(SpreadTest, BasicIntervalIsPercentileReflectedAboutValue) {
  const Cloud a = test::gaussianCloud(50, 14), b = test::gaussianCloud(50, 15, 1.0);
  SpreadRequest req;
  req.measures = {&measure("w1")};
  req.resamples = 50;
  const SpreadResult p = runSpread(a, b, req);
  req.interval = IntervalKind::Basic;
  const SpreadResult q = runSpread(a, b, req);
  const double v = p.rows[0].value;
  EXPECT_NEAR(q.rows[0].low, 2 * v - p.rows[0].high, 1e-12);
  EXPECT_NEAR(q.rows[0].high, 2 * v - p.rows[0].low, 1e-12);
}

TEST(SpreadTest, BadCountsAndLevelsAreRejected) {
  SpreadRequest req;
  req.measures = {&measure("w1")};
  for (int b : {0, kMaxResamples + 1}) {
    req.resamples = b;
    EXPECT_TRUE(checkSpreadRequest(req).has_value()) << b;
  }
  req.resamples = 10;
  for (double level : {0.0, 1.0, 1.5, -0.2, double(NAN)}) {
    req.level = level;
    EXPECT_TRUE(checkSpreadRequest(req).has_value()) << level;
  }
  req.level = 0.9;
  EXPECT_FALSE(checkSpreadRequest(req).has_value());
}

// Cancelling through the RunControl stops early and marks every row cancelled.
TEST(SpreadTest, CancelStopsAndMarksRowsCancelled) {
  const Cloud a = test::gaussianCloud(40, 1), b = test::gaussianCloud(40, 2);
  SpreadRequest req;
  req.measures = {&measure("energy")};
  req.resamples = 1000;
  int calls = 0;
  RunControl control;
  control.onProgress = [&](double) { return ++calls < 3; };
  const SpreadResult r = runSpread(a, b, req, &control);
  EXPECT_TRUE(r.cancelled);
  EXPECT_EQ(r.rows[0].status, Status::Cancelled);
}

}  // namespace
}  // namespace barrow
