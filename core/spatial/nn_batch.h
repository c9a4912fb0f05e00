// Nearest-neighbour queries for many points at once, spread over all cores (runBlocks),
// with cancellation between blocks of queries. Used by Chamfer and Hausdorff.
#pragma once

#include <Eigen/Core>
#include <vector>

#include "base/parallel_blocks.h"
#include "spatial/kd_tree.h"

namespace barrow {

struct NearestBatch {
  std::vector<double> distance;      // Euclidean distance to the nearest tree point
  std::vector<Eigen::Index> index;   // its row in the matrix the tree was built from
  bool complete = true;              // false: stopped through RunControl
};

/// For each row q of `queries`, tree.nearest(q) (ties broken by the smaller index).
/// Pre: the tree is not empty.
NearestBatch nearestAll(const KdTree& tree, const Eigen::MatrixX2d& queries, const WorkSlice& slice,
                        int threads = 0);

/// Nearest neighbours both ways between two point sets: ab[i] is the nearest row of b to a's
/// row i, ba[j] the nearest row of a to b's row j (ties: the smaller row). Repeated points are
/// collapsed first (each location queried and indexed once: coincident points would make the
/// tree search linear). Builds both trees (in parallel), then queries.
struct MutualNearest {
  NearestBatch ab, ba;
  bool complete = true;
};
/// Pre: both non-empty.
MutualNearest mutualNearest(const Eigen::MatrixX2d& a, const Eigen::MatrixX2d& b, const WorkSlice& slice);

}  // namespace barrow
