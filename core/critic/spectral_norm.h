// Spectral normalisation (Miyato et al. 2018, Alg. 1) [P]: each layer's weight is used as
// W̄ = W / σ̃(W), σ̃ = ũᵀ W ṽ from power iteration with a persistent ũ (one iteration per
// training step in the paper). The gradient with respect to the raw W treats ũ, ṽ as
// constants (Miyato et al. 2018, eq. 12):
//   ∂L/∂W = (1/σ̃) (Ḡ − ⟨Ḡ, W̄⟩ ũ ṽᵀ),  Ḡ = ∂L/∂W̄.
// Biases are not normalised. The exact spectral norm (an SVD) is used for the certified
// Lipschitz bound, never σ̃.
#pragma once

#include <cstdint>

#include "critic/mlp.h"

namespace barrow::critic {

struct SpectralState {
  std::vector<Eigen::VectorXd> u;  // one left vector per layer (d_out)
  std::vector<Eigen::VectorXd> v;  // right vectors of the last iteration (d_in)
  std::vector<double> sigma;       // σ̃ of the last iteration
  bool fits(const MlpParams& p) const;
};

/// Random unit ũ for each layer (standard normal, normalised).
SpectralState initSpectral(const MlpParams& p, std::uint64_t seed);

/// Runs `iterations` power iterations per layer (updating ũ, ṽ, σ̃) and returns W̄.
MlpParams spectralNormalize(const MlpParams& raw, SpectralState& s, int iterations);

/// Chain rule from ∂L/∂W̄ to ∂L/∂W (biases pass through). `normalized` = W̄ of the same step.
MlpParams spectralBackward(const MlpParams& normalized, const SpectralState& s, const MlpParams& gradNormalized);

/// Largest singular value (exact, by SVD).
double spectralNorm(const Eigen::MatrixXd& w);

}  // namespace barrow::critic
