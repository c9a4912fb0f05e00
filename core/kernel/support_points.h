// The points of a cloud that carry mass. Points of zero weight are not part of the empirical
// measure, so the kernel, energy, Chamfer and Hausdorff measures and the median heuristic
// leave them out (DEVELOPERS.md, Measure conventions: weights are masses).
#pragma once

#include <Eigen/Core>
#include <vector>

#include "cloud/cloud.h"

namespace barrow {

struct SupportPoints {
  Eigen::MatrixX2d points;          // the rows of positive weight, in cloud order
  Eigen::VectorXd weights;          // their weights, normalised to sum 1
  std::vector<Eigen::Index> rows;   // row of each point in the cloud

  Eigen::Index size() const { return points.rows(); }
};

/// Pre: c.validate() passed (so at least one weight is positive).
SupportPoints supportOf(const Cloud& c);

/// A per-point quantity on the support (k x 2) spread back to the cloud's rows (n x 2);
/// rows of zero weight get 0.
Eigen::MatrixX2d toCloudRows(const SupportPoints& s, Eigen::Index cloudRows, const Eigen::MatrixX2d& g);

}  // namespace barrow
