// Thinning a large plan for drawing (ui/plan_thinning.h) and the legend's statement of the
// share of mass drawn (ui/segment_layer.h). The counts below follow from systematic sampling
// with stride s = total mass / budget [D]: an interval of the running mass of length L holds
// floor(L/s) or ceil(L/s) sample points, so an entry of mass >= s is always drawn.
#include <gtest/gtest.h>

#include <Eigen/Core>
#include <qcustomplot.h>

#include "plan_thinning.h"
#include "segment_layer.h"

namespace barrow::ui {
namespace {

std::vector<PlanEntry> uniformPlan(int n, double mass) {
  std::vector<PlanEntry> p;
  for (int k = 0; k < n; ++k) p.push_back({k, k, mass});
  return p;
}

TEST(PlanThinningTest, APlanWithinTheBudgetIsDrawnWhole) {
  auto plan = uniformPlan(300, 1.0 / 300);
  plan[7].mass = 0.0;  // carries nothing: never drawn
  const ThinnedPlan t = thinByMass(plan, 4000);
  EXPECT_EQ(t.drawn.size(), 299u);
  EXPECT_NEAR(t.drawnMass, t.totalMass, 1e-15);
  EXPECT_TRUE(thinByMass(plan, 0).drawn.empty());
}

TEST(PlanThinningTest, EqualMassesAreDrawnEvenlyUpToTheBudget) {
  // 20 000 entries of mass 1/20 000, budget 4 000: stride = 5 entries, one drawn in five.
  const ThinnedPlan t = thinByMass(uniformPlan(20000, 1.0 / 20000), 4000);
  ASSERT_EQ(t.drawn.size(), 4000u);
  EXPECT_NEAR(t.drawnMass / t.totalMass, 0.2, 1e-12);
  for (std::size_t q = 1; q < t.drawn.size(); ++q) EXPECT_EQ(t.drawn[q] - t.drawn[q - 1], 5u) << q;
}

TEST(PlanThinningTest, HeavyEntriesAreAlwaysDrawnAndLightOnesInProportionToTheirMass) {
  // 10 000 light entries of mass 1 followed by 100 heavy ones of mass 500 (total 60 000),
  // budget 600: stride 100. Every heavy entry is drawn; the light run of mass 10 000 holds
  // 100 sample points, so 100 light entries (±1) are drawn.
  std::vector<PlanEntry> plan = uniformPlan(10000, 1.0);
  for (int k = 0; k < 100; ++k) plan.push_back({10000 + k, k, 500.0});
  const ThinnedPlan t = thinByMass(plan, 600);
  EXPECT_LE(t.drawn.size(), 600u);
  std::size_t light = 0, heavy = 0;
  for (std::size_t k : t.drawn) (k < 10000 ? light : heavy) += 1;
  EXPECT_EQ(heavy, 100u);
  EXPECT_GE(light, 99u);
  EXPECT_LE(light, 101u);
  EXPECT_NEAR(t.drawnMass, 100 * 500.0 + double(light), 1e-9);
}

TEST(PlanThinningTest, TheLegendStatesTheShareOfMassDrawn) {
  QCustomPlot plot;
  auto* layer = new SegmentLayer(plot.xAxis, plot.yAxis);
  const int n = 10000;
  Eigen::MatrixX2d a = Eigen::MatrixX2d::Random(n, 2), b = Eigen::MatrixX2d::Random(n, 2);
  // 10^4 entries of equal mass: the budget's 4 000 are drawn, 40% of the mass.
  std::vector<PlanEntry> plan = uniformPlan(n, 1.0 / n);
  layer->setLabel("exact plan, W2");
  layer->setPlan(plan, a, b);
  EXPECT_EQ(layer->segmentCount(), std::size_t(n));
  EXPECT_EQ(layer->drawnCount(), SegmentLayer::kDrawBudget);
  EXPECT_NEAR(layer->shownMassShare(), double(SegmentLayer::kDrawBudget) / n, 1e-12);
  EXPECT_TRUE(layer->name().startsWith("exact plan, W2")) << layer->name().toStdString();
  EXPECT_TRUE(layer->name().contains("40% of mass")) << layer->name().toStdString();
  // The read-out still sees every entry, drawn or not.
  EXPECT_EQ(layer->entriesOf(true, 1).size(), 1u);
  // A small plan is drawn whole and named plainly.
  plan.resize(50);
  layer->setPlan(plan, a, b);
  EXPECT_EQ(layer->name(), "exact plan, W2");
  EXPECT_DOUBLE_EQ(layer->shownMassShare(), 1.0);
  // Hiding the lighter segments is stated too.
  plan[0].mass *= 10;
  layer->setPlan(plan, a, b);
  layer->setThreshold(0.5);
  EXPECT_EQ(layer->visibleCount(), 1u);
  EXPECT_NEAR(layer->shownMassShare(), 10.0 / 59.0, 1e-12);
  EXPECT_TRUE(layer->name().contains("17% of mass (1 of 50 segments)")) << layer->name().toStdString();
}

}  // namespace
}  // namespace barrow::ui
