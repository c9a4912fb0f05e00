// The Sweep: the family that moves A and its θ range, run/cancel with progress, the
// normalise toggle, and the two plot panes (SweepPlots). Settings edits are undoable
// session edits; the outcome (curves and findings) is kept for export and the Findings list.
// A run sweeps the cheap measures first and shows them, then the slow ones
// (Measure::cheap() == false) in a second pass, so most curves appear within seconds.
#pragma once

#include <QWidget>
#include <optional>

#include "session_document.h"
#include "sweep_runner.h"

class QComboBox;
class QDoubleSpinBox;
class QSpinBox;
class QCheckBox;
class QPushButton;
class QProgressBar;
class QLabel;

namespace barrow::ui {

class SweepPlots;

class SweepPanel : public QWidget {
  Q_OBJECT
 public:
  SweepPanel(SessionDocument* doc, QWidget* parent = nullptr);

  void run();
  void cancel();
  /// The "normalise to [0, 1]" toggle.
  void setNormalised(bool on);
  bool running() const;
  SweepPlots* plots() const { return plots_; }
  /// The passes of the last run that finished (cheap measures, then slow ones).
  const std::vector<SweepOutcome>& parts() const { return parts_; }
  std::vector<Finding> findings() const;
  /// Why the last run produced nothing, or "" (also "" while running).
  const std::string& error() const { return error_; }
  bool cancelled() const { return cancelled_; }
  /// Whether the shown curves and findings were computed from the session as it is now
  /// (SessionDocument::isCurrent of resultsRevision()).
  bool resultsCurrent() const;
  /// The session revision the shown curves and findings were computed at.
  quint64 resultsRevision() const { return runRevision_; }
  /// The sweep as CSV: theta,<id>,...,d_<id>,... (inf for ∞, empty where failed). The
  /// passes' θ grids are merged; a measure has no value at a θ that refinement added in the
  /// other pass, and its cell there is empty.
  std::string toCsv() const;
  /// The findings as the JSON of `barrow-cli findings --json` (empty before a sweep).
  std::string findingsJson() const;
  /// Axis label of θ for a family ("θ: distance moved along (1, 0)").
  static QString thetaLabel(const SweepSettings& s);
  QPushButton* runButton() const { return runButton_; }
  QPushButton* cancelButton() const { return cancelButton_; }

 signals:
  void staleChanged(bool stale);
  void outcomeReady();
  void runningChanged(bool running);
  void thetaChanged(std::optional<double> theta);
  void message(const QString& text);

 private:
  void loadFromSession();
  void startNextPass();
  void setActive(bool on);
  void commit();
  void updateFamilyControls();
  std::vector<std::string> measureIds() const;
  std::vector<SweepResult> partResults() const;

  SessionDocument* doc_;
  SweepRunner runner_;
  SweepPlots* plots_;
  QComboBox* family_;
  QDoubleSpinBox* dirX_;
  QDoubleSpinBox* dirY_;
  QCheckBox* autoCenter_;
  QDoubleSpinBox* centerX_;
  QDoubleSpinBox* centerY_;
  QDoubleSpinBox* from_;
  QDoubleSpinBox* to_;
  QSpinBox* steps_;
  QSpinBox* resamples_;  // bands: resamples per θ (0 = no bands); a view option, not saved
  QDoubleSpinBox* reference_;
  QCheckBox* normalise_;
  QPushButton* runButton_;
  QPushButton* cancelButton_;
  QProgressBar* progress_;
  QLabel* status_;
  QWidget* shiftBox_;
  QWidget* centerBox_;
  std::vector<SweepOutcome> parts_;
  std::vector<std::vector<std::string>> queue_;  // passes still to run
  SweepSettings runSettings_;
  Cloud runA_, runB_;
  ParamSet runParams_;
  quint64 runRevision_ = 0;
  // What was shown before the running sweep: put back if it is cancelled before a pass ends.
  std::vector<SweepOutcome> previousParts_;
  quint64 previousRevision_ = 0;
  bool previousHasRun_ = false;
  std::string error_;
  bool cancelled_ = false;
  bool hasRun_ = false;
  bool stale_ = false;
  void updateStale();
  bool active_ = false;
  bool loading_ = false;
};

}  // namespace barrow::ui
