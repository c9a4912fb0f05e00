// A weighted cloud reduced to k representatives: each point is sent to the weighted mean of
// its cell, each representative carries its cell's mass. Used by the certified W_p brackets
// (measures/wasserstein_bracket.h): the map x ↦ q(x) is a coupling of the cloud with its
// representatives, so W_p(cloud, representatives)^p ≤ Σ_i a_i |x_i − q(x_i)|^p [D].
//
// Cells: a greedy k-d partition [CP]. Starting from one cell holding every point of positive
// weight, the cell with the largest weighted sum of squared deviations is cut at its
// weighted mean across its axis of larger spread, until k cells exist or every cell's
// deviation is 0 (coincident points). Cutting the worst cell first spends the budget where
// the quantisation error is; the mean cut keeps both halves non-empty.
#pragma once

#include <Eigen/Core>
#include <vector>

#include "base/run_control.h"
#include "cloud/cloud.h"

namespace barrow {

struct Quantisation {
  Cloud representatives;         // cell means, weights = cell masses (normalised, sum 1)
  std::vector<Eigen::Index> cellOf;  // per input row: its representative, −1 for zero weight
  double cost1 = 0.0;            // Σ_i a_i |x_i − q(x_i)|   (a normalised)
  double cost2 = 0.0;            // Σ_i a_i |x_i − q(x_i)|²
  // Per representative, over its cell under the cell's own (conditional) weights:
  Eigen::VectorXd cellDistance;  // mean |x − m|
  Eigen::VectorXd cellSquare;    // mean |x − m|²
  bool cancelled = false;

  /// (Σ a_i |x_i − q(x_i)|^p)^(1/p) for p = 1 or 2: an upper bound on W_p(cloud, representatives).
  double errorBound(int p) const;
};

/// Pre: c.validate() passed, cells >= 1. At most `cells` representatives (fewer when the
/// cloud has fewer distinct positions). O(n log cells).
Quantisation quantiseCloud(const Cloud& c, Eigen::Index cells, const RunControl* control = nullptr);

}  // namespace barrow
