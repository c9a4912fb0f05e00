// The Sweep plot explains its marks and keeps its drawing inside its panes: slopes beyond the
// slope pane are cut at its edges with a triangle where each excursion peaks (so that a vector
// export, which does not clip, draws nothing over the other pane or the axis titles), the
// finding ticks and the triangles have legend entries, and hovering a tick, a triangle or a
// curve says in words what it is.
#include <gtest/gtest.h>

#include <QFile>
#include <QRegularExpression>
#include <qcustomplot.h>

#include "scenario/demo_scenario.h"
#include "support/test_support.h"
#include "sweep_panel.h"
#include "sweep_plots.h"
#include "ui_test_support.h"

namespace barrow::ui {
namespace {

using test::makeWindow;
using test::waitIdle;

std::unique_ptr<MainWindow> sweptDemo() {
  Session s = demoSession();
  s.sweep.steps = 121;
  s.selected = {"w1", "js", "tv", "hellinger", "kl_ab"};
  auto w = makeWindow(s);
  w->sweep()->run();
  EXPECT_TRUE(waitIdle(*w));
  w->sweep()->plots()->plot()->replot();
  return w;
}

QStringList legendNames(QCustomPlot* p) {
  QStringList names;
  for (int k = 0; k < p->legend->itemCount(); ++k)
    if (auto* item = qobject_cast<QCPPlottableLegendItem*>(p->legend->item(k))) names << item->plottable()->name();
  return names;
}

TEST(SweepMarksTest, SlopesStayInsideTheirPaneWithATriangleWhereCut) {
  auto w = sweptDemo();
  SweepPlots* plots = w->sweep()->plots();
  QCustomPlot* p = plots->plot();
  const QCPRange r = plots->slopeRect()->axis(QCPAxis::atLeft)->range();
  int slopeGraphs = 0;
  for (int k = 0; k < p->graphCount(); ++k) {
    QCPGraph* g = p->graph(k);
    if (g->valueAxis() != plots->slopeRect()->axis(QCPAxis::atLeft)) continue;
    ++slopeGraphs;
    for (auto it = g->data()->constBegin(); it != g->data()->constEnd(); ++it)
      if (!std::isnan(it->value)) {
        EXPECT_GE(it->value, r.lower - 1e-9 * r.size());
        EXPECT_LE(it->value, r.upper + 1e-9 * r.size());
      }
  }
  EXPECT_GE(slopeGraphs, 4);
  // js and tv step between 0 and their plateau: finite differences there leave the pane.
  EXPECT_GT(plots->clipMarkCount(), 0);
  EXPECT_TRUE(legendNames(p).contains("▲▼ slope off the pane")) << legendNames(p).join(", ").toStdString();
}

TEST(SweepMarksTest, SvgExportDrawsNoCurveOutsideThePanes) {
  auto w = sweptDemo();
  SweepPlots* plots = w->sweep()->plots();
  const QString path = QString::fromStdString(barrow::test::tempPath("marks_sweep.svg"));
  const QSize size = plots->plot()->size();  // the on-screen layout, so the rects below apply
  ASSERT_TRUE(w->exportFigure(1, path, size).isEmpty());
  QFile f(path);
  ASSERT_TRUE(f.open(QIODevice::ReadOnly));
  const QString svg = QString::fromUtf8(f.readAll());
  // Every polyline drawn in a curve's colour must lie in the union of the panes (1 px slack
  // for the pen). QSvgGenerator writes lines as <polyline points="x,y x,y ..."> in pixels.
  const QRect v = plots->valueRect()->rect().adjusted(-2, -2, 2, 2), s = plots->slopeRect()->rect().adjusted(-2, -2, 2, 2);
  QRegularExpression poly("<polyline[^>]*points=\"([^\"]*)\"");
  QRegularExpression pair("(-?[0-9.]+),(-?[0-9.]+)");
  // The legend's icons (short lines and the measures' markers) lie outside both panes.
  const QRect legend = plots->plot()->legend->visible() ? plots->plot()->legend->outerRect() : QRect();
  int checked = 0, outside = 0;
  for (auto m = poly.globalMatch(svg); m.hasNext();) {
    const QString pts = m.next().captured(1);
    for (auto q = pair.globalMatch(pts); q.hasNext();) {
      const auto c = q.next();
      const QPointF pt(c.captured(1).toDouble(), c.captured(2).toDouble());
      if (legend.contains(pt.toPoint())) continue;
      ++checked;
      if (!v.contains(pt.toPoint()) && !s.contains(pt.toPoint())) ++outside;
    }
  }
  EXPECT_GT(checked, 100) << "no polylines found: the test no longer reads the export";
  EXPECT_EQ(outside, 0) << outside << " of " << checked << " points outside the panes";
}

TEST(SweepMarksTest, HoverNamesTicksTrianglesAndCurves) {
  auto w = sweptDemo();
  SweepPlots* plots = w->sweep()->plots();
  const std::vector<Finding> found = w->sweep()->findings();
  const Finding* stepping = nullptr;
  for (const Finding& f : found)
    if (!f.jumps.empty()) stepping = &f;
  ASSERT_NE(stepping, nullptr) << "the demo sweep should find a jump (hellinger or kl_ab)";
  const QRect v = plots->valueRect()->rect();
  const double x = plots->valueRect()->axis(QCPAxis::atBottom)->coordToPixel(stepping->jumps.front().theta);
  const QString tick = plots->toolTipAt(QPointF(x, v.top() + 3));
  // Several measures may step at the same θ: the tip names one, and carries that one's words.
  const Finding* named = nullptr;
  for (const Finding& f : found)
    if (tick.startsWith(QString::fromStdString(f.id) + " — ")) named = &f;
  ASSERT_NE(named, nullptr) << tick.toStdString();
  EXPECT_FALSE(named->jumps.empty());
  EXPECT_TRUE(tick.contains(QString::fromStdString(named->summary))) << tick.toStdString();
  EXPECT_TRUE(tick.contains("jump"));
  EXPECT_TRUE(legendNames(plots->plot()).contains("┃ top: jump"));

  // Over a curve: its measure's name. w1 at the middle of the range.
  QCPGraph* w1 = nullptr;
  for (int k = 0; k < plots->plot()->graphCount(); ++k)
    if (plots->plot()->graph(k)->property("measure").toString() == "w1" &&
        plots->plot()->graph(k)->valueAxis() == plots->valueRect()->axis(QCPAxis::atLeft))
      w1 = plots->plot()->graph(k);
  ASSERT_NE(w1, nullptr);
  auto it = w1->data()->at(w1->data()->size() / 5);
  const QPointF onCurve(w1->keyAxis()->coordToPixel(it->key), w1->valueAxis()->coordToPixel(it->value));
  EXPECT_TRUE(plots->toolTipAt(onCurve).startsWith("w1 — ")) << plots->toolTipAt(onCurve).toStdString();
  EXPECT_TRUE(plots->toolTipAt(QPointF(2, 2)).isEmpty());
}

}  // namespace
}  // namespace barrow::ui
