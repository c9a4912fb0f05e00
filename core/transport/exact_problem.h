// The discrete transport problem as the exact solver sees it: the points of positive weight
// of A and B, their masses as integers with one common total, and their rows in the input.
//
// Masses are scaled to integers with one common total T on both sides (largest weights
// absorb the rounding), so the two sides balance exactly and the simplex moves flow without
// rounding. T is the largest multiple of lcm(n, m) up to 2^60 (or 2^60 when that lcm
// exceeds 2^40), so that uniform weights become exactly equal integers and an assignment
// problem keeps its permutation plan. Each mass is within ~(n + 1000)/T of its normalised
// weight, far below the 1e-12 relative marginal accuracy promised for weights > 1e-6.
// Points of zero weight carry no mass and are left out; their dual potentials are filled in
// afterwards by the c-transform.
#pragma once

#include <Eigen/Core>
#include <cstdint>
#include <vector>

#include "cloud/cloud.h"
#include "transport/exact_cost.h"

namespace barrow {

inline constexpr std::int64_t kMassTotal = std::int64_t(1) << 60;  // upper bound of T

struct ExactProblem {
  Eigen::ArrayXd ax, ay, bx, by;      // coordinates of the active points
  std::vector<std::int64_t> massA, massB;
  std::vector<int> rowA, rowB;        // input row of each active point
  std::int64_t total = kMassTotal;    // T: the sum of massA and of massB
  GroundCost cost{1.0};

  int n() const { return int(ax.size()); }
  int m() const { return int(bx.size()); }
  double c(int i, int j) const {
    return cost(ax(i), ay(i), bx(j), by(j));
  }
  /// Cost scale: (diagonal of the bounding box of all active points)^p; tolerances are
  /// relative to it. 0 when every point coincides.
  double scale() const;
};

/// Integer masses summing to `total`, proportional to `w` (>= 0, positive sum); a positive
/// weight never rounds to zero.
std::vector<std::int64_t> quantizeMasses(const Eigen::VectorXd& w, std::int64_t total);

/// Builds the problem for cost ‖x − y‖^p. Pre: both clouds validated.
ExactProblem makeExactProblem(const Cloud& a, const Cloud& b, double p);

}  // namespace barrow
