// critic_clip, critic_gp, critic_sn: the estimate E_A f − E_B f of a Lipschitz critic trained
// on the two clouds (core/critic/), the loss value a critic-based training would see.
// Slow (a training run per evaluation) and not in the default set. Details carry the
// certified lower bound on W1 (estimate / L_upper) and L_upper itself.
// Warm starts (EvalContext::warm, a CriticWarmState) carry the weights, optimiser moments
// and power-iteration vectors to the next call when every setting but the step count is
// the same (the network's shape does not depend on the clouds' sizes). Unlike the exact
// solvers' warm starts this changes the value, not only the speed: a critic continued from the
// previous θ is a different training run (the one a generator's training loop would see), so a
// sweep's critic curve depends on the order of the θ grid and on how the sweep splits it over
// threads; a single evaluation is deterministic for a given seed.
#pragma once

#include "critic/critic_settings.h"
#include "measures/measure.h"
#include "measures/units.h"

namespace barrow {

class CriticMeasure : public Measure {
 public:
  explicit CriticMeasure(critic::Method m) : method_(m) {}

  std::string id() const override;
  std::string displayName() const override;
  std::string formula() const override;
  std::vector<ParamSpec> params() const override { return critic::criticParamSpecs(); }
  std::string unit(const ParamSet&) const override { return kUnitLength; }
  std::string unitRule() const override {
    return "length: E_A f - E_B f with f = s*g((x-c)/s) trained in the clouds' frame (c, s); ||grad f|| is a pure number";
  }
  bool cheap() const override { return false; }
  bool inDefaultSet() const override { return false; }

  Result evaluate(const Cloud& a, const Cloud& b, const EvalContext& ctx) const override;

 private:
  critic::Method method_;
};

}  // namespace barrow
