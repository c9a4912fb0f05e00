// Value versus sample size ("sizes"): for each size n_k of a ladder, R subsamples of n_k points
// from each cloud (drawn with replacement from the normalised weights, uniform weights), the
// mean and standard deviation of each measure, and the least-squares slope of log(mean)
// against log(n). It shows the sample-size bias of estimators such as exact W1 between samples
// (E W1 between two n-samples of the unit square shrinks like sqrt(log n / n); Ajtai, Komlós &
// Tusnády 1984) and the biased MMD² (expectation ∝ 1/n + 1/m under one distribution).
#pragma once

#include <cstdint>
#include <optional>
#include <string>
#include <vector>

#include "cloud/cloud.h"
#include "measures/measure.h"
#include "uncertainty/uncertainty_limits.h"

namespace barrow {

/// 8 sizes spaced geometrically from min(25, largest) to `largest`, rounded, duplicates dropped.
std::vector<int> defaultSizeLadder(int largest);

struct SizesRequest {
  std::vector<const Measure*> measures;
  ParamSet params;                   // user settings; frozen on the full (A, B)
  std::vector<int> sizes;            // empty = defaultSizeLadder(min(|A|, |B|)); each 1..min(|A|,|B|)
  int repeats = 20;                  // R, 1..kMaxRepeats
  std::uint64_t seed = kDefaultSeed;
  int threads = 0;
};

struct SizesRow {
  std::string id;
  Status status = Status::Cancelled;   // Ok when every size has at least one value
  std::vector<double> mean, sd;        // per size (NaN where every subsample failed)
  std::vector<std::vector<double>> values;  // [size][repeat] (NaN = failed)
  double slope = NAN;                  // d log(mean) / d log(n)
  int failed = 0;
  std::string message;
  ParamSet settings;
};

struct SizesResult {
  std::vector<int> sizes;
  std::vector<SizesRow> rows;
  SizesRequest request;
  bool cancelled = false;
};

/// `smallest` = min(|A|, |B|).
std::optional<std::string> checkSizesRequest(const SizesRequest& req, int smallest);

/// Subsample (size index s, repeat r) draws from ReplicateRng(seed, s · R + r): A's points, then B's.
SizesResult runValueVsSize(const Cloud& a, const Cloud& b, const SizesRequest& req, const RunControl* control = nullptr);

}  // namespace barrow
