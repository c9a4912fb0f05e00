// Hand-derived gradients of the critic network (see DEVELOPERS.md for why by hand).
//
// linearGradient: ∂/∂θ Σ_k c_k f(x_k) by ordinary back-propagation [D].
// inputGradients: ∇ₓf(x_k) for each column, the same backward pass with c = 1 stopped at x.
// penaltyGradient: the gradient penalty of Gulrajani et al. (2017, Alg. 1)
//   P = Σ_k w_k λ (‖∇ₓf(x_k)‖ − 1)²
// and its derivative with respect to every weight and bias. ∇ₓf = W_0ᵀ r_0 with
// r_{L−1} = 1, r_l = (W_{l+1}ᵀ r_{l+1}) ⊙ σ'(z_l); P depends on θ through the W's in that
// backward pass and through σ'(z_l), whose own derivative σ''(z_l) feeds back into the forward
// pass ("double back-propagation", Drucker & LeCun 1992) [D]. For ReLU σ'' = 0 almost
// everywhere, so only the first route remains; for tanh both do.
// Checked against central differences and against torch.autograd (tests/core/critic_gradients_test.cpp).
#pragma once

#include "critic/mlp.h"

namespace barrow::critic {

/// Gradient of Σ_k c_k f(x_k); `cache` is forward(p, act, x), c has one entry per column.
MlpParams linearGradient(const MlpParams& p, Activation act, const ForwardCache& cache, const Eigen::RowVectorXd& c);

/// ∇ₓf at each column of the cache's input (2 × n).
Eigen::MatrixXd inputGradients(const MlpParams& p, Activation act, const ForwardCache& cache);

/// Adds ∂P/∂θ to `grad` (same shape as p) and returns P, with w_k = weight for every k.
double penaltyGradient(const MlpParams& p, Activation act, const ForwardCache& cache, double lambda, double weight,
                       MlpParams* grad);

}  // namespace barrow::critic
