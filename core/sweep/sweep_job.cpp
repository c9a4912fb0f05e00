#include "sweep/sweep_job.h"

#include <cmath>
#include <exception>

#include "measures/evaluate.h"

namespace barrow {

namespace {

// `warm` holds the state evaluate() left for (at, b) when not null: the gradient of a measure
// that needs its solver's state again (sinkhorn's potentials) then costs no new solve.
std::optional<Eigen::MatrixX2d> tryGradient(const Measure& m, const Cloud& at, const Cloud& b,
                                            const ParamSet& frozen, const Result& r,
                                            const RunControl* control, std::shared_ptr<WarmState>* warm) {
  std::string error;
  EvalContext ctx;
  ctx.params = resolveParams(m, frozen, &error);
  ctx.control = control;
  ctx.warm = warm;
  ctx.wantPlan = m.gradientNeedsPlan();
  if (!error.empty()) return std::nullopt;
  try {
    auto g = m.gradientA(at, b, ctx, r);
    if (g && g->rows() == at.size() && g->allFinite()) return g;
  } catch (const std::exception&) {
    // A gradient that throws is treated as absent; the value itself is unaffected.
  }
  return std::nullopt;
}

bool planNotUnique(const nlohmann::json& details) {
  const auto it = details.find("plan_unique");
  return it != details.end() && it->is_boolean() && !it->get<bool>();
}

}  // namespace

SweepJob::SweepJob(const Measure& m, const ParamSet& user, const Cloud& a0, const Cloud& b,
                   bool wantAnalytic, const RunControl* control)
    : m_(&m) {
  std::string error;
  const ParamSet resolved = resolveParams(m, user, &error);
  if (!error.empty()) {
    setupError_ = error;
    return;
  }
  try {
    frozen_ = m.freeze(a0, b, resolved);
  } catch (const std::exception& e) {
    setupError_ = m.id() + ": freezing the settings at the reference θ failed: " + e.what();
    return;
  }
  for (const auto& [k, v] : resolved.values())
    if (!frozen_.has(k) || frozen_.text(k) != v) rules_.set(k, v);
  EvalRequest req;
  req.params = frozen_;
  req.control = control;
  req.wantPlan = wantAnalytic && m.gradientNeedsPlan();
  std::shared_ptr<WarmState> state;
  req.warm = &state;
  const Result r = evaluateMeasure(m, a0, b, req);
  details_ = r.details;
  if (wantAnalytic && r.usable() && std::isfinite(r.value))
    analytic_ = tryGradient(m, a0, b, frozen_, r, control, &state).has_value();
}

SweepCell SweepJob::evaluate(const Cloud& at, const Cloud& b, const Eigen::MatrixX2d& velocity,
                             std::shared_ptr<WarmState>* warm, const RunControl* control) const {
  SweepCell c;
  if (!setupError_.empty()) {
    c.status = Status::InvalidInput;
    c.message = setupError_;
    return c;
  }
  EvalRequest req;
  req.params = frozen_;
  req.control = control;
  // Without warm starts between θ, the state still passes from this value to its gradient.
  std::shared_ptr<WarmState> local;
  req.warm = warm ? warm : (analytic_ ? &local : nullptr);
  req.wantPlan = analytic_ && m_->gradientNeedsPlan();
  const Result r = evaluateMeasure(*m_, at, b, req);
  c.status = r.status;
  c.seconds = r.seconds;
  if (r.status == Status::Infinite) c.value = INFINITY;
  else if (r.usable()) c.value = r.value;
  if (r.status != Status::Ok) c.message = r.message;
  if (const auto it = r.details.find("value_accuracy"); it != r.details.end() && it->is_number())
    c.accuracy = it->get<double>();
  c.oneSided = planNotUnique(r.details);
  if (analytic_ && std::isfinite(c.value) && velocity.rows() == at.size()) {
    if (auto g = tryGradient(*m_, at, b, frozen_, r, control, req.warm)) {
      c.slope = (g->array() * velocity.array()).sum();
      c.analyticSlope = true;
    }
  }
  return c;
}

}  // namespace barrow
