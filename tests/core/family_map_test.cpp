// Parameter families θ ↦ A_θ: positions, weights and velocities against their definitions.
#include <gtest/gtest.h>

#include <cmath>

#include "families/family_map.h"
#include "measures/evaluate.h"
#include "measures/registry.h"
#include "sweep/sweep_settings.h"

namespace barrow {
namespace {

Cloud cloudA() {
  Eigen::MatrixX2d p(4, 2);
  p << 0, 0, 2, 0, 1, 3, -1, 1;
  Eigen::VectorXd w(4);
  w << 1, 2, 3, 4;
  return Cloud("A", p, w);
}
Cloud cloudB() {
  Eigen::MatrixX2d p(3, 2);
  p << 5, 5, 6, 4, 4, 7;
  return Cloud("B", p);
}

SweepSettings settings(Family family) {
  SweepSettings s;
  s.family = family;
  return s;
}

// Central difference of at(θ) with a small step, to check velocity() independently [D].
Eigen::MatrixX2d numericVelocity(const FamilyMap& f, double theta, double h) {
  return (f.at(theta + h).points - f.at(theta - h).points) / (2 * h);
}

TEST(FamilyMapTest, ShiftMovesEveryPointByThetaAlongTheUnitDirection) {
  auto s = settings(Family::Shift);
  s.direction = {3.0, 4.0};
  const FamilyMap f(cloudA(), cloudB(), s);
  ASSERT_FALSE(f.error());
  const Cloud a = f.at(2.5);
  for (Eigen::Index i = 0; i < a.size(); ++i) {
    EXPECT_NEAR(a.points(i, 0), cloudA().points(i, 0) + 1.5, 1e-15);  // 2.5 × 3/5
    EXPECT_NEAR(a.points(i, 1), cloudA().points(i, 1) + 2.0, 1e-15);  // 2.5 × 4/5
  }
  EXPECT_EQ(a.weights, cloudA().weights);
  const Eigen::MatrixX2d v = f.velocity(0.7);
  for (Eigen::Index i = 0; i < v.rows(); ++i) {
    EXPECT_DOUBLE_EQ(v(i, 0), 0.6);
    EXPECT_DOUBLE_EQ(v(i, 1), 0.8);
  }
}

TEST(FamilyMapTest, RotateTurnsAboutTheWeightedCentroidInDegrees) {
  const FamilyMap f(cloudA(), cloudB(), settings(Family::Rotate));
  ASSERT_FALSE(f.error());
  const Eigen::Vector2d c = cloudA().mean();  // (0.2·2 + 0.3·1 − 0.4·1, 0.3·3 + 0.4·1) = (0.3, 1.3)
  EXPECT_NEAR(c.x(), 0.3, 1e-15);
  EXPECT_NEAR(c.y(), 1.3, 1e-15);
  const Cloud q = f.at(90.0);
  for (Eigen::Index i = 0; i < q.size(); ++i) {
    const Eigen::Vector2d r = cloudA().point(i) - c;  // a quarter turn maps (x, y) to (−y, x)
    EXPECT_NEAR(q.points(i, 0), c.x() - r.y(), 1e-12);
    EXPECT_NEAR(q.points(i, 1), c.y() + r.x(), 1e-12);
  }
  EXPECT_LT((f.at(360.0).points - cloudA().points).norm(), 1e-12);
  EXPECT_LT((f.at(37.0).mean() - c).norm(), 1e-12);  // the pivot is fixed
  EXPECT_LT((f.velocity(37.0) - numericVelocity(f, 37.0, 1e-4)).norm(), 1e-8);
}

TEST(FamilyMapTest, ScaleAboutAGivenPivot) {
  auto s = settings(Family::Scale);
  s.center = std::array<double, 2>{1.0, -2.0};
  const FamilyMap f(cloudA(), cloudB(), s);
  const Cloud q = f.at(3.0);
  for (Eigen::Index i = 0; i < q.size(); ++i) {
    EXPECT_NEAR(q.points(i, 0), 1.0 + 3.0 * (cloudA().points(i, 0) - 1.0), 1e-12);
    EXPECT_NEAR(q.points(i, 1), -2.0 + 3.0 * (cloudA().points(i, 1) + 2.0), 1e-12);
  }
  EXPECT_LT((f.at(1.0).points - cloudA().points).norm(), 1e-15);
  EXPECT_LT((f.velocity(0.4) - numericVelocity(f, 0.4, 1e-3)).norm(), 1e-10);
}

TEST(FamilyMapTest, MixIsTheUnionWithWeightsShared) {
  const FamilyMap f(cloudA(), cloudB(), settings(Family::Mix));
  const Cloud m = f.at(0.25);
  ASSERT_EQ(m.size(), 7);
  EXPECT_NEAR(m.weights.sum(), 1.0, 1e-15);
  EXPECT_NEAR(m.weights(1), 0.75 * 0.2, 1e-15);      // A's weight 2 of 10, times 1 − θ
  EXPECT_NEAR(m.weights(4), 0.25 / 3.0, 1e-15);      // B uniform, times θ
  EXPECT_EQ(m.points.bottomRows(3), cloudB().points);
  // (1−θ)A + θB has mean (1−θ)mA + θmB [D].
  EXPECT_LT((m.mean() - (0.75 * cloudA().mean() + 0.25 * cloudB().mean())).norm(), 1e-14);
  EXPECT_FALSE(m.validate());
  EXPECT_FALSE(f.at(0.0).validate());
  EXPECT_FALSE(f.at(1.0).validate());
  EXPECT_EQ(f.velocity(0.5).rows(), 0);  // points do not move
}

TEST(FamilyMapTest, BadInputIsAnErrorNotACrash) {
  auto s = settings(Family::Shift);
  s.direction = {0.0, 0.0};
  EXPECT_TRUE(FamilyMap(cloudA(), cloudB(), s).error());
  EXPECT_TRUE(FamilyMap(Cloud("E", Eigen::MatrixX2d(0, 2)), cloudB(), settings(Family::Rotate)).error());
  Cloud nan = cloudB();
  nan.points(2, 0) = NAN;
  const FamilyMap bad(cloudA(), nan, settings(Family::Mix));
  ASSERT_TRUE(bad.error());
  EXPECT_NE(bad.error()->find("B"), std::string::npos);
  EXPECT_EQ(bad.at(0.5).points, cloudA().points);  // documented fallback: A unchanged
  EXPECT_EQ(bad.velocity(0.5).rows(), 0);
}

TEST(FamilyMapTest, DefaultRangesSuitEachFamily) {
  for (const FamilySpec& spec : familySpecs()) {
    SweepSettings s = settings(spec.family);
    s.from = spec.from;
    s.to = spec.to;
    EXPECT_FALSE(s.validate()) << spec.name;
  }
  EXPECT_EQ(familySpec(Family::Rotate).from, -180.0);
  EXPECT_EQ(familySpec(Family::Rotate).to, 180.0);
}

// The table is the only list of families: every enum value has one row, names are unique and
// read back, and the error text lists them all [CP].
TEST(FamilySpecTest, EveryFamilyHasOneRowAndItsNameReadsBack) {
  const Family all[] = {Family::Shift, Family::Rotate, Family::Scale, Family::Interpolate, Family::Mix};
  EXPECT_EQ(familySpecs().size(), std::size(all));
  for (Family f : all) {
    EXPECT_EQ(familySpec(f).family, f);
    const FamilySpec* back = findFamily(familySpec(f).name);
    ASSERT_NE(back, nullptr);
    EXPECT_EQ(back->family, f);
    EXPECT_NE(familyChoices().find(familySpec(f).name), std::string::npos);
  }
  EXPECT_EQ(findFamily("twist"), nullptr);
}

// Displacement interpolation along the exact W2 plan: every plan entry becomes one point of
// the same mass at (1−t)x_i + t·y_j [P] McCann 1997; Villani 2003 §5.1 (mem).
TEST(FamilyMapTest, InterpolateFollowsTheW2PlanEntries) {
  ASSERT_NE(MeasureRegistry::instance().find("w2"), nullptr) << "w2 is not registered";
  const FamilyMap f(cloudA(), cloudB(), settings(Family::Interpolate));
  ASSERT_FALSE(f.error()) << *f.error();
  const auto& plan = f.plan();
  ASSERT_FALSE(plan.empty());
  const Cloud start = f.at(0.0), end = f.at(1.0), mid = f.at(0.3);
  ASSERT_EQ(mid.size(), Eigen::Index(plan.size()));
  double total = 0;
  Eigen::VectorXd outA = Eigen::VectorXd::Zero(4), inB = Eigen::VectorXd::Zero(3);
  for (std::size_t e = 0; e < plan.size(); ++e) {
    const auto& p = plan[e];
    const auto k = Eigen::Index(e);
    EXPECT_LT((start.point(k) - cloudA().point(p.i)).norm(), 1e-15);
    EXPECT_LT((end.point(k) - cloudB().point(p.j)).norm(), 1e-15);
    EXPECT_LT((mid.point(k) - (0.7 * cloudA().point(p.i) + 0.3 * cloudB().point(p.j))).norm(), 1e-14);
    EXPECT_DOUBLE_EQ(mid.weights(k), p.mass);
    total += p.mass;
    outA(p.i) += p.mass;
    inB(p.j) += p.mass;
  }
  EXPECT_NEAR(total, 1.0, 1e-12);
  EXPECT_LT((outA - cloudA().normalizedWeights()).lpNorm<Eigen::Infinity>(), 1e-12);  // marginals
  EXPECT_LT((inB - cloudB().normalizedWeights()).lpNorm<Eigen::Infinity>(), 1e-12);
  EXPECT_LT((f.velocity(0.3) - numericVelocity(f, 0.3, 1e-3)).norm(), 1e-10);
}

}  // namespace
}  // namespace barrow
