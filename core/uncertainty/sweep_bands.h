// Pointwise resampling bands for a finished sweep: at every θ of the sweep, the central `level`
// interval of the measure over B resamples (percentile interval, replicate_stats.h).
//
// Replicate r draws one set of uniforms for A and one resample of B; at each θ, A_θ's points are
// picked by those uniforms through A_θ's own weights (inverse CDF). For the families that move
// points (shift, rotate, scale, interpolate) the weights do not change with θ, so replicate r
// follows the same resampled points along the whole path and its curve is a sweep in its own
// right; warm starts then pass between neighbouring θ within the replicate, as in the sweep.
// For `mix` the same uniforms keep the draws as close as the changing weights allow.
// Settings are the series' frozen ones (frozen at the sweep's reference θ), never re-derived.
#pragma once

#include <cstdint>
#include <optional>
#include <string>

#include "cloud/cloud.h"
#include "base/run_control.h"
#include "sweep/sweep_result.h"
#include "uncertainty/uncertainty_limits.h"

namespace barrow {

struct SweepBandRequest {
  int resamples = 200;               // B, 1..kMaxResamples
  double level = 0.95;               // in (0, 1)
  std::uint64_t seed = kDefaultSeed;
  int threads = 0;                   // 0 = all cores; the bands do not depend on it
  bool warmStart = true;             // within one replicate's path only
};

std::optional<std::string> checkSweepBandRequest(const SweepBandRequest& req);

/// Fills every series' low/high (one per θ; NaN where no resample succeeded) and records the
/// band settings in `r`. Needs the registry measure of each series id. Returns the reason when
/// the bands could not be computed (r is then unchanged); cancelling leaves the bands empty.
std::optional<std::string> addSweepBands(const Cloud& a, const Cloud& b, SweepResult& r, const SweepBandRequest& req,
                                         const RunControl* control = nullptr);

}  // namespace barrow
