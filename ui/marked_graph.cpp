#include "marked_graph.h"

#include <cmath>

namespace barrow::ui {

void MarkedGraph::drawScatterPlot(QCPPainter* painter, const QVector<QPointF>& scatters,
                                  const QCPScatterStyle& style) const {
  // Gaps arrive at pixel (0, 0); no marker belongs outside the pane.
  const QRectF pane = QRectF(keyAxis()->axisRect()->rect()).adjusted(-1, -1, 1, 1);
  QVector<QPointF> inside;
  inside.reserve(scatters.size());
  for (const QPointF& p : scatters)
    if (std::isfinite(p.x()) && std::isfinite(p.y()) && pane.contains(p)) inside.push_back(p);
  QCPGraph::drawScatterPlot(painter, inside, style);
}

}  // namespace barrow::ui
