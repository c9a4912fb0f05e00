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
  /// Weighted interquartile range per axis, Q(0.75) − Q(0.25) with the linear-interpolation
  /// quantile: sort the values, give the k-th the position m_k = C_k − w_k/2 (C_k the cumulative
  /// weight, so m_k is the centre of its share), rescale to p_k = (m_k − m_1)/(m_n − m_1) and
  /// interpolate Q(u) linearly between the values at the p_k around u. With equal weights
  /// p_k = (k−1)/(n−1): numpy.quantile's default ('linear', Hyndman & Fan 1996 type 7). Tied
  /// values are ordered by weight (lighter first), which fixes the positions when weights differ.
  Eigen::Vector2d iqr = Eigen::Vector2d::Zero();
  /// Kish's effective sample size 1/Σw² of the pooled weights; n + m for equal-size uniform
  /// clouds, 4nm/(n+m) for unequal sizes.
  double effectiveSize = 0.0;
};

/// Pre: both clouds validated.
PooledStats pooledStats(const Cloud& a, const Cloud& b);

}  // namespace barrow
