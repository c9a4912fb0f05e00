// Draws a transport plan as straight segments from A's points to B's points, each segment's
// opacity proportional to its mass relative to the heaviest one. Large plans are thinned by
// mass to a drawing budget (plan_thinning.h); segments lighter than the threshold (a fraction
// of the heaviest mass) are hidden; the legend then states the share of the mass drawn.
// Segments of a highlighted point are all drawn, opaque and thicker.
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

  /// Plan entries index into `a` (i) and `b` (j); entries out of range are skipped. At most
  /// `budget` entries are drawn, chosen by mass (thinByMass); all are kept for the read-out.
  void setPlan(const std::vector<PlanEntry>& plan, const Eigen::MatrixX2d& a,
               const Eigen::MatrixX2d& b, std::size_t budget = kDrawBudget);
  /// A vertex plan's segments are read one by one: about what a 1400×900 Field shows legibly.
  static constexpr std::size_t kDrawBudget = 4000;
  /// A spread-out (entropic) plan is read as a haze of faint segments: many more are drawn.
  static constexpr std::size_t kHazeBudget = 40000;
  /// The legend's name; a note on the share of mass drawn is added when not all is.
  void setLabel(const QString& label);
  void clearPlan();
  void setColor(const QColor& c) { color_ = c; }
  void setDashed(bool dashed) { dashed_ = dashed; }
  /// Hide segments with mass < fraction × heaviest mass; fraction in [0, 1].
  void setThreshold(double fraction);
  /// Emphasise the segments leaving A's point `index` (fromA) or arriving at B's point.
  void setHighlight(bool fromA, int index);

  std::size_t segmentCount() const { return all_.size(); }  // entries of the plan
  std::size_t drawnCount() const { return mass_.size(); }   // after thinning
  std::size_t visibleCount() const;                         // drawn and above the threshold
  /// Σ mass of the visible segments / Σ mass of the plan, in [0, 1].
  double shownMassShare() const;
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
  void updateName();

  std::vector<PlanEntry> all_;              // every valid entry, as given
  std::vector<std::array<double, 4>> allSeg_;
  std::vector<PlanEntry> entries_;          // the drawn ones, light to heavy
  std::vector<std::array<double, 4>> seg_;  // x1, y1, x2, y2
  std::vector<double> mass_;
  double maxMass_ = 0;
  double totalMass_ = 0;
  QString label_;
  double sparseness_ = 1.0;  // min(1, (n + m) / effective entries): 1 for a vertex of the polytope
  double threshold_ = 0;
  QColor color_{30, 30, 30};
  bool dashed_ = false;
  bool hiFromA_ = true;
  int hiIndex_ = -1;
};

}  // namespace barrow::ui
