// Continuity findings on hand-made sweeps whose behaviour is known by construction [D]:
// step functions, |θ|, saturating curves, +∞ stretches, failures.
#include <gtest/gtest.h>

#include <cmath>
#include <functional>

#include "sweep/continuity.h"
#include "io/findings_json.h"
#include "sweep/finite_slope.h"

namespace barrow {
namespace {

std::vector<double> grid(double from, double to, int n) {
  std::vector<double> t;
  for (int k = 0; k < n; ++k) t.push_back(from + (to - from) * k / (n - 1));
  return t;
}

// Adds points on both sides of `at`, halving down to `tol`, as the refinement would.
void refineAround(std::vector<double>& theta, double at, double tol) {
  for (double w = 0.025; w >= tol / 2; w /= 2) {
    theta.push_back(at - w / 2);
    theta.push_back(at + w / 2);
  }
  std::sort(theta.begin(), theta.end());
  theta.erase(std::unique(theta.begin(), theta.end()), theta.end());
}

SweepResult sweepOf(const std::string& id, const std::vector<double>& theta,
                    const std::function<double(double)>& d, double refineTol = 0.0) {
  SweepResult r;
  r.theta = theta;
  r.refineTolerance = refineTol;
  SweepSeries s;
  s.id = id;
  for (double t : theta) {
    const double v = d(t);
    s.value.push_back(v);
    s.status.push_back(std::isnan(v) ? Status::InvalidInput : std::isinf(v) ? Status::Infinite : Status::Ok);
  }
  s.slope = finiteDifferenceSlopes(theta, s.value);
  r.series.push_back(s);
  return r;
}

// Histogram JS on parallel lines: 0 while A_θ and B share x-bins, ln 2 once they do not
// (REFERENCES 1d: a step function of θ) [D].
TEST(ContinuityTest, HistogramStyleStepsAreJumpsWithFlatSaturatedStretches) {
  auto theta = grid(-1, 1, 41);
  refineAround(theta, -0.125 - 1e-3, 2e-5);
  refineAround(theta, 0.125 + 1e-3, 2e-5);
  const double ln2 = std::log(2.0);
  const auto r = sweepOf("js", theta, [&](double t) { return std::abs(t) < 0.126 ? 0.0 : ln2; }, 2e-5);
  const Finding f = findContinuity(r)[0];
  EXPECT_FALSE(f.continuous);
  ASSERT_EQ(f.jumps.size(), 2u);
  EXPECT_NEAR(f.jumps[0].theta, -0.126, 2e-5);
  EXPECT_NEAR(f.jumps[0].size, -ln2, 1e-15);
  EXPECT_NEAR(f.jumps[1].theta, 0.126, 2e-5);
  EXPECT_NEAR(f.jumps[1].size, ln2, 1e-15);
  ASSERT_EQ(f.flat.size(), 2u);
  EXPECT_EQ(f.flat[0].first, -1.0);
  EXPECT_NEAR(f.flat[0].second, -0.126, 1e-4);
  EXPECT_NEAR(f.flat[1].first, 0.126, 1e-4);
  EXPECT_EQ(f.flat[1].second, 1.0);
  EXPECT_EQ(f.lipschitz, 0.0);
  EXPECT_TRUE(f.monotone);
  EXPECT_NE(f.summary.find("constant at 0.693 for θ ≤ -0.126 and for θ ≥ 0.126"), std::string::npos) << f.summary;
  EXPECT_NE(f.summary.find("no gradient there"), std::string::npos) << f.summary;
  EXPECT_NE(f.summary.find("confirmed by bisection"), std::string::npos) << f.summary;
}

// W1(A, A + θe1) = |θ| (REFERENCES 1b): continuous, Lipschitz 1, minimum at 0 [P] Arjovsky et al.
// 2017, Example 1.
TEST(ContinuityTest, AbsoluteValueIsContinuousLipschitzOneAndMonotone) {
  const auto r = sweepOf("w1", grid(-1, 1, 81), [](double t) { return std::abs(t); }, 2e-5);
  const Finding f = findContinuity(r)[0];
  EXPECT_TRUE(f.continuous);
  EXPECT_TRUE(f.jumps.empty());
  EXPECT_TRUE(f.flat.empty());
  EXPECT_NEAR(f.lipschitz, 1.0, 1e-12);
  EXPECT_TRUE(f.monotone);
  EXPECT_NE(f.summary.find("w1 is continuous"), std::string::npos) << f.summary;
  EXPECT_NE(f.summary.find("best θ = 0"), std::string::npos) << f.summary;
}

// A kernel-type distance saturates away from the optimum: no gradient there, while the
// basin around the minimum (slope also near 0) is not flagged [D].
TEST(ContinuityTest, SaturationIsFlatButTheMinimumIsNot) {
  const auto r = sweepOf("mmd", grid(-1, 1, 201), [](double t) { return 1 - std::exp(-t * t / 0.01); }, 2e-5);
  const Finding f = findContinuity(r)[0];
  EXPECT_TRUE(f.continuous);
  EXPECT_TRUE(f.monotone);
  ASSERT_EQ(f.flat.size(), 2u);
  EXPECT_EQ(f.flat[0].first, -1.0);
  EXPECT_EQ(f.flat[1].second, 1.0);
  // |D'| = (2|θ|/0.01)e^{−θ²/0.01} drops below 1e-3 × range/2 between |θ| = 0.37 and 0.40.
  EXPECT_GT(f.flat[1].first, 0.3);
  EXPECT_LT(f.flat[1].first, 0.45);
  // The largest slope is √(2/0.01)·e^{−1/2} = 8.58 at |θ| = 0.0707 [D]; secants are a bit lower.
  EXPECT_GT(f.lipschitz, 8.3);
  EXPECT_LE(f.lipschitz, 8.578);
}

// A measure that barely varies over the sweep (W1 under a small rotation, say): its minimum is
// written with enough digits to differ from the rest of its values (common practice) [D].
TEST(ContinuityTest, MinimumOfANarrowSeriesKeepsTheDigitsThatMatter) {
  const auto r = sweepOf("w1", grid(-1, 1, 41), [](double t) { return 1.20012 + 0.0033 * std::max(0.0, std::abs(t) - 0.1); });
  const Finding f = findContinuity(r)[0];
  EXPECT_NE(f.summary.find("its minimum 1.20012 (θ in [-0.1, 0.1])"), std::string::npos) << f.summary;
  // A series spread wide keeps three digits.
  const auto wide = sweepOf("w2", grid(-1, 1, 41), [](double t) { return 0.123456 + std::max(0.0, std::abs(t) - 0.1); });
  EXPECT_NE(findContinuity(wide)[0].summary.find("its minimum 0.123 ("), std::string::npos) << findContinuity(wide)[0].summary;
}

TEST(ContinuityTest, ADipAwayFromTheBestThetaIsNotMonotone) {
  const auto r = sweepOf("chamfer", grid(-1, 1, 41), [](double t) {
    return std::abs(t) - (std::abs(t - 0.6) < 0.06 ? 0.2 : 0.0);
  });
  const Finding f = findContinuity(r)[0];
  EXPECT_FALSE(f.monotone);
  EXPECT_NE(f.summary.find("does not grow steadily"), std::string::npos) << f.summary;
}

TEST(ContinuityTest, JumpToInfinityAndTheInfiniteStretchAreReported) {
  auto theta = grid(-1, 1, 41);
  refineAround(theta, 0.31, 2e-5);
  const auto r = sweepOf("kl_ab", theta, [](double t) { return t > 0.31 ? INFINITY : t * t; }, 2e-5);
  const Finding f = findContinuity(r)[0];
  ASSERT_EQ(f.jumps.size(), 1u);
  EXPECT_TRUE(std::isinf(f.jumps[0].size));
  EXPECT_NEAR(f.jumps[0].theta, 0.31, 2e-5);
  ASSERT_FALSE(f.flat.empty());
  EXPECT_EQ(f.flat.back().second, 1.0);
  EXPECT_NEAR(f.flat.back().first, 0.31, 2e-5);
  EXPECT_TRUE(f.monotone);  // +∞ is the largest value of all
  EXPECT_NE(f.summary.find("to +∞ at θ = 0.31"), std::string::npos) << f.summary;
  EXPECT_NE(f.summary.find("is +∞ for θ ≥ 0.31"), std::string::npos) << f.summary;
  const auto j = findingsToJson({f});
  EXPECT_TRUE(j["findings"][0]["jumps"][0]["size"].is_null());
}

// Without refinement the rule sees the grid only: a step much larger than its neighbours
// is a suspect, but it cannot be confirmed, so it is "unresolved" (never a jump) and the
// summary says why; a slope twice the others is not even a suspect.
TEST(ContinuityTest, GridAloneRuleLeavesOutlierStepsUnresolvedAndSaysSo) {
  const auto step = sweepOf("tv", grid(0, 1, 21), [](double t) { return t > 0.52 ? 1.0 + 0.1 * t : 0.1 * t; });
  const Finding f = findContinuity(step)[0];
  EXPECT_TRUE(f.jumps.empty());
  ASSERT_EQ(f.unresolved.size(), 1u);
  EXPECT_NEAR(f.unresolved[0].theta, 0.525, 1e-12);
  EXPECT_NEAR(f.unresolved[0].size, 1.005, 1e-12);
  EXPECT_FALSE(f.continuous);
  EXPECT_NE(f.summary.find("without refinement"), std::string::npos) << f.summary;
  EXPECT_NEAR(f.lipschitz, 0.1, 1e-12);  // the suspect interval is left out

  const auto kink = sweepOf("w2", grid(0, 1, 21), [](double t) { return t < 0.5 ? t : 0.5 + 2 * (t - 0.5); });
  EXPECT_TRUE(findContinuity(kink)[0].continuous);
}

// A measure that is +∞ at every θ says exactly that (disjoint supports for KL) [D].
TEST(ContinuityTest, InfiniteEverywhereIsSaidPlainly) {
  const auto r = sweepOf("kl_ab", grid(0, 1, 11), [](double) { return INFINITY; }, 1e-5);
  const Finding f = findContinuity(r)[0];
  EXPECT_TRUE(f.jumps.empty());
  EXPECT_EQ(f.summary, "kl_ab is +∞ at every θ of the sweep: it gives no gradient anywhere");
  EXPECT_TRUE(f.infiniteEverywhere);
}

// A jump to +∞ keeps its direction in JSON, and one from +∞ too [D].
TEST(ContinuityTest, JumpsToAndFromInfinityKeepTheirDirectionInJson) {
  auto theta = grid(-1, 1, 41);
  refineAround(theta, -0.31, 2e-5);
  refineAround(theta, 0.31, 2e-5);
  const auto r = sweepOf("kl_ab", theta, [](double t) { return std::abs(t) > 0.31 ? 1.0 + t : INFINITY; }, 2e-5);
  const auto j = findingsToJson(findContinuity(r));
  const auto& jumps = j["findings"][0]["jumps"];
  ASSERT_EQ(jumps.size(), 2u) << j.dump();
  EXPECT_EQ(jumps[0]["to"], "inf");
  EXPECT_EQ(jumps[1]["from"], "inf");
  EXPECT_TRUE(jumps[0]["size"].is_null());
}

// A curve that drops, rises and drops again is not monotone away from its best θ [D].
TEST(ContinuityTest, DropRiseDropIsNotMonotone) {
  const auto r = sweepOf("x", grid(0, 1, 41), [](double t) { return std::cos(9.0 * t) + 0.3 * t; });
  EXPECT_FALSE(findContinuity(r)[0].monotone);
}

TEST(ContinuityTest, FailuresAreSkippedAndCounted) {
  auto r = sweepOf("energy", grid(-1, 1, 21), [](double t) { return std::abs(t - 0.3) < 0.06 ? NAN : std::abs(t); });
  r.series[0].message = "did not converge";
  const Finding f = findContinuity(r)[0];
  EXPECT_TRUE(f.continuous);
  EXPECT_NEAR(f.lipschitz, 1.0, 1e-12);
  EXPECT_NE(f.summary.find("failed at 1 of 21"), std::string::npos) << f.summary;

  const auto all = sweepOf("kl_ba", grid(0, 1, 5), [](double) { return NAN; });
  auto g = all;
  g.series[0].message = "bandwidth is zero";
  const Finding h = findContinuity(g)[0];
  EXPECT_FALSE(h.continuous);
  EXPECT_TRUE(std::isnan(h.lipschitz));
  EXPECT_EQ(h.summary, "kl_ba failed at every θ: bandwidth is zero");
  EXPECT_TRUE(findingsToJson({h})["findings"][0]["lipschitz"].is_null());
}

TEST(ContinuityTest, ConstantSeriesHasNoGradientAnywhere) {
  const auto r = sweepOf("hausdorff", grid(0, 2, 11), [](double) { return 0.75; });
  const Finding f = findContinuity(r)[0];
  EXPECT_TRUE(f.continuous);
  ASSERT_EQ(f.flat.size(), 1u);
  EXPECT_EQ(f.flat[0], std::make_pair(0.0, 2.0));
  EXPECT_NE(f.summary.find("constant at 0.75 over the whole sweep"), std::string::npos) << f.summary;

  // Rounding-level wiggles (a rotation of a rotation-invariant measure) are still constant.
  int k = 0;
  const auto wiggly = sweepOf("tv", grid(-180, 180, 21), [&](double) { return 0.903 + ((k++ % 3) - 1) * 1e-16; });
  const Finding g = findContinuity(wiggly)[0];
  EXPECT_TRUE(g.continuous);
  EXPECT_TRUE(g.monotone);
  EXPECT_NE(g.summary.find("constant at 0.903 over the whole sweep"), std::string::npos) << g.summary;
}

TEST(ContinuityTest, JsonHasTheContractShapeAndKeyOrder) {
  auto theta = grid(0, 1, 21);
  refineAround(theta, 0.13, 2e-5);
  const auto r = sweepOf("js", theta, [](double t) { return t > 0.13 ? std::log(2.0) : 0.0; }, 2e-5);
  const auto j = findingsToJson(findContinuity(r));
  const std::string text = j.dump();
  EXPECT_EQ(text.rfind("{\"findings\":[{\"id\":\"js\",\"continuous\":false,\"jumps\":[{\"theta\":", 0), 0u) << text;
  const auto& f = j["findings"][0];
  EXPECT_TRUE(f["flat"][0].is_array());
  EXPECT_EQ(f["flat"][0].size(), 2u);
  for (const char* key : {"lipschitz", "monotone", "summary"}) EXPECT_TRUE(f.contains(key)) << key;
  EXPECT_LT(text.find("\"lipschitz\""), text.find("\"monotone\""));
  EXPECT_LT(text.find("\"monotone\""), text.find("\"summary\""));
}

}  // namespace
}  // namespace barrow
