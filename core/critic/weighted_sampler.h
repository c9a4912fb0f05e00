// Draws point indices with probability proportional to a cloud's weights (with replacement),
// by inverting the cumulative distribution: a minibatch from the weighted empirical measure.
#pragma once

#include <Eigen/Core>
#include <vector>

#include "critic/random_stream.h"

namespace barrow::critic {

class WeightedSampler {
 public:
  /// Pre: weights non-negative with a positive sum.
  explicit WeightedSampler(const Eigen::VectorXd& weights);
  Eigen::Index draw(RandomStream& rng) const;

 private:
  std::vector<double> cumulative_;
};

}  // namespace barrow::critic
