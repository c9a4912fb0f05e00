// Trains a critic (core/critic/) on a worker thread of its own pool: the exact W1 first, then
// the training with a live curve, then the maps for the pane. Progress and cancel; only the
// newest request's curve points and outcome reach the GUI (older ones are dropped).
#pragma once

#include <QFuture>
#include <QObject>
#include <QThreadPool>
#include <atomic>
#include <memory>

#include "critic_check/critic_check.h"

namespace barrow::ui {

struct CriticOutcome {
  Cloud a, b;  // the clouds trained on (the session may have changed since)
  critic::CriticCheck check;
  critic::ExactReference ref;
  critic::GridFrame frame;
  Eigen::MatrixXd f, phi, gradNorm;  // ny × nx, row = y index
  std::string error;                 // the run could not start (exact W1 failed)
};

class CriticRunner : public QObject {
  Q_OBJECT
 public:
  explicit CriticRunner(QObject* parent = nullptr);
  ~CriticRunner() override;

  /// Starts a run, cancelling one still going. Returns its request number.
  quint64 start(const Cloud& a, const Cloud& b, const critic::CriticSettings& s, int mapSide = 96);
  void cancel();
  bool running() const { return running_; }
  quint64 latest() const { return latest_; }

 signals:
  void progress(double fraction);
  void curvePoint(double step, double estimate, double lowerBound);
  void exactReady(double w1);
  void finished(std::shared_ptr<const barrow::ui::CriticOutcome> outcome);
  void runningChanged(bool running);

 private:
  void post(quint64 id, std::function<void()> f);
  quint64 latest_ = 0;
  bool running_ = false;
  std::shared_ptr<std::atomic<bool>> cancel_;
  QThreadPool pool_;
};

}  // namespace barrow::ui
