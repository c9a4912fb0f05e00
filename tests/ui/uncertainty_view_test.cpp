// Resampling from the window: one action fills the interval and p-value columns off the GUI
// thread; a change of the clouds greys them (stale); only the newest run is shown; the
// value-versus-size plot prints a slope; a sweep with bands draws them.
#include <gtest/gtest.h>

#include <QRegularExpression>
#include <QSignalSpy>

#include "measures_panel.h"
#include "size_plot.h"
#include "sweep_plots.h"
#include "ui_test_support.h"
#include "uncertainty_pane.h"
#include "uncertainty_runner.h"

namespace barrow::ui {
namespace {

using test::makeWindow;
using test::waitIdle;

Session smallSession() {
  Session s;
  Eigen::MatrixX2d a(40, 2), b(40, 2);
  for (int i = 0; i < 40; ++i) {
    a.row(i) << std::cos(0.3 * i), std::sin(0.7 * i);
    b.row(i) << 0.8 + std::cos(0.5 * i), std::sin(0.2 * i);
  }
  s.a = Cloud("A", a);
  s.b = Cloud("B", b);
  s.sweep.family = Family::Shift;
  s.sweep.from = -1;
  s.sweep.to = 1;
  s.sweep.steps = 9;
  return s;
}

TEST(UncertaintyViewTest, OneActionFillsIntervalsAndPValuesThenAChangeMakesThemStale) {
  auto w = makeWindow(smallSession());
  ASSERT_TRUE(waitIdle(*w));
  UncertaintyPane* pane = w->uncertainty();
  QSignalSpy done(pane, &UncertaintyPane::finished);
  pane->run();
  EXPECT_TRUE(pane->running()) << "the run must not block the GUI thread";
  ASSERT_TRUE(waitIdle(*w, 300000));
  ASSERT_GE(done.count(), 1);
  MeasuresPanel* table = w->measures();
  const QString interval = table->cellText("w1", MeasuresPanel::intervalColumn());
  EXPECT_TRUE(QRegularExpression(R"(^[0-9.e+-]+ \[[0-9.e+-]+, [0-9.e+-]+\]$)").match(interval).hasMatch()) << interval.toStdString();
  const double p = table->cellText("w1", MeasuresPanel::pValueColumn()).toDouble();
  EXPECT_GT(p, 0.0);
  EXPECT_LE(p, 1.0);
  EXPECT_TRUE(table->cellText("entropic", MeasuresPanel::intervalColumn()).isEmpty()) << "entropic is not run";
  pane->focusMeasure("w1");
  EXPECT_TRUE(pane->sizePlot()->caption().contains("slope")) << pane->sizePlot()->caption().toStdString();
  EXPECT_FALSE(table->uncertaintyStale());

  Cloud moved = w->session().a;
  moved.points.col(0).array() += 0.5;
  w->document()->setCloud(Which::A, moved, "move A");
  EXPECT_TRUE(table->uncertaintyStale());
  EXPECT_TRUE(pane->stale());
  EXPECT_TRUE(pane->statusText().contains("Stale"));
  EXPECT_EQ(table->tree()->topLevelItem(0)->foreground(MeasuresPanel::intervalColumn()).color(), QColor(160, 160, 160));
  ASSERT_TRUE(waitIdle(*w));
}

TEST(UncertaintyViewTest, OnlyTheNewestRequestIsReported) {
  UncertaintyRunner runner;
  QSignalSpy finished(&runner, &UncertaintyRunner::finished);
  UncertaintyRequest req;
  const Session s = smallSession();
  req.a = s.a;
  req.b = s.b;
  req.measures = {UncertaintyPane::runMeasures().front()};
  req.resamples = 2000;
  req.sizes = false;
  runner.start(req);
  req.resamples = 7;
  const quint64 second = runner.start(req);
  EXPECT_EQ(runner.latest(), second);
  ASSERT_TRUE(finished.wait(120000));
  QTest::qWait(200);
  ASSERT_EQ(finished.count(), 1);
  const auto outcome = finished.at(0).at(0).value<UncertaintyOutcome>();
  EXPECT_EQ(outcome.spread.request.resamples, 7);
}

TEST(UncertaintyViewTest, CancelStopsARun) {
  UncertaintyRunner runner;
  QSignalSpy running(&runner, &UncertaintyRunner::runningChanged);
  UncertaintyRequest req;
  const Session s = smallSession();
  req.a = s.a;
  req.b = s.b;
  req.measures = UncertaintyPane::runMeasures();
  req.resamples = 100000;
  runner.start(req);
  QTest::qWait(100);
  runner.cancel();
  QElapsedTimer t;
  t.start();
  while (runner.running() && t.elapsed() < 60000) QTest::qWait(10);
  EXPECT_FALSE(runner.running());
}

// Bands: each curve with low/high gets two extra graphs, the lower one filled to the upper.
TEST(UncertaintyViewTest, SweepPlotsDrawBandsWhenTheSweepHasThem) {
  SweepPlots plots;
  SweepResult r;
  r.theta = {0.0, 0.5, 1.0};
  SweepSeries s;
  s.id = "w1";
  s.value = {1.0, 1.2, 1.5};
  s.slope = {0.4, 0.5, 0.6};
  s.status = {Status::Ok, Status::Ok, Status::Ok};
  r.series = {s};
  plots.setResult({r}, {});
  const int plain = plots.plot()->graphCount();
  r.series[0].low = {0.9, 1.1, 1.3};
  r.series[0].high = {1.1, 1.3, 1.7};
  plots.setResult({r}, {});
  ASSERT_EQ(plots.plot()->graphCount(), plain + 2);
  int filled = 0;
  for (int g = 0; g < plots.plot()->graphCount(); ++g) filled += plots.plot()->graph(g)->channelFillGraph() != nullptr;
  EXPECT_EQ(filled, 1);
}

}  // namespace
}  // namespace barrow::ui
