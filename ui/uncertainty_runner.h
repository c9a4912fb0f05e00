// Runs the resampling interval, the permutation test and the value-versus-size ladder
// (core/uncertainty) for the window on a worker pool via QtConcurrent with a QPromise: progress,
// cancellation, and only the newest request's outcome is reported.
#pragma once

#include <QFutureWatcher>
#include <QObject>
#include <QThreadPool>
#include <atomic>
#include <memory>
#include <optional>
#include <vector>

#include "cloud/cloud.h"
#include "measures/measure.h"
#include "uncertainty/permutation_test.h"
#include "uncertainty/spread.h"
#include "uncertainty/value_vs_size.h"

namespace barrow::ui {

struct UncertaintyRequest {
  Cloud a, b;
  ParamSet params;
  std::vector<const Measure*> measures;   // intervals, p-values and value versus size for these
  bool sizes = true;                      // also the value-versus-size ladder
  int resamples = 200;
  int permutations = 199;                 // fewer than the CLI's 999: the window answers faster
  int repeats = 10;
  std::uint64_t seed = kDefaultSeed;
};

struct UncertaintyOutcome {
  SpreadResult spread;
  PermuteResult permute;
  std::optional<SizesResult> sizes;
  bool cancelled = false;
};

class UncertaintyRunner : public QObject {
  Q_OBJECT
 public:
  explicit UncertaintyRunner(QObject* parent = nullptr);
  ~UncertaintyRunner() override;

  /// Starts `req`, cancelling one still running; returns its request number.
  quint64 start(UncertaintyRequest req);
  void cancel();
  bool running() const { return running_; }
  quint64 latest() const { return latest_; }

 signals:
  void progress(double fraction);
  void finished(const barrow::ui::UncertaintyOutcome& outcome);
  void runningChanged(bool running);

 private:
  quint64 latest_ = 0;
  bool running_ = false;
  std::shared_ptr<std::atomic<bool>> cancel_;
  QThreadPool pool_;
};

}  // namespace barrow::ui

Q_DECLARE_METATYPE(barrow::ui::UncertaintyOutcome)
