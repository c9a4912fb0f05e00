// Findings against resampling bands: the comparisons follow their definitions [D].
#include <gtest/gtest.h>

#include "uncertainty/band_notes.h"

namespace barrow {
namespace {

SweepSeries series(std::vector<double> v, std::vector<double> lo, std::vector<double> hi) {
  SweepSeries s;
  s.id = "js";
  s.value = std::move(v);
  s.low = std::move(lo);
  s.high = std::move(hi);
  return s;
}

TEST(BandNotesTest, JumpLargerThanSpreadOnBothSidesIsSaidSo) {
  const std::vector<double> theta = {0.0, 0.1, 0.2, 0.3};
  const SweepSeries s = series({0.1, 0.1, 0.31, 0.31}, {0.09, 0.08, 0.29, 0.30}, {0.11, 0.12, 0.33, 0.32});
  Finding f;
  f.id = "js";
  f.jumps = {{0.15, 0.21}};
  const BandReading r = readAgainstBands(f, theta, s);
  ASSERT_EQ(r.jumps.size(), 1u);
  EXPECT_NEAR(r.jumps[0].spreadLeft, 0.04, 1e-12);
  EXPECT_NEAR(r.jumps[0].spreadRight, 0.04, 1e-12);
  EXPECT_TRUE(r.jumps[0].beyondSpread);
  EXPECT_NE(r.notes[0].find("jump of 0.21"), std::string::npos) << r.notes[0];
  EXPECT_NE(r.notes[0].find("resample spread 0.04"), std::string::npos) << r.notes[0];
}

TEST(BandNotesTest, JumpWithinSpreadOnOneSideMayBeNoise) {
  const std::vector<double> theta = {0.0, 0.1, 0.2};
  const SweepSeries s = series({0.1, 0.1, 0.3}, {0.0, 0.05, 0.1}, {0.2, 0.15, 0.5});
  Finding f;
  f.id = "js";
  f.jumps = {{0.15, 0.2}};
  const BandReading r = readAgainstBands(f, theta, s);
  EXPECT_FALSE(r.jumps[0].beyondSpread);  // 0.2 < 0.4 after the jump
  EXPECT_NE(r.notes[0].find("may be sample noise"), std::string::npos);
}

TEST(BandNotesTest, FlatStretchSurvivesOnlyWhenTheBandIsFlatToo) {
  const std::vector<double> theta = {0.0, 0.5, 1.0, 1.5};
  Finding f;
  f.id = "js";
  f.flat = {{0.5, 1.5}};
  const SweepSeries flat = series({0.0, 0.69, 0.69, 0.69}, {0.0, 0.69, 0.69, 0.69}, {0.1, 0.69, 0.69, 0.69});
  EXPECT_TRUE(readAgainstBands(f, theta, flat).flat[0].survives);
  const SweepSeries moving = series({0.0, 0.69, 0.69, 0.69}, {0.0, 0.5, 0.6, 0.69}, {0.1, 0.69, 0.69, 0.69});
  const BandReading r = readAgainstBands(f, theta, moving);
  EXPECT_FALSE(r.flat[0].survives);
  EXPECT_NEAR(r.flat[0].bandMove, 0.19, 1e-12);
  EXPECT_NE(r.notes[0].find("does not survive"), std::string::npos);
}

TEST(BandNotesTest, NoBandsNoNotes) {
  Finding f;
  f.jumps = {{0.1, 1.0}};
  SweepSeries s;
  s.value = {0, 1};
  EXPECT_TRUE(readAgainstBands(f, {0.0, 0.2}, s).notes.empty());
}

}  // namespace
}  // namespace barrow
