// The Field: the canvas showing clouds A and B (Okabe–Ito colours, disc vs triangle markers,
// marker area following weight) with equal aspect ratio, and the overlays: the exact
// transport plan, the entropic plan, the W1 potential heat map with its colour scale, and
// displacement interpolation at t. Editing is done by FieldEditor on top of this view.
#pragma once

#include <Eigen/Core>
#include <QWidget>
#include <optional>

#include "cloud/cloud.h"
#include "live_evaluator.h"
#include "measures/result.h"
#include "session_document.h"

class QCustomPlot;
class QCPColorMap;
class QCPColorScale;
class QLabel;

namespace barrow::ui {

class CloudLayer;
class SegmentLayer;

class FieldView : public QWidget {
  Q_OBJECT
 public:
  explicit FieldView(QWidget* parent = nullptr);

  /// The clouds as shown (A may be A_θ while the θ cursor is active).
  void setClouds(const Cloud& a, const Cloud& b);
  const Cloud& shownCloud(Which w) const { return w == Which::A ? a_ : b_; }
  /// A faint hollow copy of A where it was before the θ cursor moved it (nullopt hides it).
  void setGhost(const std::optional<Cloud>& a0);

  /// Plans index into the clouds given to setClouds(); stale indices are skipped.
  void setExactPlan(const std::vector<PlanEntry>& plan, const QString& label);
  void setEntropicPlan(const std::vector<PlanEntry>& plan, const QString& label);
  void clearPlans();
  void clearExactPlan();
  /// Draw the exact plan's segments (the plan is kept for interpolation either way).
  void setExactSegmentsShown(bool shown);
  void clearEntropicPlan();
  void setPlanThreshold(double fraction);
  /// Points x_t = (1−t)x_i + t y_j carrying mass π_ij, from the exact plan (McCann 1997).
  void setInterpolation(bool shown, double t);
  /// Values on the grid's cell centres: ny rows (y index) × nx columns (x index).
  void setPotential(const Eigen::MatrixXd& values, const GridSpec& grid);
  void clearPotential();
  /// The grid the potential map is computed on: the clouds' bounding box, padded.
  GridSpec potentialGrid() const;

  void setSelection(const std::vector<bool>& selA, const std::vector<bool>& selB);
  /// Highlights a point and the plan segments touching it; -1 clears.
  void setHover(Which w, int index);
  void setReadout(const QString& text);

  /// Fits the view to both clouds (keeping equal aspect).
  void fitToData();
  QCustomPlot* plot() const { return plot_; }
  CloudLayer* layer(Which w) const;
  const SegmentLayer* exactLayer() const { return exact_; }
  const SegmentLayer* entropicLayer() const { return entropic_; }
  const CloudLayer* interpolationLayer() const { return interp_; }
  QCPColorMap* heatMap() const { return heat_; }
  /// Number of interpolated points currently drawn (0 when hidden).
  Eigen::Index interpolationCount() const;
  bool potentialShown() const;

  QString readout() const;
  /// Text describing the plan around a point (hover read-out).
  QString describePoint(Which w, int index) const;

 protected:
  bool eventFilter(QObject* watched, QEvent* event) override;

 private:
  void keepAspect();
  void applyView();
  void rebuildInterpolation();
  void refresh();

  QCustomPlot* plot_;
  QLabel* readout_;
  CloudLayer* ghost_;
  CloudLayer* cloudA_;
  CloudLayer* cloudB_;
  CloudLayer* interp_;
  SegmentLayer* exact_;
  SegmentLayer* entropic_;
  QCPColorMap* heat_;
  QCPColorScale* scale_;
  Cloud a_, b_;
  std::vector<PlanEntry> exactPlan_;
  std::vector<PlanEntry> entropicPlan_;
  bool interpShown_ = false;
  bool exactSegmentsShown_ = true;
  double interpT_ = 0.5;
  bool everFitted_ = false;
  bool fitPending_ = true;
  bool userView_ = false;
  // The hovered point: its read-out follows it while it is dragged.
  Which hoverWhich_ = Which::A;
  int hoverIndex_ = -1;
};

}  // namespace barrow::ui
