#include "density/density_settings.h"

#include <stdexcept>
#include <string>

#include "density/histogram_grid.h"
#include "density/pooled_stats.h"

namespace barrow {

namespace {

Eigen::Vector2d pairOf(const ParamSet& p, const char* key) {
  const auto [x, y] = p.pair(key);
  return {x, y};
}

}  // namespace

DensitySettings readDensitySettings(const ParamSet& p) {
  using namespace density_key;
  DensitySettings s;
  const std::string& est = p.text(kEstimator);
  if (est == "hist") s.estimator = DensityEstimator::Histogram;
  else if (est == "kde") s.estimator = DensityEstimator::Kde;
  else if (est == "knn") s.estimator = DensityEstimator::Knn;
  else throw std::invalid_argument("density.estimator: unknown estimator '" + est + "'");
  if (!p.isWord(kBin, "auto")) s.bin = p.real(kBin);
  if (!p.isWord(kOrigin, "auto")) s.origin = pairOf(p, kOrigin);
  if (p.isWord(kBandwidth, "scott")) s.rule = BandwidthRule::Scott;
  else if (p.isWord(kBandwidth, "silverman")) s.rule = BandwidthRule::Silverman;
  else s.bandwidth = pairOf(p, kBandwidth);
  s.k = p.integer(kK);
  return s;
}

ParamSet freezeDensitySettings(const Cloud& a, const Cloud& b, const ParamSet& resolved) {
  using namespace density_key;
  ParamSet out = resolved;
  const bool autoBin = resolved.isWord(kBin, "auto"), autoOriginWord = resolved.isWord(kOrigin, "auto");
  const bool ruleBand = resolved.isWord(kBandwidth, "scott") || resolved.isWord(kBandwidth, "silverman");
  if (!autoBin && !autoOriginWord && !ruleBand) return out;
  const PooledStats stats = pooledStats(a, b);
  const double bin = autoBin ? autoBinWidth(stats) : resolved.real(kBin);
  if (autoBin) out.setNumber(kBin, bin);
  if (autoOriginWord) {
    const Eigen::Vector2d o = autoOrigin(stats, bin);
    out.setPair(kOrigin, o.x(), o.y());
  }
  if (ruleBand) {
    const auto rule = resolved.isWord(kBandwidth, "scott") ? BandwidthRule::Scott : BandwidthRule::Silverman;
    const Eigen::Vector2d s = ruleBandwidth(stats, rule).s;
    out.setPair(kBandwidth, s.x(), s.y());
  }
  return out;
}

}  // namespace barrow
