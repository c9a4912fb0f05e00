// The exact Wasserstein measures w1 and w2 (DEVELOPERS.md, Measure conventions): W_p between the normalised clouds,
// ground cost ‖x − y‖^p, p ∈ {1, 2}; w2 reports sqrt of the optimal cost. Solved by the
// network simplex of transport/exact_ot.h (exact, certified by pricing every pair).
// Result: value, u/v (potentials of the cost ‖x − y‖^p, u_i + v_j <= c_ij), the plan
// when asked (EvalContext::wantPlan), pivots as iterations, and details naming the solver.
// Warm starts through EvalContext::warm (an ExactWarmState).
// Large clouds (more points of positive weight on the larger side than `<id>.exact_limit`):
// a certified bracket instead (status bracketed, Result::low/high, value the midpoint),
// by quantising both clouds to `<id>.representatives` points (measures/wasserstein_bracket.h).
// The decision is a size threshold, not a time estimate: the defaults are set from the
// measured solve times in tests/bench/RESULTS-large-wp.md so that either path answers within
// about a minute on two cores at 10^5 + 10^5.
#pragma once

#include "measures/measure.h"
#include "measures/units.h"

namespace barrow {

/// Defaults of `<id>.exact_limit` and `<id>.representatives` for p = 1 or 2. Measured
/// (tests/bench/RESULTS-large-wp.md, 2 shared cores): exact W1 takes ~15 s at 2·10^4 points per
/// side and ~36 s at 3·10^4, exact W2 ~5 s at 2·10^4 and ~20 s at 5·10^4; the bracket's solve
/// between 12 000 (W1) or 20 000 (W2) representatives takes 4–15 s.
constexpr int wassersteinDefaultExactLimit(int p) { return p == 1 ? 25000 : 50000; }
constexpr int wassersteinDefaultRepresentatives(int p) { return p == 1 ? 12000 : 20000; }

class WassersteinMeasure : public Measure {
 public:
  /// p = 1 (w1) or 2 (w2).
  explicit WassersteinMeasure(int p) : p_(p) {}

  std::string id() const override { return p_ == 1 ? "w1" : "w2"; }
  std::string displayName() const override;
  std::string formula() const override;
  std::string unit(const ParamSet&) const override { return kUnitLength; }
  std::string unitRule() const override {
    return "length: (min sum pi_ij |x_i-y_j|^p)^(1/p) is the p-th root of a cost in length^p";
  }
  /// Exact but warm-started: re-solving after a point moves takes milliseconds for clouds of
  /// a few thousand points.
  bool cheap() const override { return true; }
  // Optimal transport is defined between measures: merging repeated points changes nothing.
  bool repeatsMayMerge() const override { return true; }

  /// `<id>.exact_limit` and `<id>.representatives` (see the top of this file).
  std::vector<ParamSpec> params() const override;

  Result evaluate(const Cloud& a, const Cloud& b, const EvalContext& ctx) const override;

  /// Envelope theorem through the optimal plan π (Villani 2009, Thm 10.28 (mem)):
  /// W1: ∂/∂x_i = Σ_j π_ij (x_i − y_j)/‖x_i − y_j‖ (0 where x_i = y_j);
  /// W2: ∂/∂x_i = (1/W2) Σ_j π_ij (x_i − y_j). One-sided when the plan is not unique
  /// (details "plan_unique": false). nullopt without a plan, or for w2 at W2 = 0 (a kink).
  bool gradientNeedsPlan() const override { return true; }  // the envelope theorem sums over the plan
  std::optional<Eigen::MatrixX2d> gradientA(const Cloud& a, const Cloud& b, const EvalContext& ctx,
                                            const Result& r) const override;

 private:
  Result bracket(const Cloud& a, const Cloud& b, const EvalContext& ctx) const;
  int p_;
};

}  // namespace barrow
