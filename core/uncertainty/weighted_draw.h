// Drawing samples from a weighted cloud's empirical distribution, and re-splitting a pooled
// pair of clouds: the random part of resampling intervals, the permutation test and the
// value-versus-sample-size ladder.
#pragma once

#include <vector>

#include "cloud/cloud.h"
#include "uncertainty/replicate_rng.h"

namespace barrow {

/// Cumulative normalised weights of a cloud (last entry exactly 1), for inverse-CDF draws.
class WeightedSampler {
 public:
  explicit WeightedSampler(const Cloud& c);
  /// An index drawn with probability proportional to its weight (zero-weight rows never).
  int draw(ReplicateRng& rng) const;
  /// The index whose cumulative interval holds u in [0, 1).
  int at(double u) const;

 private:
  std::vector<double> cumulative_;
};

/// k points drawn with replacement from `c`'s normalised weights; the sample carries uniform
/// weights (each draw is one point of mass 1/k), as the bootstrap of the weighted empirical
/// measure prescribes [CP] (Efron & Tibshirani 1993, ch. 6).
Cloud drawSample(const Cloud& c, const WeightedSampler& sampler, int k, ReplicateRng& rng);

/// The rows drawSample picks, in draw order (the same random sequence).
std::vector<int> drawRows(const WeightedSampler& sampler, int k, ReplicateRng& rng);
/// One point per draw, uniform weights: what drawSample returns for these rows.
Cloud sampleOfRows(const Cloud& c, const std::vector<int>& rows);
/// The same empirical measure with each drawn row once, weighted by how often it was drawn
/// (rows in increasing order). A bootstrap draw of n from n repeats about 37 % of its points
/// (1 − 1/e), so exact transport on it solves a problem about 0.63 n on a side.
Cloud mergedSampleOfRows(const Cloud& c, const std::vector<int>& rows);

/// A and B pooled, each point keeping its weight normalised within its own cloud, then split
/// at random into clouds of A's and B's sizes (a uniformly random permutation of the pooled
/// rows, Fisher–Yates; Knuth TAOCP vol. 2, Algorithm 3.4.2P).
struct PooledPair {
  Eigen::MatrixX2d points;
  Eigen::VectorXd weights;
  Eigen::Index sizeA = 0;

  PooledPair(const Cloud& a, const Cloud& b);
  /// One random re-split into (A', B') of the original sizes.
  void split(ReplicateRng& rng, Cloud* a, Cloud* b) const;
};

}  // namespace barrow
