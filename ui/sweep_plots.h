// The Sweep's plot: every chosen measure against θ (optionally each normalised to [0, 1] so
// they share an axis) and, in a pane below on the same θ axis, its slope dD/dθ. Findings are
// drawn on top (jump locations as dashed lines, flat stretches shaded), the reference θ₀ as a
// thin line, and a θ cursor the user can drag; its position drives the Field. One
// QCustomPlot with two axis rects, so the panes stay aligned and export as one figure.
#pragma once

#include <QWidget>
#include <optional>
#include <string>
#include <vector>

#include "sweep/findings.h"
#include "sweep/sweep_result.h"

class QCustomPlot;
class QCPAxisRect;
class QCPItemStraightLine;
class QCPItemText;
class QLabel;
class QMouseEvent;
class QResizeEvent;

namespace barrow::ui {

class SweepPlots : public QWidget {
  Q_OBJECT
 public:
  explicit SweepPlots(QWidget* parent = nullptr);

  /// Curves from one or more sweeps of the same range (cheap measures first, slow ones
  /// later); each part keeps its own θ grid.
  void setResult(const std::vector<SweepResult>& parts, const std::vector<Finding>& findings);
  void clear(const QString& hint);
  void setNormalised(bool on);
  bool normalised() const { return normalised_; }
  /// Emphasises one measure's curve and its findings ("" = none).
  void highlight(const std::string& id);
  const std::string& highlighted() const { return highlighted_; }
  void setReference(double theta0);
  void setAxisLabel(const QString& label);
  /// The θ range shown when there is no result yet.
  void setRange(double from, double to);

  /// Moves the cursor (nullopt hides it); does not emit thetaChanged.
  void setCursor(std::optional<double> theta);
  std::optional<double> cursor() const { return cursor_; }
  /// True while the user drags the cursor (live updates then defer slow measures).
  bool dragging() const { return dragging_; }

  QCustomPlot* plot() const { return plot_; }
  QCPAxisRect* valueRect() const { return values_; }
  QCPAxisRect* slopeRect() const { return slopes_; }
  int curveCount() const { return int(curves_.size()); }
  /// What the pointer at `px` (plot widget pixels) is over, in words: a finding's tick (its
  /// finding), a slope beyond the pane, or a curve (its measure); "" over nothing.
  QString toolTipAt(const QPointF& px) const;
  /// Number of slope excursions beyond the slope pane marked on its edges.
  int clipMarkCount() const { return int(clipMarks_.size()); }
  /// Share of the plots' height given to the value pane (the rest is the slope pane's); the
  /// user sets it by dragging the border between the panes.
  void setValueShare(double share);
  double valueShare() const;
  /// Marks the curves as out of date (the clouds changed since the sweep).
  void setStale(bool stale);
  bool stale() const { return stale_; }

 signals:
  /// The user clicked a curve's legend entry: that measure ("" when it was already picked).
  void measurePicked(const QString& id);
  /// The user dragged or clicked the cursor to θ (nullopt: released with a double-click).
  void thetaChanged(std::optional<double> theta);

 protected:
  void resizeEvent(QResizeEvent* e) override;
  /// Long or short left-axis labels, whichever fits the panes' height.
  void fitAxisLabels();

 private:
  void rebuild();
  void colourFixedMarks();
  void fitLegend();
  void placeLegend();
  void onPress(QMouseEvent* e);
  void onMove(QMouseEvent* e);
  void placeCursor(double theta, bool notify);
  QCPItemStraightLine* verticalLine(QCPAxisRect* rect, const QPen& pen);
  void showHint(const QString& text);

  QCustomPlot* plot_;
  QCPAxisRect* values_;
  QCPAxisRect* slopes_;
  QLabel* hint_;
  QCPItemStraightLine* cursorV_;
  QCPItemStraightLine* cursorS_;
  QCPItemText* cursorLabel_;
  QCPItemStraightLine* refV_;
  QCPItemStraightLine* refS_;
  struct Curve {
    std::string id;
    std::vector<double> theta, value, slope;
    std::vector<double> low, high;  // resampling band (empty: none)
  };
  std::vector<Curve> curves_;
  struct Mark {
    std::string id;
    double theta;
    bool flag;  // ticks: confirmed jump (else unresolved); clip marks: above the pane (else below)
  };
  std::vector<Mark> ticks_;      // finding ticks along the top of the value pane
  std::vector<Mark> clipMarks_;  // slopes beyond the slope pane
  std::vector<Finding> findings_;
  QString message_;
  bool normalised_ = true;
  bool dragging_ = false;
  bool resizingPanes_ = false;  // the user drags the border between the value and slope panes
  bool onPaneBorder(const QPointF& px) const;
  bool stale_ = false;
  std::string highlighted_;
  std::optional<double> cursor_;
  double from_ = -1, to_ = 1;
};

}  // namespace barrow::ui
