// Fréchet distance: W2 between the Gaussians fitted to A and B,
//   FD^2 = |mu_A - mu_B|^2 + tr(S_A + S_B - 2 (S_B^{1/2} S_A S_B^{1/2})^{1/2}),  value = sqrt(max(FD^2, 0))
// in coordinate units (its square is the usual Fréchet score, FID-style). Means and
// covariances under the normalised weights with ddof = 0 (the empirical measure's own
// moments; np.cov's default ddof = 1 gives a different number, see REFERENCES.md).
// Dowson & Landau 1982, JMVA 12:450-455; Heusel et al. 2017 (FID). Singular covariances
// (one point, collinear points) are handled exactly (PSD roots, kernel/gaussian_fit.h) and
// reported with a warning in the message and details. Points of zero weight are left out.
#pragma once

#include "measures/measure.h"
#include "measures/units.h"

namespace barrow {

class FrechetMeasure : public Measure {
 public:
  std::string id() const override { return "frechet"; }
  std::string displayName() const override { return "Fréchet (Gaussian W2)"; }
  std::string formula() const override {
    return "sqrt(|mA-mB|^2 + tr(SA + SB - 2 (SB^1/2 SA SB^1/2)^1/2)), weighted moments, ddof = 0";
  }
  std::string unit(const ParamSet&) const override { return kUnitLength; }
  std::string unitRule() const override {
    return "length: the square root of |mA-mB|^2 + a trace of covariances, both in length^2";
  }
  Result evaluate(const Cloud& a, const Cloud& b, const EvalContext& ctx) const override;
  /// Closed form (both covariances nonsingular, value > 0):
  /// dFD^2/dx_i = 2 a_i [ (mu_A - mu_B) + (I - T)(x_i - mu_A) ], T the optimal linear map
  /// N(0,S_A) -> N(0,S_B) (the gradient of tr(...)^{1/2} in S_A is T/2); d value = dFD^2/(2 value).
  std::optional<Eigen::MatrixX2d> gradientA(const Cloud& a, const Cloud& b, const EvalContext& ctx,
                                            const Result& r) const override;
};

}  // namespace barrow
