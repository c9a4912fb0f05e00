#include "measures/wasserstein_measure.h"

#include <algorithm>
#include <climits>
#include <cmath>
#include <string>

#include "transport/exact_cost.h"
#include "transport/exact_ot.h"
#include "measures/unit_scale.h"

namespace barrow {

namespace {
constexpr double kMarginalTolerance = 1e-9;  // max |row/column sum − weight|; masses sum to 1
constexpr double kGapTolerance = 1e-9;       // |cost − dual|, relative to the terms' size
}  // namespace

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
  if (auto r = evaluateAtUnitScale(*this, a, b, ctx, {{"duality_gap", p_}}))
    return *r;
  ExactOtOptions o;
  o.p = p_;
  ExactOtResult s = solveExactOt(a, b, o, ctx.control, ctx.warm);
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
    const Eigen::VectorXd wa = a.normalizedWeights(), wb = b.normalizedWeights();
    const double scale = std::abs(s.cost) + wa.dot(s.u.cwiseAbs()) + wb.dot(s.v.cwiseAbs());
    const bool certified = std::isfinite(s.value) && s.marginalError <= kMarginalTolerance &&
                           std::isfinite(scale) && std::abs(s.dualGap) <= kGapTolerance * std::max(scale, 1e-300);
    if (!certified) {
      r.status = Status::NotConverged;
      r.value = NAN;
      r.message = "the exact solver's certificate failed (marginal error " + std::to_string(s.marginalError) +
                  ", duality gap " + std::to_string(s.dualGap) +
                  "): the value cannot be trusted; coordinates or weights may be too extreme for double precision";
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
