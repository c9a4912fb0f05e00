// The Field's overlays against what they draw: the exact plan (a vertex of the transport
// polytope, marginals a and b), the mass threshold, the hover read-out, displacement
// interpolation at t = 0 and 1, the entropic plan, and the W1 potential map.
#include <gtest/gtest.h>

#include <QCheckBox>
#include <qcustomplot.h>

#include "cloud_layer.h"
#include "field_panel.h"
#include "field_editor.h"
#include "measures_panel.h"
#include "measures/registry.h"
#include "scenario/demo_scenario.h"
#include "segment_layer.h"
#include "ui_test_support.h"

#include "transport/kr_potential.h"

namespace barrow::ui {
namespace {

using test::makeWindow;
using test::waitIdle;

// Two small clouds with distinct weights, so the marginals are not all alike.
Session smallPair() {
  Session s = demoSession();
  Eigen::MatrixX2d a(5, 2), b(4, 2);
  a << 0, 0, 0, 1, 0.2, 2, -0.1, 3, 0.1, 4;
  b << 2, 0.5, 2.2, 1.5, 1.9, 2.5, 2.1, 3.8;
  Eigen::VectorXd wa(5), wb(4);
  wa << 0.1, 0.25, 0.3, 0.15, 0.2;
  wb << 0.4, 0.1, 0.2, 0.3;
  s.a = Cloud("a", a, wa);
  s.b = Cloud("b", b, wb);
  return s;
}

TEST(PlanOverlayTest, ExactPlanIsAVertexWithTheRightMarginals) {
  ASSERT_NE(MeasureRegistry::instance().find("w2"), nullptr) << "w2 is not registered";
  auto w = makeWindow(smallPair());
  ASSERT_TRUE(waitIdle(*w));
  const SegmentLayer* plan = w->field()->view()->exactLayer();
  const Session& s = w->session();
  // [P] a basic optimal solution has at most n + m − 1 nonzeros (Peyré & Cuturi 2019, §3.4 (mem)).
  ASSERT_GT(plan->segmentCount(), 0u);
  EXPECT_LE(plan->segmentCount(), std::size_t(s.a.size() + s.b.size() - 1));
  // [D] row sums are A's normalised weights, column sums B's.
  const Eigen::VectorXd a = s.a.normalizedWeights(), b = s.b.normalizedWeights();
  for (int i = 0; i < s.a.size(); ++i) {
    double sum = 0;
    for (const auto& e : plan->entriesOf(true, i)) sum += e.mass;
    EXPECT_NEAR(sum, a(i), 1e-9) << "row " << i;
  }
  for (int j = 0; j < s.b.size(); ++j) {
    double sum = 0;
    for (const auto& e : plan->entriesOf(false, j)) sum += e.mass;
    EXPECT_NEAR(sum, b(j), 1e-9) << "column " << j;
  }
  // The threshold hides the lighter segments, never the heaviest.
  w->field()->setThreshold(0.0);
  const std::size_t all = plan->visibleCount();
  w->field()->setThreshold(0.99);
  EXPECT_GE(plan->visibleCount(), 1u);
  EXPECT_LT(plan->visibleCount(), all);
  w->field()->setThreshold(0.0);
}

TEST(PlanOverlayTest, HoverReadsOutWhereAPointsMassGoes) {
  ASSERT_NE(MeasureRegistry::instance().find("w2"), nullptr) << "w2 is not registered";
  auto w = makeWindow(smallPair());
  ASSERT_TRUE(waitIdle(*w));
  FieldView* view = w->field()->view();
  const Cloud& a = w->session().a;
  QTest::mouseMove(view->plot(), test::fieldPixel(*view, a.points(2, 0), a.points(2, 1)));
  const QString text = view->readout();
  EXPECT_TRUE(text.startsWith("A #3")) << text.toStdString();
  EXPECT_TRUE(text.contains("→ B #")) << text.toStdString();
  for (const auto& e : view->exactLayer()->entriesOf(true, 2))
    EXPECT_TRUE(text.contains(QString("B #%1").arg(e.j + 1))) << text.toStdString();
}

TEST(PlanOverlayTest, InterpolationStartsAtAAndEndsAtB) {
  ASSERT_NE(MeasureRegistry::instance().find("w2"), nullptr) << "w2 is not registered";
  auto w = makeWindow(smallPair());
  w->field()->setInterpolationShown(true);
  ASSERT_TRUE(waitIdle(*w));
  FieldView* view = w->field()->view();
  const Session& s = w->session();
  const std::size_t entries = view->exactLayer()->segmentCount();
  ASSERT_GT(entries, 0u);
  // [D] McCann's interpolation: x_t = (1−t)x_i + t·y_j for each entry (i, j).
  for (double t : {0.0, 1.0}) {
    w->field()->setInterpolationT(t);
    const Eigen::MatrixX2d& p = view->interpolationLayer()->points();
    ASSERT_EQ(std::size_t(p.rows()), entries);
    const Cloud& target = t == 0.0 ? s.a : s.b;
    for (Eigen::Index k = 0; k < p.rows(); ++k) {
      double best = INFINITY;
      for (Eigen::Index i = 0; i < target.size(); ++i) best = std::min(best, (target.points.row(i) - p.row(k)).norm());
      EXPECT_LT(best, 1e-12) << "t = " << t << ", entry " << k;
    }
  }
}

TEST(PlanOverlayTest, EntropicPlanCarriesUnitMass) {
  ASSERT_NE(MeasureRegistry::instance().find("entropic"), nullptr) << "entropic is not registered";
  auto w = makeWindow(smallPair());
  w->field()->setEntropicShown(true);
  ASSERT_TRUE(waitIdle(*w));
  const SegmentLayer* ent = w->field()->view()->entropicLayer();
  ASSERT_GT(ent->segmentCount(), 0u);
  double total = 0;
  for (int i = 0; i < w->session().a.size(); ++i)
    for (const auto& e : ent->entriesOf(true, i)) total += e.mass;
  EXPECT_NEAR(total, 1.0, 1e-6);  // [D] a coupling of two probability vectors
}

TEST(PlanOverlayTest, AnEntropicPlanIsDrawnAsAHazeCarryingMostOfItsMass) {
  // The demo's entropic plan has tens of thousands of entries of similar mass: it is drawn
  // with the haze budget, not the few thousand segments a vertex plan gets, so the drawn
  // segments carry most of the mass, and the legend says how much.
  auto w = makeWindow(demoSession());
  w->field()->setEntropicShown(true);
  ASSERT_TRUE(waitIdle(*w));
  const SegmentLayer* ent = w->field()->view()->entropicLayer();
  ASSERT_GT(ent->segmentCount(), SegmentLayer::kDrawBudget);
  EXPECT_GT(ent->shownMassShare(), 0.9);
  EXPECT_LE(ent->drawnCount(), SegmentLayer::kHazeBudget);
  if (ent->drawnCount() < ent->segmentCount()) EXPECT_TRUE(ent->name().contains("of mass")) << ent->name().toStdString();
}

TEST(PlanOverlayTest, PotentialMapIsTheKantorovichPotentialOnItsGrid) {
  ASSERT_NE(MeasureRegistry::instance().find("w1"), nullptr) << "w1 is not registered";
  auto w = makeWindow(smallPair());
  w->field()->setPotentialShown(true);
  ASSERT_TRUE(waitIdle(*w));
  FieldView* view = w->field()->view();
  ASSERT_TRUE(view->potentialShown()) << view->readout().toStdString();
  QCPColorMapData* d = view->heatMap()->data();
  const GridSpec g = view->potentialGrid();
  ASSERT_EQ(d->keySize(), g.nx);
  ASSERT_EQ(d->valueSize(), g.ny);
  // [P] φ is 1-Lipschitz (Kantorovich & Rubinstein 1958): neighbouring cells differ by at
  // most their distance.
  for (int i = 0; i + 1 < g.nx; i += 7)
    for (int j = 0; j + 1 < g.ny; j += 7) {
      EXPECT_LE(std::abs(d->cell(i + 1, j) - d->cell(i, j)), g.dx + 1e-9);
      EXPECT_LE(std::abs(d->cell(i, j + 1) - d->cell(i, j)), g.dy + 1e-9);
    }
  // [D] the map is drawn the right way round: cell (i, j) holds φ at its own centre, for
  // the potential v of the W1 result shown in the table.
  const Result* w1 = w->measures()->result("w1");
  ASSERT_NE(w1, nullptr);
  for (auto [i, j] : {std::pair{3, 40}, std::pair{50, 10}, std::pair{g.nx - 2, g.ny - 3}}) {
    double x = 0, y = 0;
    d->cellToCoord(i, j, &x, &y);
    EXPECT_NEAR(d->cell(i, j), krPotential(w->session().b, w1->v, Eigen::Vector2d(x, y)), 1e-9) << i << "," << j;
  }
}

}  // namespace
}  // namespace barrow::ui
