// The permutation two-sample test with a measure as its statistic: could A and B come from
// one distribution? A and B are pooled (each point keeps its weight, normalised within its own
// cloud), re-split at random into the original sizes P times, and
//   p = (1 + #{T_perm >= T_obs}) / (1 + P)
// (Phipson & Smyth 2010, "Permutation p-values should never be zero", Stat. Appl. Genet. Mol.
// Biol. 9(1): the random-permutation p-value counting the observed split as one of the
// permutations, which keeps the test exact at every level). Under the null the p-values are
// uniform on {1, ..., P+1}/(P+1).
#pragma once

#include <cstdint>
#include <optional>
#include <string>
#include <vector>

#include "cloud/cloud.h"
#include "measures/measure.h"
#include "uncertainty/uncertainty_limits.h"

namespace barrow {

struct PermuteRequest {
  std::vector<const Measure*> measures;
  ParamSet params;                   // user settings; frozen on the original (A, B)
  int permutations = 999;            // P, 1..kMaxPermutations
  std::uint64_t seed = kDefaultSeed;
  int threads = 0;                   // 0 = all cores; never changes the output
};

struct PermuteRow {
  std::string id;
  Status status = Status::Cancelled;  // of the observed value (or Cancelled)
  double value = NAN;                 // T_obs, the measure on the original split
  double pValue = NAN;                // NaN when the observed value failed
  int exceed = 0;                     // #{T_perm >= T_obs}
  int failed = 0;                     // permutations whose evaluation failed (left out of P)
  std::string message;
  std::vector<double> permuted;       // T per permutation, in permutation order (NaN = failed)
  ParamSet settings;
};

struct PermuteResult {
  std::vector<PermuteRow> rows;
  PermuteRequest request;
  bool cancelled = false;
};

std::optional<std::string> checkPermuteRequest(const PermuteRequest& req);

/// Permutation p draws from ReplicateRng(seed, p) (one Fisher–Yates shuffle of the pooled rows).
PermuteResult runPermutationTest(const Cloud& a, const Cloud& b, const PermuteRequest& req,
                                 const RunControl* control = nullptr);

}  // namespace barrow
