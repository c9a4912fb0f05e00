#include "critic/spectral_norm.h"

#include <Eigen/SVD>

#include "critic/random_stream.h"

namespace barrow::critic {

bool SpectralState::fits(const MlpParams& p) const {
  if (int(u.size()) != p.layers()) return false;
  for (int l = 0; l < p.layers(); ++l)
    if (u[l].size() != p.w[l].rows()) return false;
  return true;
}

SpectralState initSpectral(const MlpParams& p, std::uint64_t seed) {
  RandomStream rng(seed);
  SpectralState s;
  for (int l = 0; l < p.layers(); ++l) {
    Eigen::VectorXd u(p.w[l].rows());
    for (Eigen::Index i = 0; i < u.size(); ++i) u[i] = rng.normal();
    s.u.push_back(u.normalized());
  }
  s.v.resize(p.layers());
  s.sigma.assign(p.layers(), 1.0);
  return s;
}

MlpParams spectralNormalize(const MlpParams& raw, SpectralState& s, int iterations) {
  MlpParams out = raw;
  s.v.resize(raw.layers());
  s.sigma.resize(raw.layers());
  for (int l = 0; l < raw.layers(); ++l) {
    const Eigen::MatrixXd& w = raw.w[l];
    Eigen::VectorXd v;
    for (int it = 0; it < std::max(iterations, 1); ++it) {
      v = (w.transpose() * s.u[l]).normalized();
      s.u[l] = (w * v).normalized();
    }
    s.v[l] = v;
    s.sigma[l] = s.u[l].dot(w * v);
    out.w[l] = w / s.sigma[l];
  }
  return out;
}

MlpParams spectralBackward(const MlpParams& normalized, const SpectralState& s, const MlpParams& gradNormalized) {
  MlpParams g = gradNormalized;
  for (int l = 0; l < normalized.layers(); ++l) {
    const double inner = (gradNormalized.w[l].array() * normalized.w[l].array()).sum();
    g.w[l] = (gradNormalized.w[l] - inner * s.u[l] * s.v[l].transpose()) / s.sigma[l];
  }
  return g;
}

double spectralNorm(const Eigen::MatrixXd& w) {
  if (w.size() == 0) return 0.0;
  Eigen::JacobiSVD<Eigen::MatrixXd> svd(w);
  return svd.singularValues()(0);
}

}  // namespace barrow::critic
