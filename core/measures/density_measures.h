// The sample-based f-divergences kl_ab, kl_ba, js, tv, hellinger (DEVELOPERS.md, Measure conventions; KL and JS in nats), each
// estimated from the two clouds by a histogram, a Gaussian KDE or (KL only) k nearest
// neighbours. They share one parameter group, density.* (density/density_settings.h).
#pragma once

#include <vector>

#include "density/divergence_kind.h"
#include "measures/measure.h"
#include "measures/units.h"

namespace barrow {

/// The density.* specs: estimator, bin, origin, bandwidth, k, with defaults and ranges.
std::vector<ParamSpec> densityParamSpecs();

class DensityMeasure : public Measure {
 public:
  explicit DensityMeasure(DivergenceKind kind) : kind_(kind) {}

  std::string id() const override;
  std::string displayName() const override;
  std::string formula() const override;
  std::vector<ParamSpec> params() const override { return densityParamSpecs(); }
  /// nats (KL, JS), probability (TV), dimensionless (Hellinger), whatever the estimator.
  std::string unit(const ParamSet& resolved) const override;
  std::string unitRule() const override;
  Result evaluate(const Cloud& a, const Cloud& b, const EvalContext& ctx) const override;
  /// Freezes the "auto" bin and origin and the bandwidth rule at (a, b).
  ParamSet freeze(const Cloud& a, const Cloud& b, const ParamSet& resolved) const override;

 private:
  DivergenceKind kind_;
};

}  // namespace barrow
