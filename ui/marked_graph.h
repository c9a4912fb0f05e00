// A curve with its measure's marker every few points, drawn only inside its pane: QCustomPlot
// places the markers of gaps (NaN for +∞ or a failure) at the widget's corner, where a vector
// export, which does not clip, shows them.
#pragma once

#include <qcustomplot.h>

namespace barrow::ui {

class MarkedGraph : public QCPGraph {
 public:
  MarkedGraph(QCPAxis* key, QCPAxis* value) : QCPGraph(key, value) {}

 protected:
  void drawScatterPlot(QCPPainter* painter, const QVector<QPointF>& scatters,
                       const QCPScatterStyle& style) const override;
};

}  // namespace barrow::ui
