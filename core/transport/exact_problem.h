// The discrete transport problem as the exact solver sees it: the points of positive weight
// of A and B, their masses as integers with one common total, and their rows in the input.
//
// Masses are scaled to integers summing to exactly kMassTotal = 2^60 on both sides (largest
// weights absorb the rounding), so the two sides balance exactly and the simplex moves
// flow without rounding. Each mass is within 2^-60 · (n + 1000) of its normalised weight,
// far below the 1e-12 relative marginal accuracy the engine promises for weights > 1e-6.
// Points of zero weight carry no mass and are left out; their dual potentials are filled in
// afterwards by the c-transform.
#pragma once

#include <Eigen/Core>
#include <cstdint>
#include <vector>

#include "cloud/cloud.h"
#include "transport/exact_cost.h"

namespace barrow {

inline constexpr std::int64_t kMassTotal = std::int64_t(1) << 60;

struct ExactProblem {
  Eigen::ArrayXd ax, ay, bx, by;      // coordinates of the active points
  std::vector<std::int64_t> massA, massB;
  std::vector<int> rowA, rowB;        // input row of each active point
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

/// Integer masses summing to kMassTotal, proportional to `w` (>= 0, positive sum); a
/// positive weight never rounds to zero.
std::vector<std::int64_t> quantizeMasses(const Eigen::VectorXd& w);

/// Builds the problem for cost ‖x − y‖^p. Pre: both clouds validated.
ExactProblem makeExactProblem(const Cloud& a, const Cloud& b, double p);

}  // namespace barrow
