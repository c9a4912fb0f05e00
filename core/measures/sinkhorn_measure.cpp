#include "measures/sinkhorn_measure.h"

#include <algorithm>
#include <memory>
#include <optional>
#include <tuple>

#include "cloud/congruence.h"
#include "measures/entropic_bracket.h"
#include "measures/entropic_measure.h"
#include "transport/sinkhorn_cache.h"
#include "transport/sinkhorn_carry.h"
#include "transport/sinkhorn_plan.h"

namespace barrow {

namespace {

const char* kGroup = "sinkhorn";

// The three problems' solutions, kept between calls of a sweep. A self term depends only on
// distances within its cloud, so it is reused as it is when the cloud has only been moved
// rigidly (B never moves in a sweep; A moves rigidly under the shift and rotate families).
struct SinkhornWarm : WarmState {
  SolvedPotentials ab;                       // OT_ε(a, b) on the last clouds (x: A, y: B)
  std::optional<SolvedPotentials> abBefore;  // the same one step earlier
  Eigen::VectorXd weightsA, weightsB;        // the last clouds' weights, as given
  SinkhornResult aa, bb;
  double epsilon = 0.0;
  int p = 0;
  double tolerance = 0.0;
};

// The state in `ctx` when it was solved with the same ε, p and tolerance, else null.
const SinkhornWarm* fittingWarm(const EvalContext& ctx, const SinkhornOptions& o) {
  const auto* w = ctx.warm && *ctx.warm ? dynamic_cast<const SinkhornWarm*>(ctx.warm->get()) : nullptr;
  return w && w->p == o.p && w->epsilon == o.epsilon && w->tolerance == o.tolerance ? w : nullptr;
}

// *Reused: not solved by this call. ab and the self terms may come from the shared store
// (sinkhorn_cache.h: `entropic` on the same clouds and settings solved OT_ε(a, b) already);
// a self term may also be taken over from a rigidly moved cloud solved before.
struct ThreeSolves {
  SinkhornResult ab, aa, bb;
  bool abReused = false, aaReused = false, bbReused = false;
};

// A converged self term of `w` that also holds for `x` (x congruent to the cloud it was
// solved on), or null.
const SinkhornResult* reusableSelf(const SinkhornWarm* w, const Cloud& x) {
  if (!w) return nullptr;
  const std::tuple<const Eigen::MatrixX2d*, const Eigen::VectorXd*, const SinkhornResult*> terms[] = {
      {&w->ab.x, &w->weightsA, &w->aa}, {&w->ab.y, &w->weightsB, &w->bb}};
  for (const auto& [points, weights, result] : terms)
    if (result->status == SinkhornStatus::Converged && weights->size() == x.weights.size() &&
        *weights == x.weights && rigidlyMoved(*points, x.points, true))
      return result;
  return nullptr;
}

// The previous self solve as a start when the sizes fit, else null.
const Eigen::VectorXd* selfStart(const SinkhornResult& prev, Eigen::Index n) {
  return prev.f.size() == n ? &prev.f : nullptr;
}

// Progress of one sub-solve mapped into [lo, hi] of the caller's range.
RunControl subControl(const RunControl* c, double lo, double hi) { return c ? c->sub(lo, hi) : RunControl{}; }

// The three problems (OT_ε(b,b) only when `withB`: the gradient in A does not need it).
ThreeSolves solveAll(const Cloud& a, const Cloud& b, const EntropicSettings& s, const EvalContext& ctx,
                     kernel::RowWorkers& team, bool withB = true) {
  const SinkhornOptions& o = s.options;
  const SinkhornWarm* w = fittingWarm(ctx, o);
  const Eigen::VectorXd wa = a.normalizedWeights(), wb = b.normalizedWeights();
  const RunControl* c = ctx.control;
  ThreeSolves t;
  const RunControl cab = subControl(c, 0.0, 0.6), caa = subControl(c, 0.6, 0.8), cbb = subControl(c, 0.8, 1.0);
  SinkhornStart start;
  Eigen::VectorXd f0, g0;
  if (w) {
    startFromPath(w->abBefore ? &*w->abBefore : nullptr, w->ab, a.points, b.points, o.p, f0, g0);
    start = {&f0, &g0};
  }
  SinkhornCache& store = SinkhornCache::shared();
  t.ab = store.solve(a.points, wa, b.points, wb, o, c ? &cab : nullptr, &start, &team, &t.abReused);
  if (t.ab.status == SinkhornStatus::Cancelled || t.ab.status == SinkhornStatus::InvalidInput) return t;
  if (const SinkhornResult* same = reusableSelf(w, a)) {
    t.aa = *same;
    t.aaReused = true;
  } else {
    t.aa = store.solveSymmetric(a.points, wa, o, c ? &caa : nullptr, w ? selfStart(w->aa, a.size()) : nullptr, &team,
                                &t.aaReused);
  }
  if (t.aa.status == SinkhornStatus::Cancelled || t.aa.status == SinkhornStatus::InvalidInput || !withB) return t;
  if (const SinkhornResult* same = reusableSelf(w, b)) {
    t.bb = *same;
    t.bbReused = true;
  } else if (t.aa.status == SinkhornStatus::Converged && rigidlyCongruent(a, b)) {
    t.bb = t.aa;  // B is A moved rigidly: the same self term
    t.bbReused = true;
  } else {
    t.bb = store.solveSymmetric(b.points, wb, o, c ? &cbb : nullptr, w ? selfStart(w->bb, b.size()) : nullptr, &team,
                                &t.bbReused);
  }
  return t;
}

// Clouds above the exact limit: the three terms bracketed (entropic_bracket.h), combined with
// their signs. S_ε ≥ 0 for the costs |x − y| and |x − y|² (Feydy et al. 2019, Thm 1), so low is
// at least 0.
Result bracketDivergence(const Cloud& a, const Cloud& b, const EntropicSettings& s, const EvalContext& ctx) {
  kernel::RowWorkers team(ctx.threads());
  const RunControl* c = ctx.control;
  const RunControl cab = subControl(c, 0.0, 0.5), caa = subControl(c, 0.5, 0.75), cbb = subControl(c, 0.75, 1.0);
  const SinkhornOptions& o = s.options;
  const Eigen::Index k = s.representatives;
  const EntropicBracket ab = bracketEntropicShared(a, b, false, o, k, c ? &cab : nullptr, team);
  if (ab.cancelled) return Result::cancelled();
  const EntropicBracket aa = ab.usable ? bracketEntropicShared(a, a, true, o, k, c ? &caa : nullptr, team) : ab;
  if (aa.cancelled) return Result::cancelled();
  // B a rigid motion of A: the same self term (it depends only on distances within the cloud).
  const bool same = aa.usable && rigidlyCongruent(a, b);
  const EntropicBracket bb = !aa.usable || same ? aa : bracketEntropicShared(b, b, true, o, k, c ? &cbb : nullptr, team);
  if (bb.cancelled) return Result::cancelled();
  for (const EntropicBracket* e : {&ab, &aa, &bb})
    if (!e->usable) {
      Result r;
      r.status = Status::NotConverged;
      r.message = "bracket: " + e->message;
      return r;
    }
  const double low = std::max(0.0, ab.low - 0.5 * aa.high - 0.5 * bb.high);
  Result r = Result::bracketed(low, std::max(low, ab.high - 0.5 * aa.low - 0.5 * bb.low));
  r.iterations = ab.quantised.iterations + aa.quantised.iterations + (same ? 0 : bb.quantised.iterations);
  r.details = entropicDetails(s);
  r.details["rule"] = "each term OT_eps bracketed; low = low_ab - (high_aa + high_bb)/2, high = high_ab - "
                      "(low_aa + low_bb)/2, and low >= 0 (S_eps is non-negative)";
  r.details["ot_ab"] = {ab.low, ab.high};
  r.details["ot_aa"] = {aa.low, aa.high};
  r.details["ot_bb"] = {bb.low, bb.high};
  addBracketDetails(r.details, "ab_", ab);
  addBracketDetails(r.details, "aa_", aa);
  addBracketDetails(r.details, "bb_", bb);
  r.details["bb_is_aa"] = same;
  r.details["value_is"] = "midpoint of [low, high]";
  r.details["width"] = r.high - r.low;
  r.details["value_accuracy"] = 0.5 * (r.high - r.low);
  return r;
}

}  // namespace

std::vector<ParamSpec> SinkhornMeasure::params() const { return entropicParamSpecs(kGroup); }

ParamSet SinkhornMeasure::freeze(const Cloud& a, const Cloud& b, const ParamSet& resolved) const {
  return freezeEntropic(kGroup, a, b, resolved);
}

Result SinkhornMeasure::evaluate(const Cloud& a, const Cloud& b, const EvalContext& ctx) const {
  const EntropicSettings s = readEntropicSettings(kGroup, ctx.params, a, b);
  if (!s.error.empty()) return Result::invalid(s.error);
  if (entropicBrackets(s, a, b)) return bracketDivergence(a, b, s, ctx);
  kernel::RowWorkers team(ctx.threads());
  ThreeSolves t = solveAll(a, b, s, ctx, team);

  Result r;
  r.details = entropicDetails(s);
  // Iterations run by this call (a reused self term cost none).
  r.iterations = (t.abReused ? 0 : t.ab.iterations) + (t.aaReused ? 0 : t.aa.iterations) +
                 (t.bbReused ? 0 : t.bb.iterations);
  const std::pair<const char*, const SinkhornResult*> parts[] = {
      {"OT_eps(A,B)", &t.ab}, {"OT_eps(A,A)", &t.aa}, {"OT_eps(B,B)", &t.bb}};
  r.message.clear();
  r.status = Status::Ok;
  for (const auto& [name, sr] : parts) {
    if (sr->status == SinkhornStatus::InvalidInput) return Result::invalid(std::string("sinkhorn: ") + sr->message);
    if (sr->status == SinkhornStatus::Cancelled) return Result::cancelled();
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
  // Estimate of the absolute accuracy: each term's marginal error × the largest cost [CP].
  r.details["value_accuracy"] = (t.ab.marginalError + 0.5 * t.aa.marginalError + 0.5 * t.bb.marginalError) * s.costBound;

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
  // Not solved by this call: found in the shared store, or (self terms) taken from a rigidly
  // moved cloud solved before.
  r.details["ab_reused"] = t.abReused;
  r.details["aa_reused"] = t.aaReused;
  r.details["bb_reused"] = t.bbReused;
  if (ctx.warm) {
    auto w = std::make_shared<SinkhornWarm>();
    const SinkhornWarm* before = fittingWarm(ctx, s.options);
    if (before && before->ab.f.size() == a.size() && before->ab.g.size() == b.size()) w->abBefore = before->ab;
    w->ab = {a.points, b.points, std::move(t.ab.f), std::move(t.ab.g)};
    w->weightsA = a.weights;
    w->weightsB = b.weights;
    w->aa = std::move(t.aa);
    w->bb = std::move(t.bb);
    w->epsilon = s.options.epsilon;
    w->p = s.options.p;
    w->tolerance = s.options.tolerance;
    *ctx.warm = w;
  }
  return r;
}

std::optional<Eigen::MatrixX2d> SinkhornMeasure::gradientA(const Cloud& a, const Cloud& b,
                                                           const EvalContext& ctx, const Result& r) const {
  const EntropicSettings s = readEntropicSettings(kGroup, ctx.params, a, b);
  // A bracket carries no potentials of the full problems (and solving them is what it avoids).
  if (!s.error.empty() || !r.usable() || r.status == Status::Bracketed) return std::nullopt;
  // The potentials of the three problems: instant when ctx.warm holds evaluate()'s state.
  kernel::RowWorkers team(ctx.threads());
  const ThreeSolves t = solveAll(a, b, s, ctx, team, false);
  if (!t.ab.usable() || !t.aa.usable()) return std::nullopt;
  const SinkhornOptions& o = s.options;
  const Eigen::VectorXd wa = a.normalizedWeights(), wb = b.normalizedWeights();
  return Eigen::MatrixX2d(entropicGradient(a.points, wa, b.points, wb, t.ab.f, t.ab.g, o.epsilon, o.p, &team) -
                          entropicGradient(a.points, wa, a.points, wa, t.aa.f, t.aa.f, o.epsilon, o.p, &team));
}

}  // namespace barrow
