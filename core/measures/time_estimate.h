// A rough forecast of how long one measure takes on clouds of given sizes, so that a long run
// can say so before it starts (issue 13: "an estimate per measure when the whole would exceed a
// few seconds"). Each measure has a cost model of its algorithm's growth in the cloud sizes,
// scaled by a constant measured on the project's reference machine (2 cores, see
// tests/bench/RESULTS-estimates.md). It is an order of magnitude, not a promise: iterative
// solvers also depend on the data's geometry and ε.
#pragma once

#include <cstddef>
#include <optional>
#include <string>

namespace barrow {

struct TimeEstimate {
  double seconds = 0.0;
  std::string growth;  // the model, e.g. "n·m" or "(n·m)^1.09"
};

/// The forecast for measure `id` on clouds of na and nb points with `threads` worker threads
/// (0 = one per core); nullopt for an id without a model. The Sinkhorn divergence's forecast
/// includes its A–B entropic solve, which it takes from `entropic` when that ran first on the
/// same clouds (subtract entropic's forecast then).
std::optional<TimeEstimate> estimateTime(const std::string& id, std::size_t na, std::size_t nb, int threads);

/// "0.4 s", "12 s", "3 min", "2.1 h": a forecast's text (no more digits than it deserves).
std::string estimateText(double seconds);

}  // namespace barrow
