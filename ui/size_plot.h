// A small log–log plot of one measure's mean value against the sample size (core/uncertainty/
// value_vs_size.h), with ±1 sd bars and the fitted slope printed: how far the value on these
// clouds still moves with the number of points.
#pragma once

#include <QWidget>
#include <optional>
#include <string>

#include "uncertainty/value_vs_size.h"

class QCustomPlot;
class QLabel;

namespace barrow::ui {

class SizePlot : public QWidget {
  Q_OBJECT
 public:
  explicit SizePlot(QWidget* parent = nullptr);

  /// Shows row `id` of `r` (nothing when r has no such row).
  void setResult(const SizesResult& r, const std::string& id);
  void clear(const QString& hint);
  /// Greyed, with a note, when the clouds changed after the run.
  void setStale(bool stale);
  /// The caption under the plot ("w1: slope −0.46 over n = 25…500", or the hint).
  QString caption() const;
  QCustomPlot* plot() const { return plot_; }

 private:
  QCustomPlot* plot_;
  QLabel* caption_;
  QString text_;
  bool stale_ = false;
};

}  // namespace barrow::ui
