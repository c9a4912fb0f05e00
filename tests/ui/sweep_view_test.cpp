// The Sweep from the window: a running sweep can be cancelled; clicking the θ cursor moves A
// on the Field (the shift family: A_θ = A + θ·u, core/families/family_map.h) and the change column follows;
// releasing the cursor shows A as drawn again.
#include <gtest/gtest.h>

#include <QElapsedTimer>
#include <QPushButton>

#include "field_panel.h"
#include "measures/registry.h"
#include "measures_panel.h"
#include "scenario/demo_scenario.h"
#include "sweep_panel.h"
#include "sweep_plots.h"
#include "sweep_runner.h"
#include "ui_test_support.h"

namespace barrow::ui {
namespace {

using test::makeWindow;
using test::sameCloud;
using test::waitIdle;

TEST(SweepViewTest, RunningSweepCanBeCancelled) {
  Session s = demoSession();
  s.sweep.steps = 20001;  // long enough that it is still running when cancelled
  auto w = makeWindow(s);
  ASSERT_TRUE(waitIdle(*w));
  SweepPanel* sweep = w->sweep();
  QTest::mouseClick(sweep->runButton(), Qt::LeftButton);
  EXPECT_TRUE(sweep->running());
  EXPECT_TRUE(sweep->cancelButton()->isEnabled());
  QTest::qWait(200);
  QTest::mouseClick(sweep->cancelButton(), Qt::LeftButton);
  QElapsedTimer t;
  t.start();
  while (sweep->running() && t.elapsed() < 60000) QTest::qWait(10);
  EXPECT_FALSE(sweep->running()) << "the sweep did not stop";
  EXPECT_TRUE(sweep->cancelled());
  EXPECT_FALSE(sweep->cancelButton()->isEnabled());
  EXPECT_TRUE(waitIdle(*w));
}

TEST(SweepViewTest, ThetaCursorMovesAOnTheFieldAndBackWhenReleased) {
  auto w = makeWindow(demoSession());  // shift along (1, 0), θ₀ = 0
  ASSERT_TRUE(waitIdle(*w));
  SweepPlots* plots = w->sweep()->plots();
  QCustomPlot* plot = plots->plot();
  const QCPAxis* x = plots->valueRect()->axis(QCPAxis::atBottom);
  const QPoint at(int(x->coordToPixel(0.7)), plots->valueRect()->center().y());
  QTest::mouseClick(plot, Qt::LeftButton, {}, at);
  ASSERT_TRUE(plots->cursor().has_value());
  const double theta = *plots->cursor();
  EXPECT_NEAR(theta, 0.7, 2 * std::abs(x->pixelToCoord(1) - x->pixelToCoord(0)));
  EXPECT_EQ(w->theta(), plots->cursor());
  ASSERT_TRUE(waitIdle(*w));

  // [D] shift family: every point of A moves by θ along the unit direction; B stays.
  const Cloud& a = w->session().a;
  const Cloud& shown = w->field()->view()->shownCloud(Which::A);
  ASSERT_EQ(shown.size(), a.size());
  for (Eigen::Index i = 0; i < a.size(); ++i) {
    EXPECT_NEAR(shown.points(i, 0), a.points(i, 0) + theta, 1e-12);
    EXPECT_NEAR(shown.points(i, 1), a.points(i, 1), 1e-12);
  }
  EXPECT_TRUE(sameCloud(w->field()->view()->shownCloud(Which::B), w->session().b));
  EXPECT_TRUE(sameCloud(w->session().a, demoSession().a));  // the drawing itself is untouched
  // The change column compares with θ₀ = 0, so a measure that moved shows a non-zero change.
  bool anyChange = false;
  for (const Measure* m : MeasureRegistry::instance().defaults()) {
    const QString c = w->measures()->cellText(m->id(), 2);
    if (c != "0" && c != "—") anyChange = true;
  }
  EXPECT_TRUE(anyChange);

  // A double-click releases the cursor: A as drawn again.
  QTest::mouseDClick(plot, Qt::LeftButton, {}, at);
  ASSERT_TRUE(waitIdle(*w));
  EXPECT_FALSE(w->theta().has_value());
  EXPECT_TRUE(sameCloud(w->field()->view()->shownCloud(Which::A), w->session().a));
}

TEST(SweepViewTest, EditingWhileTheCursorIsOutReleasesItFirst) {
  auto w = makeWindow(demoSession());
  w->setTheta(1.0);
  ASSERT_TRUE(waitIdle(*w));
  w->field()->editor()->select(Which::A, {0});
  w->field()->editor()->moveSelection(0.0, 0.25);
  EXPECT_FALSE(w->theta().has_value());
  EXPECT_NEAR(w->session().a.points(0, 1), demoSession().a.points(0, 1) + 0.25, 1e-15);
  EXPECT_NEAR(w->session().a.points(0, 0), demoSession().a.points(0, 0), 0.0);  // not A_θ
  ASSERT_TRUE(waitIdle(*w));
}

}  // namespace
}  // namespace barrow::ui
