#include "uncertainty_runner.h"

#include <QPromise>
#include <QtConcurrent/QtConcurrentRun>
#include <algorithm>

namespace barrow::ui {

namespace {

// Progress shares of the three parts (the interval loop evaluates the most).
constexpr double kSpreadShare = 0.55, kPermuteShare = 0.35;

UncertaintyOutcome runAll(const UncertaintyRequest& req, const std::atomic<bool>* cancel,
                          QPromise<UncertaintyOutcome>& promise) {
  UncertaintyOutcome out;
  auto control = [&](double from, double share) {
    RunControl c;
    c.cancel = cancel;
    c.onProgress = [&promise, from, share](double f) {
      promise.setProgressValue(int(1000 * std::clamp(from + share * f, 0.0, 1.0)));
      return !promise.isCanceled();
    };
    return c;
  };
  SpreadRequest sr;
  sr.measures = req.measures;
  sr.params = req.params;
  sr.resamples = req.resamples;
  sr.seed = req.seed;
  const RunControl c1 = control(0.0, kSpreadShare);
  out.spread = runSpread(req.a, req.b, sr, &c1);
  if (out.spread.cancelled) return out.cancelled = true, out;

  PermuteRequest pr;
  pr.measures = req.measures;
  pr.params = req.params;
  pr.permutations = req.permutations;
  pr.seed = req.seed;
  const RunControl c2 = control(kSpreadShare, kPermuteShare);
  out.permute = runPermutationTest(req.a, req.b, pr, &c2);
  if (out.permute.cancelled) return out.cancelled = true, out;

  if (req.sizes) {
    SizesRequest zr;
    zr.measures = req.measures;
    zr.params = req.params;
    zr.repeats = req.repeats;
    zr.seed = req.seed;
    const RunControl c3 = control(kSpreadShare + kPermuteShare, 1.0 - kSpreadShare - kPermuteShare);
    out.sizes = runValueVsSize(req.a, req.b, zr, &c3);
    if (out.sizes->cancelled) out.cancelled = true;
  }
  return out;
}

}  // namespace

UncertaintyRunner::UncertaintyRunner(QObject* parent) : QObject(parent) {
  qRegisterMetaType<barrow::ui::UncertaintyOutcome>();
  // A pool of our own (as the sweep's): a cancelled run may still be winding down.
  pool_.setMaxThreadCount(2);
}

UncertaintyRunner::~UncertaintyRunner() {
  cancel();
  pool_.waitForDone();
}

quint64 UncertaintyRunner::start(UncertaintyRequest req) {
  cancel();
  const quint64 id = ++latest_;
  cancel_ = std::make_shared<std::atomic<bool>>(false);
  auto flag = cancel_;
  QFuture<UncertaintyOutcome> future =
      QtConcurrent::run(&pool_, [req = std::move(req), flag](QPromise<UncertaintyOutcome>& promise) {
        promise.setProgressRange(0, 1000);
        promise.addResult(runAll(req, flag.get(), promise));
      });
  auto* w = new QFutureWatcher<UncertaintyOutcome>(this);
  connect(w, &QFutureWatcherBase::progressValueChanged, this, [this, id](int v) {
    if (id == latest_) emit progress(v / 1000.0);
  });
  connect(w, &QFutureWatcherBase::finished, this, [this, w, id] {
    w->deleteLater();
    if (id != latest_) return;  // superseded: a newer request's result will be drawn
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
  return id;
}

void UncertaintyRunner::cancel() {
  if (cancel_) *cancel_ = true;
}

}  // namespace barrow::ui
