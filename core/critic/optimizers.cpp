#include "critic/optimizers.h"

#include <cmath>

namespace barrow::critic {

namespace {

template <typename M>
void updateBlock(const OptimizerSettings& s, double c1, double c2, M& p, const M& g, M& m, M& v) {
  if (s.adam) {
    m = s.beta1 * m + (1.0 - s.beta1) * g;
    v = s.beta2 * v + (1.0 - s.beta2) * g.cwiseAbs2();
    p.array() -= s.rate * (m.array() / c1) / ((v.array() / c2).sqrt() + s.epsilon);
  } else {
    v = s.decay * v + (1.0 - s.decay) * g.cwiseAbs2();
    p.array() -= s.rate * g.array() / (v.array().sqrt() + s.epsilon);
  }
}

}  // namespace

void optimizerStep(const OptimizerSettings& s, OptimizerState& state, MlpParams& p, const MlpParams& g) {
  if (!state.fits(p)) {
    state.m = p.zerosLike();
    state.v = p.zerosLike();
    state.t = 0;
  }
  ++state.t;
  const double c1 = 1.0 - std::pow(s.beta1, double(state.t));
  const double c2 = 1.0 - std::pow(s.beta2, double(state.t));
  for (int l = 0; l < p.layers(); ++l) {
    updateBlock(s, c1, c2, p.w[l], g.w[l], state.m.w[l], state.v.w[l]);
    updateBlock(s, c1, c2, p.b[l], g.b[l], state.m.b[l], state.v.b[l]);
  }
}

}  // namespace barrow::critic
