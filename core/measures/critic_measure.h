// critic_clip, critic_gp, critic_sn: the estimate E_A f − E_B f of a Lipschitz critic trained
// on the two clouds (core/critic/), the loss value a critic-based training would see.
// Slow (a training run per evaluation) and not in the default set. Details carry the
// certified lower bound on W1 (estimate / L_upper) and L_upper itself.
// Warm starts (EvalContext::warm, a CriticWarmState) carry the weights, optimiser moments
// and power-iteration vectors to the next call when every setting but the step count is
// the same (the network's shape does not depend on the clouds' sizes).
#pragma once

#include "critic/critic_settings.h"
#include "measures/measure.h"

namespace barrow {

class CriticMeasure : public Measure {
 public:
  explicit CriticMeasure(critic::Method m) : method_(m) {}

  std::string id() const override;
  std::string displayName() const override;
  std::string formula() const override;
  std::vector<ParamSpec> params() const override { return critic::criticParamSpecs(); }
  bool cheap() const override { return false; }
  bool inDefaultSet() const override { return false; }

  Result evaluate(const Cloud& a, const Cloud& b, const EvalContext& ctx) const override;

 private:
  critic::Method method_;
};

}  // namespace barrow
