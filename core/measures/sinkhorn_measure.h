// `sinkhorn`: the debiased Sinkhorn divergence
//   S_ε(A, B) = OT_ε(a, b) − ½ OT_ε(a, a) − ½ OT_ε(b, b),
// OT_ε as in entropic_measure.h (convention (i)). S_ε ≥ 0 with equality iff A = B for the
// costs used here, S_ε → OT as ε → 0 and → ½ MMD² with kernel −C as ε → ∞ (Genevay, Peyré,
// Cuturi 2018, AISTATS; Feydy, Séjourné, Vialard, Amari, Trouvé, Peyré 2019, AISTATS, Thm 1).
// The self terms use the symmetric Sinkhorn update (Feydy et al. 2019, Sec. 3).
#pragma once

#include "measures/measure.h"
#include "measures/entropic_measure.h"

namespace barrow {

class SinkhornMeasure : public Measure {
 public:
  std::string id() const override { return "sinkhorn"; }
  std::string displayName() const override { return "Sinkhorn divergence"; }
  std::string formula() const override {
    return "S_eps = OT_eps(a,b) - OT_eps(a,a)/2 - OT_eps(b,b)/2, C = |x-y|^p";
  }
  std::vector<ParamSpec> params() const override;
  std::string unit(const ParamSet& resolved) const override { return entropicUnit("sinkhorn", resolved); }
  std::string unitRule() const override { return kEntropicUnitRule; }
  bool cheap() const override { return false; }

  /// Result::u, v are the debiased potentials f_ab − f_aa and g_ab − g_bb (the first
  /// variation of S_ε with respect to the weights); the plan is that of OT_ε(a, b).
  Result evaluate(const Cloud& a, const Cloud& b, const EvalContext& ctx) const override;
  ParamSet freeze(const Cloud& a, const Cloud& b, const ParamSet& resolved) const override;
  /// Σ_j P^{ab}_ij ∇_x c(x_i, y_j) − Σ_k P^{aa}_ik ∇_1 c(x_i, x_k) (c symmetric).
  std::optional<Eigen::MatrixX2d> gradientA(const Cloud& a, const Cloud& b, const EvalContext& ctx,
                                            const Result& r) const override;
};

}  // namespace barrow
