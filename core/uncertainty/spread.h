// Resampling intervals ("spread"): how much would each measure's value move on another pair
// of samples of the same sizes? B bootstrap resamples of both clouds (Efron 1979; Efron &
// Tibshirani 1993, ch. 6 and 13), each measure evaluated with its settings frozen on the
// original pair, summarised by an interval at a chosen level and the resample standard
// deviation.
//
// What it does not show: the estimator's bias. Resamples scatter around the sample value, not
// around the population value; exact W1 between samples sits above the population W1 by an
// amount that shrinks with n (see value_vs_size.h).
#pragma once

#include <cstdint>
#include <optional>
#include <string>
#include <vector>

#include "cloud/cloud.h"
#include "measures/measure.h"
#include "uncertainty/replicate_stats.h"
#include "uncertainty/uncertainty_limits.h"

namespace barrow {

struct SpreadRequest {
  std::vector<const Measure*> measures;
  ParamSet params;                                // user settings; frozen on (A, B)
  int resamples = 200;                            // B, 1..kMaxResamples
  double level = 0.95;                            // in (0, 1)
  IntervalKind interval = IntervalKind::Percentile;
  std::uint64_t seed = kDefaultSeed;
  int threads = 0;                                // 0 = all cores; never changes the output
};

struct SpreadRow {
  std::string id;
  Status status = Status::Cancelled;  // of the value on the original pair (or Cancelled)
  double value = NAN;                 // on the original pair
  double low = NAN, high = NAN;       // the interval; NaN when no resample succeeded
  double sd = NAN;                    // resample standard deviation; NaN if any was infinite
  int failed = 0;                     // resamples whose evaluation failed (left out)
  std::string message;                // first failure's reason
  std::vector<double> replicates;     // value per resample, in resample order (NaN = failed)
  ParamSet settings;                  // the frozen settings used throughout
};

struct SpreadResult {
  std::vector<SpreadRow> rows;        // in the order of the request's measures
  SpreadRequest request;              // as run (seed, B, level, interval)
  bool cancelled = false;
};

std::optional<std::string> checkSpreadRequest(const SpreadRequest& req);

/// Pre: checkSpreadRequest(req) passed and both clouds validate (rows of a failing measure say
/// why otherwise). Resample r draws from ReplicateRng(seed, r): A's sample, then B's.
SpreadResult runSpread(const Cloud& a, const Cloud& b, const SpreadRequest& req, const RunControl* control = nullptr);

}  // namespace barrow
