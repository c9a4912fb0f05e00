#include "critic/weighted_sampler.h"

#include <algorithm>

namespace barrow::critic {

WeightedSampler::WeightedSampler(const Eigen::VectorXd& weights) {
  cumulative_.resize(weights.size());
  double total = 0.0;
  for (Eigen::Index i = 0; i < weights.size(); ++i) cumulative_[i] = total += weights[i];
  for (double& c : cumulative_) c /= total;
}

Eigen::Index WeightedSampler::draw(RandomStream& rng) const {
  const double u = rng.uniform();
  const auto it = std::upper_bound(cumulative_.begin(), cumulative_.end(), u);
  // Points of zero weight share their cumulative value with the one before: never chosen.
  const Eigen::Index i = Eigen::Index(it - cumulative_.begin());
  return std::min<Eigen::Index>(i, Eigen::Index(cumulative_.size()) - 1);
}

}  // namespace barrow::critic
