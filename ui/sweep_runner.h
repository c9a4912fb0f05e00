// Runs a sweep (the engine's runSweep) and its continuity findings on a worker thread via
// QtConcurrent with a QPromise: progress, cancellation, and only the newest run's outcome is
// reported.
#pragma once

#include <QFutureWatcher>
#include <QObject>
#include <QThreadPool>
#include <atomic>
#include <memory>
#include <string>
#include <vector>

#include "base/params.h"
#include "cloud/cloud.h"
#include "sweep/findings.h"
#include "sweep/sweep_result.h"

namespace barrow::ui {

struct SweepOutcome {
  SweepResult result;
  std::vector<Finding> findings;
  std::string error;  // set when the sweep could not run at all
};

class SweepRunner : public QObject {
  Q_OBJECT
 public:
  explicit SweepRunner(QObject* parent = nullptr);
  ~SweepRunner() override;

  /// Starts a sweep of A_θ against B, cancelling one still running. `resamples` > 0 adds
  /// resampling bands (core/uncertainty/sweep_bands.h) with that many resamples.
  void start(const Cloud& a, const Cloud& b, const SweepSettings& settings, const ParamSet& params, int resamples = 0);
  void cancel();
  bool running() const { return running_; }

 signals:
  void progress(double fraction);
  void finished(const barrow::ui::SweepOutcome& outcome);
  void runningChanged(bool running);

 private:
  quint64 latest_ = 0;
  bool running_ = false;
  std::shared_ptr<std::atomic<bool>> cancel_;
  QFutureWatcher<SweepOutcome>* watcher_ = nullptr;
  QThreadPool pool_;
};

}  // namespace barrow::ui

Q_DECLARE_METATYPE(barrow::ui::SweepOutcome)
