// Resampling bands of a sweep: each θ's band is the resampling interval of that θ's pair, the
// thread count does not matter, and the CSV carries lo_<id>, hi_<id> after the d_<id> columns.
#include <gtest/gtest.h>

#include <cmath>

#include "measures/registry.h"
#include "support/test_support.h"
#include "io/sweep_csv.h"
#include "sweep/sweep_engine.h"
#include "families/family_map.h"
#include "uncertainty/spread.h"
#include "uncertainty/sweep_bands.h"

namespace barrow {
namespace {

SweepResult smallSweep(const Cloud& a, const Cloud& b) {
  SweepRequest req;
  req.settings.family = Family::Shift;
  req.settings.from = -1.0;
  req.settings.to = 1.0;
  req.settings.steps = 5;
  req.settings.measures = {"w1", "energy"};
  req.refineJumps = false;
  return runSweep(a, b, req);
}

// For a family that moves points, replicate r picks the same rows of A at every θ from the same
// uniforms as a resample of (A_θ, B) under the same seed, so without warm starts the band at θ
// is the percentile interval `spread` gives for A_θ and B [D]. Equal to rounding, not to the
// bit: `spread` solves exact transport on the resample with its repeats merged into weights
// (the same measure, a smaller linear program; weighted_draw.h), the band on the plain one.
TEST(SweepBandsTest, BandAtEachThetaIsTheSpreadIntervalThere) {
  const Cloud a = test::gaussianCloud(30, 1), b = test::gaussianCloud(35, 2, 0.5);
  SweepResult r = smallSweep(a, b);
  SweepBandRequest br;
  br.resamples = 30;
  br.seed = 9;
  br.warmStart = false;
  ASSERT_FALSE(addSweepBands(a, b, r, br).has_value());
  const FamilyMap family(a, b, r.settings);
  SpreadRequest sr;
  sr.measures = {MeasureRegistry::instance().find("w1"), MeasureRegistry::instance().find("energy")};
  sr.resamples = 30;
  sr.seed = 9;
  for (std::size_t t = 0; t < r.theta.size(); ++t) {
    const SpreadResult s = runSpread(family.at(r.theta[t]), b, sr);
    for (std::size_t m = 0; m < 2; ++m) {
      EXPECT_NEAR(r.series[m].low[t], s.rows[m].low, 1e-12 * std::abs(s.rows[m].low)) << r.series[m].id << " θ=" << r.theta[t];
      EXPECT_NEAR(r.series[m].high[t], s.rows[m].high, 1e-12 * std::abs(s.rows[m].high)) << r.series[m].id << " θ=" << r.theta[t];
      EXPECT_LE(r.series[m].low[t], r.series[m].high[t]);
    }
  }
  // With warm starts along each replicate's path the exact solver reaches the same optimum.
  SweepResult warm = smallSweep(a, b);
  br.warmStart = true;
  ASSERT_FALSE(addSweepBands(a, b, warm, br).has_value());
  for (std::size_t t = 0; t < r.theta.size(); ++t) EXPECT_NEAR(warm.series[0].low[t], r.series[0].low[t], 1e-10);
}

TEST(SweepBandsTest, ThreadCountDoesNotChangeBands) {
  const Cloud a = test::gaussianCloud(25, 3), b = test::gaussianCloud(25, 4, 1.0);
  SweepResult one = smallSweep(a, b), two = smallSweep(a, b);
  SweepBandRequest br;
  br.resamples = 12;
  br.threads = 1;
  ASSERT_FALSE(addSweepBands(a, b, one, br).has_value());
  br.threads = 2;
  ASSERT_FALSE(addSweepBands(a, b, two, br).has_value());
  for (std::size_t m = 0; m < one.series.size(); ++m) {
    EXPECT_EQ(one.series[m].low, two.series[m].low);
    EXPECT_EQ(one.series[m].high, two.series[m].high);
  }
}

TEST(SweepBandsTest, CsvCarriesBandColumnsAfterSlopesAndReadsThemBack) {
  const Cloud a = test::gaussianCloud(20, 5), b = test::gaussianCloud(20, 6, 1.0);
  SweepResult r = smallSweep(a, b);
  SweepBandRequest br;
  br.resamples = 8;
  br.level = 0.9;
  br.seed = 4;
  ASSERT_FALSE(addSweepBands(a, b, r, br).has_value());
  const std::string csv = formatSweepCsv(r);
  EXPECT_NE(csv.find("\ntheta,w1,energy,d_w1,d_energy,lo_w1,hi_w1,lo_energy,hi_energy\n"), std::string::npos) << csv;
  const auto back = parseSweepCsv(csv, "bands.csv");
  ASSERT_TRUE(back) << back.error.text();
  EXPECT_EQ(back.value->bandResamples, 8);
  EXPECT_EQ(back.value->bandLevel, 0.9);
  EXPECT_EQ(back.value->bandSeed, 4u);
  for (std::size_t m = 0; m < 2; ++m) {
    EXPECT_EQ(back.value->series[m].low, r.series[m].low);
    EXPECT_EQ(back.value->series[m].high, r.series[m].high);
  }
  // Without bands the header is the original contract's.
  const std::string plain = formatSweepCsv(smallSweep(a, b));
  EXPECT_NE(plain.find("\ntheta,w1,energy,d_w1,d_energy\n"), std::string::npos);
}

TEST(SweepBandsTest, BadCountsAndLevelsAreRejected) {
  const Cloud a = test::gaussianCloud(10, 5), b = test::gaussianCloud(10, 6);
  SweepResult r = smallSweep(a, b);
  SweepBandRequest br;
  br.resamples = 0;
  EXPECT_TRUE(addSweepBands(a, b, r, br).has_value());
  br.resamples = 10;
  br.level = 1.0;
  EXPECT_TRUE(addSweepBands(a, b, r, br).has_value());
  EXPECT_TRUE(r.series[0].low.empty());
}

}  // namespace
}  // namespace barrow
