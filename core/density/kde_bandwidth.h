// Data-dependent bandwidths for the product Gaussian KDE (d = 2, diagonal bandwidth).
//
//  scott:     s_k = sd_k · N^{-1/6}, per axis k (Scott 1992, Multivariate Density Estimation,
//             Sec. 6.3 (mem); scipy.stats.gaussian_kde's "scott" factor n^{-1/(d+4)}).
//  silverman: s_k = spread_k · N^{-1/6}, spread_k = min(sd_k, IQR_k/1.349) (IQR_k = 0: sd_k).
//             For d = 2 Silverman's normal-reference factor (4/((d+2)N))^{1/(d+4)} equals
//             Scott's N^{-1/6} (Silverman 1986, eq. 4.14 (mem)), so the difference is the
//             robust spread of Silverman 1986, Sec. 3.4.2 (mem), which resists outliers.
// sd, IQR and N are those of the pooled sample (pooled_stats.h), never of one cloud: a rule
// per cloud would smooth A and B differently and the divergence would measure that.
// Floor: a rule gives 0 on an axis where the pooled points are collinear (the segment
// x = const has sd_x = 0); each axis is raised to at least a tenth of the other axis's
// bandwidth, and to 1 when every point coincides. The note says when that happened.
#pragma once

#include <Eigen/Core>
#include <string>

#include "density/pooled_stats.h"

namespace barrow {

enum class BandwidthRule { Scott, Silverman };

struct Bandwidth {
  Eigen::Vector2d s = Eigen::Vector2d::Ones();  // (s_x, s_y), coordinate units, > 0
  std::string rule;  // the formula with its numbers, for the result's details
  std::string note;  // non-empty when the floor was applied
};

Bandwidth ruleBandwidth(const PooledStats& stats, BandwidthRule rule);

/// The fraction of the other axis's bandwidth below which an axis is floored.
constexpr double kBandwidthFloorRatio = 0.1;

}  // namespace barrow
