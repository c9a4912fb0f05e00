#include "marked_graph.h"

#include <algorithm>
#include <cmath>

namespace barrow::ui {

QVector<QPointF> MarkedGraph::markerPoints(const QVector<QPointF>& scatters, const QRectF& pane) const {
  QVector<QPointF> inside;
  inside.reserve(scatters.size());
  for (const QPointF& p : scatters)
    if (std::isfinite(p.x()) && std::isfinite(p.y()) && pane.contains(p)) inside.push_back(p);
  std::stable_sort(inside.begin(), inside.end(), [](const QPointF& a, const QPointF& b) { return a.x() < b.x(); });
  QVector<QPointF> marks;
  if (inside.isEmpty()) return marks;
  int last = -1;
  for (double t = pane.left() + phase_ * kSpacing; t <= pane.right(); t += kSpacing) {
    auto it = std::lower_bound(inside.begin(), inside.end(), t, [](const QPointF& p, double x) { return p.x() < x; });
    int best = -1;
    if (it != inside.end()) best = int(it - inside.begin());
    if (it != inside.begin()) {
      const int before = int(it - inside.begin()) - 1;
      if (best < 0 || t - inside[before].x() < inside[best].x() - t) best = before;
    }
    if (best < 0 || best == last || std::abs(inside[best].x() - t) > kSpacing / 2) continue;
    marks.push_back(inside[best]);
    last = best;
  }
  return marks;
}

void MarkedGraph::drawScatterPlot(QCPPainter* painter, const QVector<QPointF>& scatters,
                                  const QCPScatterStyle& style) const {
  // Gaps arrive at pixel (0, 0); no marker belongs outside the pane.
  const QRectF pane = QRectF(keyAxis()->axisRect()->rect()).adjusted(-1, -1, 1, 1);
  QCPGraph::drawScatterPlot(painter, markerPoints(scatters, pane), style);
}

}  // namespace barrow::ui
