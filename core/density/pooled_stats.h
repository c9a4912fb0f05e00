// Statistics of the pooled sample that the data-dependent density settings are computed from
// (histogram bin and origin, KDE bandwidth rules).
#pragma once

#include <Eigen/Core>

#include "cloud/cloud.h"

namespace barrow {

/// The pooled sample is the equal mixture ½Â + ½B̂ of the two normalised clouds, so that a
/// cloud with more points does not dominate the rules. Points of zero weight are ignored.
struct PooledStats {
  Eigen::Vector2d min = Eigen::Vector2d::Zero();  // per axis, over points of positive weight
  Eigen::Vector2d max = Eigen::Vector2d::Zero();
  Eigen::Vector2d sd = Eigen::Vector2d::Zero();   // weighted sd per axis (population form, no n−1)
  Eigen::Vector2d iqr = Eigen::Vector2d::Zero();  // weighted interquartile range per axis
  /// Kish's effective sample size 1/Σw² of the pooled weights; n + m for equal-size uniform
  /// clouds, 4nm/(n+m) for unequal sizes.
  double effectiveSize = 0.0;
};

/// Pre: both clouds validated.
PooledStats pooledStats(const Cloud& a, const Cloud& b);

}  // namespace barrow
