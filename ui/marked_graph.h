// A curve with its measure's marker every few dozen pixels, drawn only inside its pane.
// QCustomPlot places the markers of gaps (NaN for +∞ or a failure) at the widget's corner, where
// a vector export, which does not clip, shows them. Each curve's markers start at their own
// phase of the spacing, so fifteen curves through the same θ grid do not stack their markers.
#pragma once

#include <qcustomplot.h>

namespace barrow::ui {

class MarkedGraph : public QCPGraph {
 public:
  static constexpr double kSpacing = 48.0;  // pixels between a curve's markers

  MarkedGraph(QCPAxis* key, QCPAxis* value) : QCPGraph(key, value) {}

  // Where this curve's markers start, as a fraction of the spacing (0 ≤ phase < 1).
  void setMarkerPhase(double phase) { phase_ = phase; }
  double markerPhase() const { return phase_; }

  // The points (pixels, in key order) that get a marker: those inside the pane nearest to
  // pane.left + (phase + k) · spacing, at most half a spacing away.
  QVector<QPointF> markerPoints(const QVector<QPointF>& scatters, const QRectF& pane) const;

 protected:
  void drawScatterPlot(QCPPainter* painter, const QVector<QPointF>& scatters,
                       const QCPScatterStyle& style) const override;

 private:
  double phase_ = 0.0;
};

}  // namespace barrow::ui
