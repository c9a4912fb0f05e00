// Markers of curves that share a θ grid (issue 19: "markers bunch at the same θ"): each curve
// marks points a fixed pixel spacing apart from its own phase, so two curves' markers fall at
// different θ, and markers never land outside the pane (gaps come in at pixel (0, 0)) [CP].
#include <gtest/gtest.h>

#include <qcustomplot.h>

#include "marked_graph.h"

namespace barrow::ui {
namespace {

QVector<QPointF> line(int n, double left, double right) {
  QVector<QPointF> p;
  for (int k = 0; k < n; ++k) p.push_back({left + (right - left) * k / (n - 1), 50.0});
  return p;
}

TEST(MarkedGraphTest, CurvesWithOtherPhasesMarkOtherPoints) {
  QCustomPlot plot;
  auto* a = new MarkedGraph(plot.xAxis, plot.yAxis);
  auto* b = new MarkedGraph(plot.xAxis, plot.yAxis);
  a->setMarkerPhase(0.0);
  b->setMarkerPhase(0.5);
  const QRectF pane(10, 0, 480, 100);
  const QVector<QPointF> pts = line(121, 10, 490);  // 4 px apart, like a 121-step sweep
  const QVector<QPointF> ma = a->markerPoints(pts, pane), mb = b->markerPoints(pts, pane);
  ASSERT_GE(ma.size(), 9);
  ASSERT_GE(mb.size(), 9);
  for (const QPointF& p : ma)
    for (const QPointF& q : mb) EXPECT_GE(std::abs(p.x() - q.x()), MarkedGraph::kSpacing / 2 - 4);
  for (int k = 1; k < ma.size(); ++k) EXPECT_NEAR(ma[k].x() - ma[k - 1].x(), MarkedGraph::kSpacing, 4.0);
}

TEST(MarkedGraphTest, GapsAndPointsOutsideThePaneGetNoMarker) {
  QCustomPlot plot;
  auto* a = new MarkedGraph(plot.xAxis, plot.yAxis);
  const QRectF pane(10, 0, 200, 100);
  QVector<QPointF> pts = line(51, 10, 210);
  pts[0] = QPointF(0, 0);                                 // a gap as QCustomPlot hands it over
  pts[25] = QPointF(pts[25].x(), 150);                    // off the pane vertically
  pts.push_back(QPointF(qQNaN(), 10));                    // not a number
  for (const QPointF& p : a->markerPoints(pts, pane)) {
    EXPECT_TRUE(pane.contains(p));
    EXPECT_TRUE(std::isfinite(p.x()));
  }
  // Fewer than two points per spacing: each point is marked at most once.
  const QVector<QPointF> sparse = line(3, 10, 210);
  EXPECT_LE(a->markerPoints(sparse, pane).size(), 3);
}

}  // namespace
}  // namespace barrow::ui
