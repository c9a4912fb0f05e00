// The Resampling pane: starts the intervals, p-values and value-versus-size ladder for the
// clouds as drawn (one action), shows progress with a cancel button, hands the intervals and
// p-values to the Measures table, and draws the selected measure's value against n. A change
// of the clouds or settings marks everything shown stale (greyed), never silently wrong.
#pragma once

#include <QWidget>
#include <optional>
#include <string>

#include "session_document.h"
#include "uncertainty_runner.h"

class QLabel;
class QProgressBar;
class QPushButton;

namespace barrow::ui {

class MeasuresPanel;
class SizePlot;

class UncertaintyPane : public QWidget {
  Q_OBJECT
 public:
  UncertaintyPane(SessionDocument* doc, MeasuresPanel* table, QWidget* parent = nullptr);

  /// Starts a run on the current clouds (cancelling one in progress).
  void run();
  void cancel();
  bool running() const { return runner_->running(); }
  /// Shows `id` in the value-versus-size plot.
  void focusMeasure(const std::string& id);

  /// The measures a run covers: every registered one except the entropic two, whose
  /// Sinkhorn solves make hundreds of resamples slow.
  static std::vector<const Measure*> runMeasures();
  SizePlot* sizePlot() const { return sizes_; }
  const std::optional<UncertaintyOutcome>& outcome() const { return outcome_; }
  bool stale() const { return stale_; }
  QString statusText() const;

 signals:
  void runningChanged(bool running);
  void finished();

 private:
  void markStale();

  SessionDocument* doc_;
  MeasuresPanel* table_;
  UncertaintyRunner* runner_;
  SizePlot* sizes_;
  QPushButton* runButton_;
  QPushButton* cancelButton_;
  QProgressBar* progress_;
  QLabel* status_;
  std::optional<UncertaintyOutcome> outcome_;
  std::string focus_;
  quint64 generation_ = 0;     // bumped on every change of clouds or settings
  quint64 runGeneration_ = 0;  // the generation the running request was started on
  bool stale_ = false;
};

}  // namespace barrow::ui
