// Cloud model: validation names the row and the reason; weights normalise at use.
#include <gtest/gtest.h>

#include <cmath>

#include "cloud/cloud.h"

namespace barrow {
namespace {

Cloud three() {
  Eigen::MatrixX2d p(3, 2);
  p << 0, 0, 2, 0, 0, 1;
  Eigen::VectorXd w(3);
  w << 1, 2, 1;
  return Cloud("t", p, w);
}

TEST(CloudTest, ValidCloudPasses) { EXPECT_FALSE(three().validate()); }

TEST(CloudTest, NormalisedWeightsSumToOne) {
  const auto w = three().normalizedWeights();
  EXPECT_DOUBLE_EQ(w.sum(), 1.0);
  EXPECT_DOUBLE_EQ(w(1), 0.5);
}

// Weighted mean by hand: (0*1 + 2*2 + 0*1)/4 = 1, (0 + 0 + 1)/4 = 0.25.  [D]
TEST(CloudTest, WeightedMean) {
  const auto m = three().mean();
  EXPECT_DOUBLE_EQ(m.x(), 1.0);
  EXPECT_DOUBLE_EQ(m.y(), 0.25);
}

// Farthest pair of {(0,0),(2,0),(0,1)} is (2,0)-(0,1): sqrt(5).  [D]
TEST(CloudTest, DiameterIsFarthestPair) { EXPECT_DOUBLE_EQ(three().diameter(), std::sqrt(5.0)); }

TEST(CloudTest, EmptyCloudIsRejected) {
  Cloud c;
  c.name = "e";
  const auto e = c.validate();
  ASSERT_TRUE(e);
  EXPECT_NE(e->find("empty"), std::string::npos);
}

TEST(CloudTest, NanCoordinateNamesRow) {
  auto c = three();
  c.points(1, 1) = NAN;
  const auto e = c.validate();
  ASSERT_TRUE(e);
  EXPECT_NE(e->find("row 2"), std::string::npos) << *e;
  EXPECT_NE(e->find("y"), std::string::npos) << *e;
}

TEST(CloudTest, NegativeWeightNamesRow) {
  auto c = three();
  c.weights(2) = -0.1;
  const auto e = c.validate();
  ASSERT_TRUE(e);
  EXPECT_NE(e->find("row 3"), std::string::npos) << *e;
  EXPECT_NE(e->find("negative"), std::string::npos) << *e;
}

TEST(CloudTest, AllZeroWeightsAreRejected) {
  auto c = three();
  c.weights.setZero();
  const auto e = c.validate();
  ASSERT_TRUE(e);
  EXPECT_NE(e->find("zero"), std::string::npos) << *e;
}

TEST(CloudTest, InfiniteWeightIsRejected) {
  auto c = three();
  c.weights(0) = INFINITY;
  ASSERT_TRUE(c.validate());
}

}  // namespace
}  // namespace barrow
