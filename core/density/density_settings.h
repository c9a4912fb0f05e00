// The density.* parameter group shared by kl_ab, kl_ba, js, tv and hellinger (DEVELOPERS.md, Measure conventions):
// density.estimator (hist|kde|knn), density.bin, density.origin, density.bandwidth, density.k.
#pragma once

#include <Eigen/Core>
#include <optional>

#include "base/params.h"
#include "cloud/cloud.h"
#include "density/kde_bandwidth.h"

namespace barrow {

namespace density_key {
inline constexpr const char* kEstimator = "density.estimator";
inline constexpr const char* kBin = "density.bin";
inline constexpr const char* kOrigin = "density.origin";
inline constexpr const char* kBandwidth = "density.bandwidth";
inline constexpr const char* kK = "density.k";
}  // namespace density_key

enum class DensityEstimator { Histogram, Kde, Knn };

/// The group parsed from a resolved, valid ParamSet. A rule word leaves its number empty.
struct DensitySettings {
  DensityEstimator estimator = DensityEstimator::Histogram;
  std::optional<double> bin;                 // empty: "auto" (autoBinWidth)
  std::optional<Eigen::Vector2d> origin;     // empty: "auto" (autoOrigin)
  std::optional<Eigen::Vector2d> bandwidth;  // empty: `rule`
  BandwidthRule rule = BandwidthRule::Scott;
  int k = 5;
};

/// Pre: `p` resolved against the density specs and valid (throws std::invalid_argument otherwise).
DensitySettings readDensitySettings(const ParamSet& p);

/// `resolved` with every rule word replaced by the number it gives on (a, b): "auto" bin and
/// origin, "scott"/"silverman" bandwidth. Numbers are written to round-trip exactly.
ParamSet freezeDensitySettings(const Cloud& a, const Cloud& b, const ParamSet& resolved);

}  // namespace barrow
