// Weighted draws and pooled re-splits: frequencies follow the weights, zero weights are never
// drawn, and a re-split keeps every point with its weight.
#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>

#include "measures/evaluate.h"
#include "measures/registry.h"
#include "support/test_support.h"
#include "uncertainty/weighted_draw.h"

namespace barrow {
namespace {

// Each count is Binomial(N, w_i): within 5 standard deviations of N·w_i [D].
TEST(WeightedDrawTest, FrequenciesFollowNormalisedWeights) {
  Eigen::MatrixX2d pts(4, 2);
  pts << 0, 0, 1, 0, 2, 0, 3, 0;
  Eigen::VectorXd w(4);
  w << 1.0, 0.0, 3.0, 6.0;
  const Cloud c("c", pts, w);
  const WeightedSampler s(c);
  ReplicateRng rng(7, 0);
  std::vector<int> count(4, 0);
  const int N = 100000;
  for (int i = 0; i < N; ++i) ++count[std::size_t(s.draw(rng))];
  EXPECT_EQ(count[1], 0);
  for (int i : {0, 2, 3}) {
    const double p = w[i] / 10.0;
    EXPECT_NEAR(count[std::size_t(i)], N * p, 5.0 * std::sqrt(N * p * (1 - p))) << i;
  }
  EXPECT_EQ(s.at(0.0), 0);
  EXPECT_EQ(s.at(std::nextafter(1.0, 0.0)), 3);
}

TEST(WeightedDrawTest, SampleCarriesUniformWeightsAndRequestedSize) {
  const Cloud c = test::gaussianCloud(30, 3);
  const WeightedSampler s(c);
  ReplicateRng rng(1, 5);
  const Cloud d = drawSample(c, s, 12, rng);
  ASSERT_EQ(d.size(), 12);
  EXPECT_NEAR((d.weights.array() - d.weights[0]).abs().maxCoeff(), 0.0, 0.0);
}

// Merging a resample's repeats keeps its empirical measure: every drawn row once, weighted
// by its count, the same total; and the exact transport value does not change [D] (optimal
// transport is defined between measures; a point of mass k/n is k points of mass 1/n). The
// exact solver's certificate is checked to 1e-9 relative (DEVELOPERS.md, Measure
// conventions); the two problems are different linear programs, so the values may differ
// in the last bits, not more.
TEST(WeightedDrawTest, MergedRepeatsKeepTheEmpiricalMeasureAndTheTransportValue) {
  const Cloud a = test::gaussianCloud(120, 11), b = test::gaussianCloud(90, 12, 1.5);
  const WeightedSampler sa(a), sb(b);
  for (std::uint64_t r = 0; r < 5; ++r) {
    ReplicateRng rng(3, r);
    const std::vector<int> rowsA = drawRows(sa, 120, rng), rowsB = drawRows(sb, 90, rng);
    const Cloud pa = sampleOfRows(a, rowsA), pb = sampleOfRows(b, rowsB);
    const Cloud ma = mergedSampleOfRows(a, rowsA), mb = mergedSampleOfRows(b, rowsB);
    EXPECT_LT(ma.size(), pa.size()) << "a draw of 120 from 120 repeats some rows";
    EXPECT_DOUBLE_EQ(ma.weights.sum(), 120.0);
    for (Eigen::Index i = 0; i < ma.size(); ++i) {
      int n = 0;
      for (Eigen::Index j = 0; j < pa.size(); ++j) n += pa.points.row(j) == ma.points.row(i);
      EXPECT_EQ(double(n), ma.weights[i]) << "row " << i;
    }
    for (const char* id : {"w1", "w2"}) {
      const Measure* m = MeasureRegistry::instance().find(id);
      ASSERT_NE(m, nullptr);
      ASSERT_TRUE(m->repeatsMayMerge());
      const Result plain = evaluateMeasure(*m, pa, pb, EvalRequest{});
      const Result merged = evaluateMeasure(*m, ma, mb, EvalRequest{});
      ASSERT_EQ(plain.status, Status::Ok) << plain.message;
      ASSERT_EQ(merged.status, Status::Ok) << merged.message;
      EXPECT_NEAR(merged.value, plain.value, 1e-12 * plain.value) << id << " resample " << r;
    }
  }
}

TEST(WeightedDrawTest, SplitKeepsEveryPointWithItsWeight) {
  const Cloud a = test::gaussianCloud(7, 1), b = test::gaussianCloud(5, 2, 3.0);
  const PooledPair pooled(a, b);
  ReplicateRng rng(9, 3);
  Cloud pa, pb;
  pooled.split(rng, &pa, &pb);
  ASSERT_EQ(pa.size(), 7);
  ASSERT_EQ(pb.size(), 5);
  std::vector<std::array<double, 3>> before, after;
  const Eigen::VectorXd wa = a.normalizedWeights(), wb = b.normalizedWeights();
  for (int i = 0; i < 7; ++i) before.push_back({a.points(i, 0), a.points(i, 1), wa[i]});
  for (int i = 0; i < 5; ++i) before.push_back({b.points(i, 0), b.points(i, 1), wb[i]});
  for (int i = 0; i < 7; ++i) after.push_back({pa.points(i, 0), pa.points(i, 1), pa.weights[i]});
  for (int i = 0; i < 5; ++i) after.push_back({pb.points(i, 0), pb.points(i, 1), pb.weights[i]});
  std::sort(before.begin(), before.end());
  std::sort(after.begin(), after.end());
  EXPECT_EQ(before, after);
}

// The stream of a replicate depends on (seed, index) only [D]: the same pair repeats it,
// another index or seed does not.
TEST(WeightedDrawTest, StreamsDependOnSeedAndIndexOnly) {
  ReplicateRng a(42, 3), b(42, 3), c(42, 4), d(43, 3);
  const auto x = a.next();
  EXPECT_EQ(x, b.next());
  EXPECT_NE(x, c.next());
  EXPECT_NE(x, d.next());
  ReplicateRng e(5, 0);
  for (int i = 0; i < 1000; ++i) {
    const auto k = e.below(7);
    ASSERT_LT(k, 7u);
    const double u = e.uniform();
    ASSERT_GE(u, 0.0);
    ASSERT_LT(u, 1.0);
  }
}

}  // namespace
}  // namespace barrow
