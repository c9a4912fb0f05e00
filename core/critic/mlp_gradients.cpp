#include "critic/mlp_gradients.h"

#include <cmath>

namespace barrow::critic {

MlpParams linearGradient(const MlpParams& p, Activation act, const ForwardCache& cache, const Eigen::RowVectorXd& c) {
  MlpParams g = p.zerosLike();
  Eigen::MatrixXd delta = c;  // ∂/∂z_{L−1}
  for (int l = p.layers() - 1; l >= 0; --l) {
    g.w[l].noalias() = delta * cache.h[l].transpose();
    g.b[l] = delta.rowwise().sum();
    if (l > 0) {
      Eigen::MatrixXd back = p.w[l].transpose() * delta;
      delta = back.cwiseProduct(activateSlope(act, cache.z[l - 1]));
    }
  }
  return g;
}

namespace {

// The backward pass that yields ∇ₓf, keeping r_l (∂f/∂z_l), s_l (∂f/∂h_{l+1}) and σ'(z_l).
struct InputPass {
  std::vector<Eigen::MatrixXd> r, s, slope;  // index l = 0..L−2
  Eigen::MatrixXd g;                          // 2 × n
};

InputPass inputPass(const MlpParams& p, Activation act, const ForwardCache& cache) {
  const int L = p.layers();
  const Eigen::Index n = cache.h[0].cols();
  InputPass ip;
  ip.r.resize(std::max(L - 1, 0));
  ip.s.resize(ip.r.size());
  ip.slope.resize(ip.r.size());
  Eigen::MatrixXd rNext = Eigen::MatrixXd::Ones(1, n);  // r_{L−1}
  for (int l = L - 2; l >= 0; --l) {
    ip.s[l].noalias() = p.w[l + 1].transpose() * rNext;
    ip.slope[l] = activateSlope(act, cache.z[l]);
    ip.r[l] = ip.s[l].cwiseProduct(ip.slope[l]);
    rNext = ip.r[l];
  }
  ip.g.noalias() = p.w[0].transpose() * rNext;
  return ip;
}

}  // namespace

Eigen::MatrixXd inputGradients(const MlpParams& p, Activation act, const ForwardCache& cache) {
  return inputPass(p, act, cache).g;
}

double penaltyGradient(const MlpParams& p, Activation act, const ForwardCache& cache, double lambda, double weight,
                       MlpParams* grad) {
  const int L = p.layers();
  const Eigen::Index n = cache.h[0].cols();
  const InputPass ip = inputPass(p, act, cache);

  // ḡ = ∂P/∂g_k = 2 λ w (‖g_k‖ − 1) g_k / ‖g_k‖ (0 where g_k = 0, a null set).
  Eigen::MatrixXd gBar(2, n);
  double penalty = 0.0;
  for (Eigen::Index k = 0; k < n; ++k) {
    const double norm = ip.g.col(k).norm();
    penalty += lambda * weight * (norm - 1.0) * (norm - 1.0);
    gBar.col(k) = norm > 0 ? Eigen::Vector2d(2.0 * lambda * weight * (norm - 1.0) / norm * ip.g.col(k))
                           : Eigen::Vector2d::Zero();
  }

  // Reverse of the input pass: g = W_0ᵀ r_0, r_l = s_l ⊙ σ'(z_l), s_l = W_{l+1}ᵀ r_{l+1}.
  const Eigen::MatrixXd& r0 = L > 1 ? ip.r[0] : Eigen::MatrixXd::Ones(1, n).eval();
  grad->w[0].noalias() += r0 * gBar.transpose();
  if (L == 1) return penalty;
  Eigen::MatrixXd rBar = p.w[0] * gBar;  // ∂P/∂r_0
  const bool curved = act == Activation::Tanh;
  std::vector<Eigen::MatrixXd> zBar(L - 1);  // ∂P/∂z_l through σ'(z_l)
  for (int l = 0; l <= L - 2; ++l) {
    const Eigen::MatrixXd sBar = rBar.cwiseProduct(ip.slope[l]);
    if (curved) zBar[l] = rBar.cwiseProduct(ip.s[l]).cwiseProduct(activateCurvature(act, cache.z[l]));
    const Eigen::MatrixXd& rNext = l + 1 <= L - 2 ? ip.r[l + 1] : Eigen::MatrixXd::Ones(1, n).eval();
    grad->w[l + 1].noalias() += rNext * sBar.transpose();
    if (l + 1 <= L - 2) rBar = p.w[l + 1] * sBar;
  }
  if (!curved) return penalty;

  // σ''-route: z̄_l enters the forward graph z_l = W_l h_l + b_l, h_l = σ(z_{l−1}).
  Eigen::MatrixXd delta;
  for (int l = L - 2; l >= 0; --l) {
    if (l == L - 2) delta = zBar[l];
    else delta = zBar[l] + (p.w[l + 1].transpose() * delta).cwiseProduct(ip.slope[l]);
    grad->w[l].noalias() += delta * cache.h[l].transpose();
    grad->b[l] += delta.rowwise().sum();
  }
  return penalty;
}

}  // namespace barrow::critic
