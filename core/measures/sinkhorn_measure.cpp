#include "measures/sinkhorn_measure.h"

#include <algorithm>
#include <memory>

#include "measures/entropic_measure.h"
#include "transport/sinkhorn_plan.h"

namespace barrow {

namespace {

const char* kGroup = "sinkhorn";

// Potentials of the three problems, kept between calls of a sweep.
struct SinkhornWarm : WarmState {
  Eigen::VectorXd fab, gab, faa, fbb;
  double epsilon = 0.0;
  int p = 0;
};

struct ThreeSolves {
  SinkhornResult ab, aa, bb;
};

// Progress of one sub-solve mapped into [lo, hi] of the caller's range.
RunControl subControl(const RunControl* c, double lo, double hi) {
  RunControl s;
  if (!c) return s;
  s.cancel = c->cancel;
  if (c->onProgress) s.onProgress = [c, lo, hi](double f) { return c->onProgress(lo + (hi - lo) * f); };
  return s;
}

// The three problems (OT_ε(b,b) only when `withB`: the gradient in A does not need it).
ThreeSolves solveAll(const Cloud& a, const Cloud& b, const EntropicSettings& s, const EvalContext& ctx,
                     kernel::RowWorkers& team, bool withB = true) {
  const SinkhornOptions& o = s.options;
  const SinkhornWarm* w = nullptr;
  if (ctx.warm && *ctx.warm) {
    w = dynamic_cast<const SinkhornWarm*>(ctx.warm->get());
    if (w && (w->p != o.p || w->epsilon != o.epsilon)) w = nullptr;
  }
  const Eigen::VectorXd wa = a.normalizedWeights(), wb = b.normalizedWeights();
  const RunControl* c = ctx.control;
  ThreeSolves t;
  const RunControl cab = subControl(c, 0.0, 0.6), caa = subControl(c, 0.6, 0.8), cbb = subControl(c, 0.8, 1.0);
  SinkhornStart start;
  if (w) start = {&w->fab, &w->gab};
  t.ab = solveSinkhorn(a.points, wa, b.points, wb, o, c ? &cab : nullptr, &start, &team);
  if (t.ab.status == SinkhornStatus::Cancelled || t.ab.status == SinkhornStatus::InvalidInput) return t;
  t.aa = solveSinkhornSymmetric(a.points, wa, o, c ? &caa : nullptr, w ? &w->faa : nullptr, &team);
  if (t.aa.status == SinkhornStatus::Cancelled || t.aa.status == SinkhornStatus::InvalidInput || !withB) return t;
  t.bb = solveSinkhornSymmetric(b.points, wb, o, c ? &cbb : nullptr, w ? &w->fbb : nullptr, &team);
  return t;
}

}  // namespace

std::vector<ParamSpec> SinkhornMeasure::params() const { return entropicParamSpecs(kGroup); }

ParamSet SinkhornMeasure::freeze(const Cloud& a, const Cloud& b, const ParamSet& resolved) const {
  return freezeEntropic(kGroup, a, b, resolved);
}

Result SinkhornMeasure::evaluate(const Cloud& a, const Cloud& b, const EvalContext& ctx) const {
  const EntropicSettings s = readEntropicSettings(kGroup, ctx.params, a, b);
  if (!s.error.empty()) return Result::invalid(s.error);
  kernel::RowWorkers team;
  ThreeSolves t = solveAll(a, b, s, ctx, team);

  Result r;
  r.details = entropicDetails(s);
  r.iterations = t.ab.iterations + t.aa.iterations + t.bb.iterations;
  const std::pair<const char*, const SinkhornResult*> parts[] = {
      {"OT_eps(A,B)", &t.ab}, {"OT_eps(A,A)", &t.aa}, {"OT_eps(B,B)", &t.bb}};
  r.message.clear();
  r.status = Status::Ok;
  for (const auto& [name, sr] : parts) {
    if (sr->status == SinkhornStatus::InvalidInput) return Result::invalid(std::string("sinkhorn: ") + sr->message);
    if (sr->status == SinkhornStatus::Cancelled) {
      r.status = Status::Cancelled;
      r.message = "cancelled";
      return r;
    }
    if (sr->status == SinkhornStatus::MaxIterations) {
      r.status = Status::NotConverged;
      r.message += std::string(r.message.empty() ? "" : "; ") + name + " " + sr->message;
    }
  }
  r.value = t.ab.value - 0.5 * t.aa.value - 0.5 * t.bb.value;
  r.details["ot_ab"] = t.ab.value;
  r.details["ot_aa"] = t.aa.value;
  r.details["ot_bb"] = t.bb.value;
  addSolveDetails(r.details, "ab_", t.ab);
  addSolveDetails(r.details, "aa_", t.aa);
  addSolveDetails(r.details, "bb_", t.bb);
  r.details["marginal_error"] = std::max({t.ab.marginalError, t.aa.marginalError, t.bb.marginalError});

  if (ctx.wantPlan) {
    const SinkhornOptions& o = s.options;
    EntropicPlan plan = entropicPlan(a.points, a.normalizedWeights(), b.points, b.normalizedWeights(), t.ab.f,
                                     t.ab.g, o.epsilon, o.p, 200000, 1e-12, &team);
    r.plan = std::move(plan.entries);
    r.details["plan_entries"] = r.plan.size();
    r.details["plan_mass_shown"] = plan.keptMass;
    r.details["plan_truncated"] = plan.truncated;
  }
  r.u = t.ab.f - t.aa.f;
  r.v = t.ab.g - t.bb.f;
  if (ctx.warm) {
    auto w = std::make_shared<SinkhornWarm>();
    w->fab = std::move(t.ab.f);
    w->gab = std::move(t.ab.g);
    w->faa = std::move(t.aa.f);
    w->fbb = std::move(t.bb.f);
    w->epsilon = s.options.epsilon;
    w->p = s.options.p;
    *ctx.warm = w;
  }
  return r;
}

std::optional<Eigen::MatrixX2d> SinkhornMeasure::gradientA(const Cloud& a, const Cloud& b,
                                                           const EvalContext& ctx, const Result& r) const {
  const EntropicSettings s = readEntropicSettings(kGroup, ctx.params, a, b);
  if (!s.error.empty() || !r.usable()) return std::nullopt;
  // The potentials of the three problems: instant when ctx.warm holds evaluate()'s state.
  kernel::RowWorkers team;
  const ThreeSolves t = solveAll(a, b, s, ctx, team, false);
  if (!t.ab.usable() || !t.aa.usable()) return std::nullopt;
  const SinkhornOptions& o = s.options;
  const Eigen::VectorXd wa = a.normalizedWeights(), wb = b.normalizedWeights();
  return Eigen::MatrixX2d(entropicGradient(a.points, wa, b.points, wb, t.ab.f, t.ab.g, o.epsilon, o.p, &team) -
                          entropicGradient(a.points, wa, a.points, wa, t.aa.f, t.aa.f, o.epsilon, o.p, &team));
}

}  // namespace barrow
