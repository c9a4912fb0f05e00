#include "sweep_runner.h"

#include <QPromise>
#include <QtConcurrent/QtConcurrentRun>

#include "base/run_control.h"

#include "sweep/continuity.h"
#include "sweep/sweep_engine.h"
#include "uncertainty/sweep_bands.h"

namespace barrow::ui {

namespace {

SweepOutcome runOne(const Cloud& a, const Cloud& b, const SweepSettings& settings, const ParamSet& params,
                    int resamples, const std::atomic<bool>* cancel, QPromise<SweepOutcome>& promise) {
  SweepOutcome out;
  RunControl control;
  control.cancel = cancel;
  // With bands the sweep takes the first 30 % of the bar and the resamples the rest.
  const double share = resamples > 0 ? 0.3 : 1.0;
  control.onProgress = [&promise, share](double f) {
    promise.setProgressValue(int(1000 * share * std::clamp(f, 0.0, 1.0)));
    return !promise.isCanceled();
  };
  SweepRequest req;
  req.settings = settings;
  req.params = params;
  try {
    out.result = runSweep(a, b, req, &control);
    if (!out.result.cancelled && resamples > 0 && !out.result.theta.empty()) {
      RunControl bandControl;
      bandControl.cancel = cancel;
      bandControl.onProgress = [&promise, share](double f) {
        promise.setProgressValue(int(1000 * (share + (1.0 - share) * std::clamp(f, 0.0, 1.0))));
        return !promise.isCanceled();
      };
      SweepBandRequest bands;
      bands.resamples = resamples;
      if (auto e = addSweepBands(a, b, out.result, bands, &bandControl)) out.result.message = "bands: " + *e;
      if (cancel->load() || promise.isCanceled()) out.result.cancelled = true;
    }
    if (!out.result.cancelled) out.findings = findContinuity(out.result);
  } catch (const std::exception& e) {
    out.error = e.what();
  }
  return out;
}

}  // namespace

SweepRunner::SweepRunner(QObject* parent) : QObject(parent) {
  pool_.setMaxThreadCount(2);  // a cancelled sweep may still be winding down as the next starts
}

SweepRunner::~SweepRunner() {
  cancel();
  pool_.waitForDone();
}

void SweepRunner::start(const Cloud& a, const Cloud& b, const SweepSettings& settings, const ParamSet& params,
                        int resamples) {
  cancel();
  const quint64 id = ++latest_;
  cancel_ = std::make_shared<std::atomic<bool>>(false);
  auto flag = cancel_;
  // A pool of our own: Qt's global pool also serves its image routines, which the GUI
  // thread waits for while painting; a long sweep there would stall the window.
  QFuture<SweepOutcome> future = QtConcurrent::run(
      &pool_, [a, b, settings, params, resamples, flag](QPromise<SweepOutcome>& promise) {
        promise.setProgressRange(0, 1000);
        promise.addResult(runOne(a, b, settings, params, resamples, flag.get(), promise));
      });
  auto* w = new QFutureWatcher<SweepOutcome>(this);
  watcher_ = w;
  connect(w, &QFutureWatcherBase::progressValueChanged, this, [this, id](int v) {
    if (id == latest_) emit progress(v / 1000.0);
  });
  connect(w, &QFutureWatcherBase::finished, this, [this, w, id] {
    w->deleteLater();
    if (watcher_ == w) watcher_ = nullptr;
    if (id != latest_) return;  // superseded by a newer sweep
    running_ = false;
    emit runningChanged(false);
    if (w->future().resultCount() == 0) return;
    emit finished(w->future().result());
  });
  w->setFuture(future);
  if (!running_) {
    running_ = true;
    emit runningChanged(true);
  }
}

void SweepRunner::cancel() {
  if (cancel_) *cancel_ = true;
}

}  // namespace barrow::ui
