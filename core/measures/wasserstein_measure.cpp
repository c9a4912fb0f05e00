#include "measures/wasserstein_measure.h"

#include <algorithm>
#include <climits>
#include <cmath>
#include <string>

#include "transport/exact_cost.h"
#include "transport/exact_ot.h"
#include "measures/unit_scale.h"
#include "measures/wasserstein_bracket.h"

namespace barrow {

namespace {
constexpr double kMarginalTolerance = 1e-9;  // max |row/column sum − weight|; masses sum to 1
constexpr double kGapTolerance = 1e-9;       // |cost − dual|, relative to the terms' size


Eigen::Index positiveCount(const Cloud& c) {
  Eigen::Index n = 0;
  for (Eigen::Index i = 0; i < c.size(); ++i) n += c.weights(i) > 0;
  return n;
}

// Empty when the exact solve's own certificate holds (marginals and duality gap at rounding
// level, under the weights of the clouds solved); otherwise why not.
std::string certificateProblem(const ExactOtResult& s, const Cloud& a, const Cloud& b) {
  const Eigen::VectorXd wa = a.normalizedWeights(), wb = b.normalizedWeights();
  const double scale = std::abs(s.cost) + wa.dot(s.u.cwiseAbs()) + wb.dot(s.v.cwiseAbs());
  const bool certified = std::isfinite(s.value) && s.marginalError <= kMarginalTolerance && std::isfinite(scale) &&
                         std::abs(s.dualGap) <= kGapTolerance * std::max(scale, 1e-300);
  if (certified) return {};
  return "the exact solver's certificate failed (marginal error " + std::to_string(s.marginalError) +
         ", duality gap " + std::to_string(s.dualGap) +
         "): the value cannot be trusted; coordinates or weights may be too extreme for double precision";
}
}  // namespace

std::vector<ParamSpec> WassersteinMeasure::params() const {
  ParamSpec limit;
  limit.key = id() + ".exact_limit";
  limit.kind = ParamKind::Integer;
  limit.defaultValue = std::to_string(wassersteinDefaultExactLimit(p_));
  limit.min = 0;
  limit.max = 2000000000;
  limit.unit = "points";
  limit.help = "largest cloud (points of positive weight) solved exactly; larger clouds get a certified "
               "bracket [low, high] (0: always bracket; a huge value: always exact)";
  ParamSpec reps;
  reps.key = id() + ".representatives";
  reps.kind = ParamKind::Integer;
  reps.defaultValue = std::to_string(wassersteinDefaultRepresentatives(p_));
  reps.min = 1;
  reps.max = 2000000000;
  reps.unit = "points";
  reps.help = "bracket mode: each cloud is quantised to this many representatives, solved exactly between them";
  return {limit, reps};
}

std::string WassersteinMeasure::displayName() const {
  return p_ == 1 ? "Wasserstein-1 (exact)" : "Wasserstein-2 (exact)";
}

std::string WassersteinMeasure::formula() const {
  return p_ == 1 ? "min over couplings pi of sum pi_ij |x_i - y_j|"
                 : "sqrt(min over couplings pi of sum pi_ij |x_i - y_j|^2)";
}

Result WassersteinMeasure::evaluate(const Cloud& a, const Cloud& b, const EvalContext& ctx) const {
  // All coordinates tiny or huge: solve at unit scale (measures/unit_scale.h), W_p being
  // homogeneous of degree 1. The duality gap is in cost units (length^p).
  if (auto r = evaluateAtUnitScale(*this, a, b, ctx,
                                    {{"duality_gap", p_}, {"quantisation_a", 1}, {"quantisation_b", 1},
                                     {"quantised_value", 1}, {"value_accuracy", 1}, {"width", 1}}))
    return *r;
  if (std::max(positiveCount(a), positiveCount(b)) > ctx.params.integer(id() + ".exact_limit"))
    return bracket(a, b, ctx);
  ExactOtResult s = solveExactOt(a, b, exactOtOptionsFor(p_), ctx.control, ctx.warm);
  Result r;
  switch (s.status) {
    case ExactOtStatus::InvalidInput: return Result::invalid(s.message);
    case ExactOtStatus::Cancelled: return Result::cancelled(s.message);
    case ExactOtStatus::IterationLimit:
      r.status = Status::NotConverged;
      r.value = s.value;
      r.message = s.message + "; the value is the cost of a feasible plan (an upper bound)";
      break;
    case ExactOtStatus::Optimal: r = Result::ok(s.value); break;
  }
  // The solver's own certificate decides whether "optimal" is believed: the plan's marginals
  // and the duality gap must be at rounding level. Anything else (e.g. weights or costs that
  // overflowed) is a failed value, never an ok one.
  if (s.status == ExactOtStatus::Optimal) {
    if (std::string why = certificateProblem(s, a, b); !why.empty()) {
      r.status = Status::NotConverged;
      r.value = NAN;
      r.message = std::move(why);
    }
  }
  r.iterations = int(std::min<long long>(s.pivots, INT_MAX));
  r.u = std::move(s.u);
  r.v = std::move(s.v);
  if (ctx.wantPlan) r.plan = std::move(s.plan);
  r.details = {{"solver", "network-simplex"},
               {"cost", GroundCost(p_).label()},
               {"pivots", s.pivots},
               {"pricing_rounds", s.rounds},
               {"warm_start", s.warmStarted},
               {"marginal_error", s.marginalError},
               {"duality_gap", s.dualGap}};
  if (s.planUnique) r.details["plan_unique"] = *s.planUnique;
  return r;
}

Result WassersteinMeasure::bracket(const Cloud& a, const Cloud& b, const EvalContext& ctx) const {
  const Eigen::Index k = ctx.params.integer(id() + ".representatives");
  WassersteinBracket w = bracketWasserstein(a, b, p_, k, ctx.control, ctx.warm);
  ExactOtResult& s = w.quantised;
  if (w.cancelled) return Result::cancelled(s.message.empty() ? "cancelled" : s.message);
  if (s.status == ExactOtStatus::InvalidInput) return Result::invalid(s.message);
  const std::string prefix = "bracket: the exact solve between the representatives ";
  if (s.status == ExactOtStatus::IterationLimit) {
    Result r;
    r.status = Status::NotConverged;
    r.message = prefix + "hit its pivot limit (" + s.message + "); no certified bounds";
    return r;
  }
  if (std::string why = certificateProblem(s, w.representativesOfA, w.representativesOfB); !why.empty()) {
    Result r;
    r.status = Status::NotConverged;
    r.message = prefix + "is not certified: " + why;
    return r;
  }
  if (w.errorA == 0.0 && w.errorB == 0.0) {
    // Every cell is one position (repeated points): QA = A and QB = B as measures, so the
    // solve between the representatives is the exact answer, not a bracket [D].
    Result r = Result::ok(s.value);
    r.iterations = int(std::min<long long>(s.pivots, INT_MAX));
    r.details = {{"solver", "network-simplex"},
                 {"cost", GroundCost(p_).label()},
                 {"merged_positions", "the clouds have at most " + std::to_string(k) +
                                          " distinct positions each: repeated points merged, solved exactly"},
                 {"representatives_a", w.representativesOfA.size()},
                 {"representatives_b", w.representativesOfB.size()},
                 {"pivots", s.pivots},
                 {"marginal_error", s.marginalError},
                 {"duality_gap", s.dualGap}};
    return r;
  }
  Result r = Result::bracketed(w.low, w.high);
  r.iterations = int(std::min<long long>(s.pivots, INT_MAX));
  const std::string won = w.lowRule;
  const std::string lowRule = won == "triangle" ? "W_q - e_a - e_b (triangle inequality)"
                              : won == "dual"   ? "Kantorovich dual: c-transforms of the quantised potentials "
                                                  "evaluated at every point"
                              : won == "means"  ? "|mean A - mean B| (Jensen)"
                                                : "W2 of the fitted Gaussians (Gelbrich 1990)";
  r.details = {{"solver", "network-simplex"},
               {"cost", GroundCost(p_).label()},
               {"rule", "quantise each cloud (greedy k-d cells, representative at the cell mean), solve W_q between the "
                        "representatives exactly, widen by the quantisation bounds e_a, e_b"},
               {"value_is", "midpoint of [low, high]"},
               {"low_rule", lowRule},
               {"high_rule", p_ == 1 ? "cost of the coupling glued through the cells, per cell pair at most "
                                       "min(d + mean distances, sqrt(d^2 + mean squares)) (<= W_q + e_a + e_b)"
                                     : "sqrt(W_q^2 + e_a^2 + e_b^2) (coupling glued through the cells)"},
               {"width", w.high - w.low},
               {"low_candidates", {{"triangle", w.triangleLow}, {"means", w.meanLow}, {"gaussian", w.gaussianLow},
                                   {"dual", w.dualLow}}},
               {"value_accuracy", 0.5 * (w.high - w.low)},
               {"quantised_value", s.value},
               {"quantisation_a", w.errorA},
               {"quantisation_b", w.errorB},
               {"representatives_a", w.representativesOfA.size()},
               {"representatives_b", w.representativesOfB.size()},
               {"exact_limit", ctx.params.integer(id() + ".exact_limit")},
               {"pivots", s.pivots},
               {"quantise_seconds", w.quantiseSeconds},
               {"solve_seconds", w.solveSeconds},
               {"bounds_seconds", w.boundSeconds}};
  return r;
}

std::optional<Eigen::MatrixX2d> WassersteinMeasure::gradientA(const Cloud& a, const Cloud& b, const EvalContext&,
                                                              const Result& r) const {
  if (!r.usable() || r.plan.empty()) return std::nullopt;
  if (p_ == 2 && !(r.value > 0)) return std::nullopt;
  Eigen::MatrixX2d g = Eigen::MatrixX2d::Zero(a.size(), 2);
  for (const auto& e : r.plan) {
    if (e.i < 0 || e.i >= a.size() || e.j < 0 || e.j >= b.size()) return std::nullopt;
    const Eigen::RowVector2d d = a.points.row(e.i) - b.points.row(e.j);
    if (p_ == 2) {
      g.row(e.i) += e.mass * d;
    } else if (const double len = d.norm(); len > 0) {
      g.row(e.i) += e.mass / len * d;
    }
  }
  if (p_ == 2) g /= r.value;
  return g;
}

}  // namespace barrow
