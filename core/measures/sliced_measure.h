// `sliced`: sliced Wasserstein distance over K deterministic directions
// θ_k = (cos φ_k, sin φ_k), φ_k = (k + ½)π/K (the midpoint rule on [0, π), which integrates
// trigonometric polynomials of degree < 2K exactly):
//   p = 2 (default): SW2 = sqrt( (1/K) Σ_k W2²(⟨A, θ_k⟩, ⟨B, θ_k⟩) )
//   p = 1:           SW1 = (1/K) Σ_k W1(⟨A, θ_k⟩, ⟨B, θ_k⟩)
// (Rabin, Peyré, Delon, Bernot 2011, SSVM; Bonneel, Rabin, Peyré, Pfister 2015, JMIV 51:22–45).
// Each 1-D problem is solved exactly by the quantile coupling (transport/ot_1d.h), so one
// evaluation costs O(K (n + m) log(n + m)). Units: length.
#pragma once

#include "measures/measure.h"
#include "measures/units.h"

namespace barrow {

class SlicedMeasure : public Measure {
 public:
  std::string id() const override { return "sliced"; }
  std::string displayName() const override { return "Sliced Wasserstein"; }
  std::string formula() const override {
    return "SW_p = (mean over K directions of W_p^p of the projections)^(1/p), angles (k+1/2)pi/K";
  }
  std::vector<ParamSpec> params() const override;
  std::string unit(const ParamSet&) const override { return kUnitLength; }
  std::string unitRule() const override {
    return "length for p = 1 and 2: the p-th root of a mean of 1-D W_p^p, each in length^p";
  }

  Result evaluate(const Cloud& a, const Cloud& b, const EvalContext& ctx) const override;
  /// From the 1-D monotone couplings (envelope theorem per direction): for p = 2,
  /// (1/(K·SW2)) Σ_k Σ_j π^k_ij ⟨x_i − y_j, θ_k⟩ θ_k; for p = 1, (1/K) Σ_k Σ_j π^k_ij
  /// sign⟨x_i − y_j, θ_k⟩ θ_k. Where a 1-D coupling is not unique (tied projections) this
  /// is the gradient along one of the optimal couplings, a one-sided value. Zero when SW2 = 0.
  std::optional<Eigen::MatrixX2d> gradientA(const Cloud& a, const Cloud& b, const EvalContext& ctx,
                                            const Result& r) const override;
};

}  // namespace barrow
