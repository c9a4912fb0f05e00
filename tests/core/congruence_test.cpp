// rigidlyCongruent: a translated and/or rotated copy is recognised, anything else is not.
// Checks are constructed cases (common practice for a Procrustes fit; no outside source).
#include <gtest/gtest.h>

#include <cmath>

#include "cloud/congruence.h"
#include "support/test_support.h"

namespace barrow {
namespace {

Cloud randomCloud(int n, unsigned seed, double offset = 0.0) { return test::gaussianCloud(n, seed, offset); }

Cloud rotated(const Cloud& c, double radians, Eigen::RowVector2d about, Eigen::RowVector2d then) {
  Cloud out = c;
  const double cs = std::cos(radians), sn = std::sin(radians);
  for (Eigen::Index i = 0; i < c.size(); ++i) {
    const Eigen::RowVector2d d = c.points.row(i) - about;
    out.points.row(i) << about(0) + cs * d(0) - sn * d(1) + then(0), about(1) + sn * d(0) + cs * d(1) + then(1);
  }
  return out;
}

TEST(CongruenceTest, TranslationsAndRotationsAreRecognised) {
  const Cloud a = randomCloud(200, 1);
  EXPECT_TRUE(rigidlyCongruent(a, a));
  EXPECT_TRUE(rigidlyCongruent(a, rotated(a, 0.0, {0, 0}, {0.37, -2.5})));
  for (double deg : {1.0, 45.0, 90.0, 179.0, 270.0})
    EXPECT_TRUE(rigidlyCongruent(a, rotated(a, deg * M_PI / 180.0, a.points.colwise().mean(), {1.0, 2.0}))) << deg;
}

TEST(CongruenceTest, FarFromTheOriginTheRoundingOfTheMoveIsAllowed) {
  const Cloud a = randomCloud(100, 2, 1e6);
  EXPECT_TRUE(rigidlyCongruent(a, rotated(a, 0.0, {0, 0}, {0.1, 0.3})));
  EXPECT_TRUE(rigidlyCongruent(a, rotated(a, 0.3, a.points.colwise().mean(), {0, 0})));
}

TEST(CongruenceTest, TranslationOnlyWhenRotationIsNotAllowed) {
  const Cloud a = randomCloud(150, 4, 1e3);
  EXPECT_TRUE(rigidlyMoved(a.points, rotated(a, 0.0, {0, 0}, {0.5, -2.0}).points, false));
  EXPECT_FALSE(rigidlyMoved(a.points, rotated(a, 0.01, a.points.colwise().mean(), {0, 0}).points, false));
  EXPECT_TRUE(rigidlyMoved(a.points, rotated(a, 0.01, a.points.colwise().mean(), {0, 0}).points, true));
  Cloud stretched = a;
  stretched.points *= 1.05;
  EXPECT_FALSE(rigidlyMoved(a.points, stretched.points, false));
}

TEST(CongruenceTest, OtherChangesAreNot) {
  const Cloud a = randomCloud(100, 3);
  Cloud scaled = a;
  scaled.points *= 1.001;
  EXPECT_FALSE(rigidlyCongruent(a, scaled));
  Cloud onePoint = a;
  onePoint.points(17, 0) += 1e-6;
  EXPECT_FALSE(rigidlyCongruent(a, onePoint));
  Cloud reweighted = a;
  reweighted.weights(3) *= 2.0;
  EXPECT_FALSE(rigidlyCongruent(a, reweighted));
  Cloud mirrored = a;
  mirrored.points.col(0) *= -1.0;
  EXPECT_FALSE(rigidlyCongruent(a, mirrored));  // reflections are not looked for
  EXPECT_FALSE(rigidlyCongruent(a, randomCloud(99, 3)));
  EXPECT_FALSE(rigidlyCongruent(Cloud(), Cloud()));
}

}  // namespace
}  // namespace barrow
