#include "critic_runner.h"

#include <QMetaObject>
#include <QtConcurrent/QtConcurrentRun>

#include "transport/kr_potential.h"

namespace barrow::ui {

CriticRunner::CriticRunner(QObject* parent) : QObject(parent) { pool_.setMaxThreadCount(1); }

CriticRunner::~CriticRunner() {
  if (cancel_) *cancel_ = true;
  pool_.waitForDone();
}

void CriticRunner::cancel() {
  if (cancel_) *cancel_ = true;
}

// Runs f on the GUI thread if request `id` is still the newest when it gets there.
void CriticRunner::post(quint64 id, std::function<void()> f) {
  QMetaObject::invokeMethod(
      this, [this, id, f = std::move(f)] {
        if (id == latest_) f();
      },
      Qt::QueuedConnection);
}

quint64 CriticRunner::start(const Cloud& a, const Cloud& b, const critic::CriticSettings& s, int mapSide) {
  cancel();
  const quint64 id = ++latest_;
  cancel_ = std::make_shared<std::atomic<bool>>(false);
  if (!running_) {
    running_ = true;
    emit runningChanged(true);
  }
  auto flag = cancel_;
  (void)QtConcurrent::run(&pool_, [this, id, flag, a, b, s, mapSide] {
    auto out = std::make_shared<CriticOutcome>();
    out->a = a;
    out->b = b;
    RunControl control;
    control.cancel = flag.get();
    control.onProgress = [this, id](double f) {
      post(id, [this, f] { emit progress(f); });
      return true;
    };
    out->ref = critic::exactReference(a, b, &control);
    if (!out->ref.usable()) {
      out->error = "exact W1 failed: " + out->ref.message;
    } else {
      const double w1 = out->ref.w1;
      post(id, [this, w1] { emit exactReady(w1); });
      out->check = critic::checkCritic(a, b, out->ref, s, &control, nullptr, [this, id](const critic::CurvePoint& p) {
        post(id, [this, p] { emit curvePoint(p.step, p.estimate, p.lowerBound); });
      });
      if (out->check.status == Status::Ok) {
        out->frame = critic::gridOver(a, b, mapSide);
        const auto& g = out->frame;
        const critic::Activation act = s.shape.activation;
        out->f = critic::criticOnGrid(out->check.network, act, g);
        out->gradNorm = critic::gradientNormOnGrid(out->check.network, act, g);
        out->phi = krPotentialGrid(b, out->ref.v, g.x0, g.y0, g.dx, g.dy, g.nx, g.ny);
      }
    }
    std::shared_ptr<const CriticOutcome> done = out;
    post(id, [this, done] {
      running_ = false;
      emit runningChanged(false);
      emit finished(done);
    });
  });
  return id;
}

}  // namespace barrow::ui
