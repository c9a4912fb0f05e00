// The Critic pane: trains a Lipschitz critic on the session's two clouds (weight clipping,
// gradient penalty or spectral normalisation, core/critic/) and sets it beside the exact W1:
// a live training curve (estimate and certified lower bound against the exact W1 line), then
// three maps over the clouds' area — the critic f, the exact Kantorovich potential φ, and
// ‖∇f‖ (white where it is 1, the slope an ideal critic has along transport lines).
#pragma once

#include <QWidget>
#include <memory>

#include "critic/critic_settings.h"

class QComboBox;
class QCustomPlot;
class QCPColorMap;
class QLabel;
class QLineEdit;
class QProgressBar;
class QPushButton;
class QSpinBox;
class QDoubleSpinBox;

namespace barrow::ui {

class CriticRunner;
struct CriticOutcome;
class SessionDocument;

class CriticPanel : public QWidget {
  Q_OBJECT
 public:
  explicit CriticPanel(SessionDocument* doc, QWidget* parent = nullptr);

  /// The settings the controls describe (published defaults of the chosen method, edited).
  critic::CriticSettings settings() const;
  /// Starts training on the session's clouds (what the Train button does).
  void train();
  CriticRunner* runner() const { return runner_; }
  const CriticOutcome* outcome() const { return outcome_.get(); }
  QCustomPlot* curvePlot() const { return curve_; }
  QLabel* summary() const { return summary_; }
  /// True when the shown critic was trained on clouds the session no longer has.
  bool stale() const;

 private:
  void methodChanged();
  void onFinished(std::shared_ptr<const CriticOutcome> out);
  void showMaps(const CriticOutcome& out);
  void updateStale();
  QCustomPlot* makeMap(const QString& title, QCPColorMap** map);

  SessionDocument* doc_;
  CriticRunner* runner_;
  std::shared_ptr<const CriticOutcome> outcome_;
  quint64 trainedRevision_ = 0;  // the session revision the shown critic was trained on
  quint64 runRevision_ = 0;      // the revision of the run in flight
  bool hasResult_ = false;
  QString resultText_;
  QComboBox* method_;
  QSpinBox* steps_;
  QSpinBox* batch_;
  QLineEdit* rate_;
  QDoubleSpinBox* clip_;
  QDoubleSpinBox* lambda_;
  QSpinBox* width_;
  QSpinBox* depth_;
  QComboBox* activation_;
  QSpinBox* seed_;
  QPushButton* trainButton_;
  QPushButton* stopButton_;
  QProgressBar* progress_;
  QLabel* summary_;
  QCustomPlot* curve_;
  QCustomPlot* fPlot_;
  QCustomPlot* phiPlot_;
  QCustomPlot* gradPlot_;
  QCPColorMap* fMap_ = nullptr;
  QCPColorMap* phiMap_ = nullptr;
  QCPColorMap* gradMap_ = nullptr;
};

}  // namespace barrow::ui
