#include "live_evaluator.h"

#include "measures/time_estimate.h"

#include <algorithm>

#include "families/family_map.h"
#include "measures/evaluate.h"
#include "potential_map.h"

namespace barrow::ui {

namespace {

bool sameCloud(const Cloud& x, const Cloud& y) {
  return x.points.rows() == y.points.rows() && x.points == y.points && x.weights == y.weights;
}

double since(std::chrono::steady_clock::time_point t0) {
  return std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count();
}

bool sameFamily(const SweepSettings& x, const SweepSettings& y) {
  return x.family == y.family && x.direction == y.direction && x.center == y.center;
}

}  // namespace

class FamilyMapHolder {
 public:
  FamilyMapHolder(const Cloud& a, const Cloud& b, const SweepSettings& s) : map(a, b, s) {}
  FamilyMap map;
};

LiveEvaluator::LiveEvaluator(QObject* parent) : QObject(parent) {
  thread_ = std::thread([this] { loop(); });
}

LiveEvaluator::~LiveEvaluator() {
  {
    std::lock_guard<std::mutex> lock(mutex_);
    quit_ = true;
    pending_.reset();
  }
  shutdown_ = true;
  stopSlow_ = true;
  wake_.notify_all();
  thread_.join();
}

quint64 LiveEvaluator::submit(LiveRequest req) {
  const quint64 id = ++latest_;
  {
    std::lock_guard<std::mutex> lock(mutex_);
    pending_ = std::move(req);
    pendingId_ = id;
    pendingAt_ = std::chrono::steady_clock::now();
    stopSlow_ = true;  // under the lock, so the worker's reset for this request comes after
  }
  wake_.notify_one();
  if (!busy_) {
    busy_ = true;
    emit busyChanged(true);
  }
  return id;
}

void LiveEvaluator::loop() {
  for (;;) {
    LiveRequest req;
    quint64 id = 0;
    std::chrono::steady_clock::time_point t0;
    {
      std::unique_lock<std::mutex> lock(mutex_);
      wake_.wait(lock, [this] { return quit_ || pending_.has_value(); });
      if (quit_) return;
      req = std::move(*pending_);
      pending_.reset();
      id = pendingId_;
      t0 = pendingAt_;
      stopSlow_ = false;
    }
    run(id, req, t0);
  }
}

Result LiveEvaluator::evaluateOne(const Measure& m, const Cloud& a, const Cloud& b,
                                  const ParamSet& params, bool wantPlan,
                                  const RunControl* control, bool useWarm) {
  EvalRequest er;
  er.params = params;
  er.control = control;
  er.wantPlan = wantPlan;
  if (useWarm) er.warm = &warm_[m.id()];
  return evaluateMeasure(m, a, b, er);
}

std::pair<Cloud, std::optional<Cloud>> LiveEvaluator::placeA(const LiveRequest& req,
                                                              std::string* message) {
  if (!req.family) return {req.a, std::nullopt};
  const FamilyView& f = *req.family;
  const bool cached = familyKey_ && sameCloud(familyKey_->a, req.a) && sameCloud(familyKey_->b, req.b) &&
                      sameFamily(familyKey_->settings, f.settings);
  if (!cached) {
    familyKey_ = FamilyKey{req.a, req.b, f.settings};
    try {
      familyMap_ = std::make_shared<FamilyMapHolder>(req.a, req.b, f.settings);
    } catch (const std::exception& e) {
      familyMap_.reset();
      *message = e.what();
    }
  }
  if (!familyMap_) return {req.a, std::nullopt};
  if (auto e = familyMap_->map.error()) {
    *message = *e;
    return {req.a, std::nullopt};
  }
  Cloud shown = f.theta ? familyMap_->map.at(*f.theta) : req.a;
  shown.name = req.a.name;
  return {std::move(shown), familyMap_->map.at(f.reference)};
}

std::optional<Result> LiveEvaluator::referenceOf(const Measure& m, const std::optional<Cloud>& refA,
                                                 const LiveRequest& req, const RunControl* control) {
  if (!refA) return std::nullopt;
  const bool sameKey = refKey_ && sameCloud(refKey_->a, *refA) &&
                       sameCloud(refKey_->b, req.b) &&
                       refKey_->params.values() == req.params.values();
  if (!sameKey) {
    refKey_ = RefKey{*refA, req.b, req.params};
    refCache_.clear();
  }
  if (auto it = refCache_.find(m.id()); it != refCache_.end()) return it->second;
  Result r = evaluateOne(m, *refA, req.b, req.params, false, control, false);
  if (r.status != Status::Cancelled) refCache_[m.id()] = r;
  return r;
}

void LiveEvaluator::run(quint64 id, const LiveRequest& req,
                        std::chrono::steady_clock::time_point t0) {
  RunControl cheapControl;
  cheapControl.cancel = &shutdown_;
  RunControl slowControl;
  slowControl.cancel = &stopSlow_;

  auto wantsPlan = [&](const Measure& m) {
    return m.id() == req.planId || (req.entropicPlan && m.id() == "entropic") ||
           (req.potential && m.id() == "w1");
  };

  // Where A sits first, delivered at once so the Field can follow the θ cursor without
  // waiting for the measures.
  std::string familyMessage;
  auto [shownA, refA] = placeA(req, &familyMessage);
  {
    LiveUpdate g;
    g.request = id;
    g.shownA = shownA;
    g.familyMessage = familyMessage;
    g.secondsSinceSubmit = since(t0);
    for (const Measure* m : req.measures) g.pending.push_back(m->id());
    const bool nothingElse = req.measures.empty() && !req.potential;
    g.final = nothingElse;
    deliver(std::move(g));
    if (nothingElse) return;
  }
  const Cloud& a = shownA;
  // Usually A is drawn at θ₀ itself: then the reference values are the values.
  const bool refIsShown = refA && sameCloud(*refA, a);
  auto reference = [&](const Measure& m, const Result& now, const RunControl* control) -> std::optional<Result> {
    if (refIsShown) return now;
    return referenceOf(m, refA, req, control);
  };

  std::vector<const Measure*> slow;
  std::optional<Result> w1;  // its dual potential v feeds the heat map
  LiveUpdate first;
  first.request = id;
  // Slow: the measures that say so, and any whose forecast on these clouds passes a quarter of
  // a second (exact W1 on 10^4 points is cheap at 500 but takes seconds there), so the quick
  // ones reach the screen first.
  auto slowHere = [&](const Measure& m) {
    if (!m.cheap()) return true;
    const auto e = estimateTime(m.id(), std::size_t(a.size()), std::size_t(req.b.size()), 0);
    return e && e->seconds > 0.25;
  };
  std::vector<const Measure*> quick;
  for (const Measure* m : req.measures) (slowHere(*m) ? slow : quick).push_back(m);
  // On large clouds even the quick ones add up (about a second at 10^5 points): what is done
  // goes to the screen every quarter of a second instead of all at the end.
  auto lastDelivery = std::chrono::steady_clock::now();
  for (std::size_t k = 0; k < quick.size(); ++k) {
    const Measure* m = quick[k];
    LiveItem item{m->id(), evaluateOne(*m, a, req.b, req.params, wantsPlan(*m), &cheapControl, true),
                  std::nullopt};
    item.reference = reference(*m, item.result, &cheapControl);
    if (m->id() == "w1") w1 = item.result;
    first.items.push_back(std::move(item));
    if (shutdown_) return;
    const bool more = k + 1 < quick.size();
    if (more && std::chrono::steady_clock::now() - lastDelivery > std::chrono::milliseconds(250)) {
      if (newerRequestWithin(0)) return;  // superseded: its own updates will follow
      for (std::size_t r = k + 1; r < quick.size(); ++r) first.pending.push_back(quick[r]->id());
      for (const Measure* s : slow) first.pending.push_back(s->id());
      first.secondsSinceSubmit = since(t0);
      deliver(std::move(first));
      first = LiveUpdate{};
      first.request = id;
      lastDelivery = std::chrono::steady_clock::now();
    }
  }
  for (const Measure* m : slow) first.pending.push_back(m->id());
  const bool potentialLater = req.potential.has_value();
  first.final = slow.empty() && !potentialLater;
  first.secondsSinceSubmit = since(t0);
  deliver(std::move(first));
  if (slow.empty() && !potentialLater) return;

  if (req.interactive && newerRequestWithin(req.slowDelayMs)) return;
  std::vector<std::string> left;
  for (const Measure* m : slow) left.push_back(m->id());
  for (const Measure* m : slow) {
    if (stopSlow_) return;  // a newer request takes over; it will deliver a final update
    LiveUpdate u;
    u.request = id;
    LiveItem item{m->id(), evaluateOne(*m, a, req.b, req.params, wantsPlan(*m), &slowControl, true),
                  std::nullopt};
    if (item.result.status == Status::Cancelled && stopSlow_) return;
    item.reference = reference(*m, item.result, &slowControl);
    if (stopSlow_) return;
    if (m->id() == "w1") w1 = item.result;
    left.erase(std::find(left.begin(), left.end(), m->id()));
    u.items.push_back(std::move(item));
    u.pending = left;
    u.final = left.empty() && !potentialLater;
    u.secondsSinceSubmit = since(t0);
    deliver(std::move(u));
  }
  if (!potentialLater) return;
  if (stopSlow_) return;
  LiveUpdate u;
  u.request = id;
  u.final = true;
  u.grid = req.potential;
  if (!w1) {
    u.potentialMessage = "the W1 measure is not available";
  } else {
    Eigen::MatrixXd grid;
    u.potentialMessage = computePotentialMap(req.b, *w1, *req.potential, &grid);
    if (u.potentialMessage.empty()) u.potential = std::move(grid);
  }
  if (stopSlow_) return;
  u.secondsSinceSubmit = since(t0);
  deliver(std::move(u));
}

bool LiveEvaluator::newerRequestWithin(int ms) {
  std::unique_lock<std::mutex> lock(mutex_);
  return wake_.wait_for(lock, std::chrono::milliseconds(ms), [this] { return quit_ || pending_.has_value(); });
}

void LiveEvaluator::deliver(LiveUpdate u) {
  QMetaObject::invokeMethod(
      this,
      [this, u = std::move(u)] {
        if (u.request != latest_) return;  // overtaken by a newer request
        emit updated(u);
        if (u.final && busy_) {
          busy_ = false;
          emit busyChanged(false);
        }
      },
      Qt::QueuedConnection);
}

}  // namespace barrow::ui
