// Draws a transport plan as straight segments from A's points to B's points, each segment's
// opacity proportional to its mass relative to the heaviest one. Segments lighter than the
// threshold (a fraction of the heaviest mass) are hidden. Segments of a highlighted point
// are drawn opaque and thicker.
#pragma once

#include <Eigen/Core>
#include <QColor>
#include <qcustomplot.h>
#include <vector>

#include "measures/result.h"

namespace barrow::ui {

class SegmentLayer : public QCPAbstractPlottable {
  Q_OBJECT
 public:
  SegmentLayer(QCPAxis* keyAxis, QCPAxis* valueAxis);

  /// Plan entries index into `a` (i) and `b` (j); entries out of range are skipped.
  /// At most `maxSegments` of the heaviest entries are kept (dense entropic plans).
  void setPlan(const std::vector<PlanEntry>& plan, const Eigen::MatrixX2d& a,
               const Eigen::MatrixX2d& b, std::size_t maxSegments = 40000);
  void clearPlan();
  void setColor(const QColor& c) { color_ = c; }
  void setDashed(bool dashed) { dashed_ = dashed; }
  /// Hide segments with mass < fraction × heaviest mass; fraction in [0, 1].
  void setThreshold(double fraction) { threshold_ = fraction; }
  /// Emphasise the segments leaving A's point `index` (fromA) or arriving at B's point.
  void setHighlight(bool fromA, int index);

  std::size_t segmentCount() const { return mass_.size(); }
  std::size_t visibleCount() const;
  double maxMass() const { return maxMass_; }
  /// The entries touching a point (for the hover read-out), heaviest first.
  std::vector<PlanEntry> entriesOf(bool fromA, int index) const;

  double selectTest(const QPointF&, bool, QVariant* = nullptr) const override { return -1; }
  QCPRange getKeyRange(bool& foundRange, QCP::SignDomain = QCP::sdBoth) const override;
  QCPRange getValueRange(bool& foundRange, QCP::SignDomain = QCP::sdBoth,
                         const QCPRange& = QCPRange()) const override;

 protected:
  void draw(QCPPainter* painter) override;
  void drawLegendIcon(QCPPainter* painter, const QRectF& rect) const override;

 private:
  std::vector<PlanEntry> entries_;
  std::vector<std::array<double, 4>> seg_;  // x1, y1, x2, y2
  std::vector<double> mass_;
  double maxMass_ = 0;
  double sparseness_ = 1.0;  // min(1, (n + m) / effective entries): 1 for a vertex of the polytope
  double threshold_ = 0;
  QColor color_{30, 30, 30};
  bool dashed_ = false;
  bool hiFromA_ = true;
  int hiIndex_ = -1;
};

}  // namespace barrow::ui
