// The two optimisers of the published critic algorithms, on MlpParams (minimising).
// RMSProp (Tieleman & Hinton 2012, lecture slides 6e (mem)), in the usual form:
//   v ← ρ v + (1 − ρ) g²,  θ ← θ − α g / (√v + ε).
// Adam (Kingma & Ba 2015, Alg. 1) [P]:
//   m ← β1 m + (1 − β1) g,  v ← β2 v + (1 − β2) g²,  θ ← θ − α m̂ / (√v̂ + ε),
//   m̂ = m / (1 − β1^t), v̂ = v / (1 − β2^t).
#pragma once

#include "critic/mlp.h"

namespace barrow::critic {

struct OptimizerSettings {
  bool adam = true;      // false: RMSProp
  double rate = 1e-4;    // α
  double beta1 = 0.0;    // Adam
  double beta2 = 0.9;    // Adam
  double decay = 0.99;   // RMSProp ρ
  double epsilon = 1e-8;
};

/// Moments kept between steps (sized on the first step).
struct OptimizerState {
  MlpParams m, v;
  long long t = 0;
  bool fits(const MlpParams& p) const { return t > 0 && m.sameShape(p); }
};

/// One update of p with gradient g.
void optimizerStep(const OptimizerSettings& s, OptimizerState& state, MlpParams& p, const MlpParams& g);

}  // namespace barrow::critic
