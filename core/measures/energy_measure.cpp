#include "measures/energy_measure.h"

#include <cmath>

#include "kernel/discrepancy.h"
#include "measures/measure_outcome.h"
#include "measures/unit_scale.h"

namespace barrow {

Result EnergyMeasure::evaluate(const Cloud& a, const Cloud& b, const EvalContext& ctx) const {
  // All coordinates tiny or huge: evaluate at unit scale (measures/unit_scale.h); the energy
  // distance is homogeneous of degree ½, its square ("energy", a mean of distances) of degree 1.
  if (auto r = evaluateAtUnitScale(*this, a, b, ctx, {{"energy", 1}, {"energy_error_bound", 1}})) {
    // The value's accuracy has the value's degree, 1/2, which the list above cannot express.
    if (r->details.contains("value_accuracy") && r->details.contains("coordinate_unit"))
      r->details["value_accuracy"] = r->details["value_accuracy"].get<double>() *
                                     std::sqrt(r->details["coordinate_unit"].get<double>());
    return *r;
  }
  const SupportPoints sa = supportOf(a), sb = supportOf(b);
  const DiscrepancySums s = discrepancySums(sa, sb, {PairKernel::Distance, 0.0}, WorkSlice{ctx.control});
  if (!s.complete) return Result::cancelled(id() + ": cancelled");
  const double e = 2.0 * s.ab - s.aaOffDiagonal - s.bbOffDiagonal;  // the diagonal terms are 0
  Result r = Result::ok(std::sqrt(std::max(e, 0.0)));
  r.details["energy"] = e;
  r.details["statistic"] = "V (all pairs, diagonal included)";
  r.details["points_used"] = {{"a", sa.size()}, {"b", sb.size()}};
  r.details["gradient_at_coincident_points"] = "0";
  r.details["kernel_sums"] = s.method;
  if (s.binned) {  // kernel/binned_pair_sum.h: the bound on each sum, through E and the sqrt
    const double bound = s.boundAA + s.boundBB + 2.0 * s.boundAB;
    r.details["energy_error_bound"] = bound;
    r.details["value_accuracy"] = sqrtAccuracy(e, bound);
  }
  return finiteOrInvalid(std::move(r), id());
}

std::optional<Eigen::MatrixX2d> EnergyMeasure::gradientA(const Cloud& a, const Cloud& b, const EvalContext& ctx,
                                                         const Result& r) const {
  if (r.status != Status::Ok || !(r.value > 0)) return std::nullopt;
  const SupportPoints sa = supportOf(a), sb = supportOf(b);
  bool complete = true;
  // E = -(K_aa + K_bb - 2 K_ab) for k = |x - y|, hence the minus sign.
  const Eigen::MatrixX2d gk =
      discrepancyGradient(sa, sb, {PairKernel::Distance, 0.0}, 1.0, WorkSlice{ctx.control}, &complete);
  if (!complete) return std::nullopt;
  return toCloudRows(sa, a.size(), -gk / (2.0 * r.value));
}

}  // namespace barrow
