// A static 2-d tree that exposes its nodes (bounding box and point range), for searches
// that prune with a bound of their own rather than a distance: e.g. "every point j with
// g_j − |x − y_j|^p ≥ t", bounded per node by the node's largest g and the box's nearest
// point to x. Bentley 1975, "Multidimensional binary search trees" (CACM 18(9)); median
// splits on the wider side, leaves of a few points.
#pragma once

#include <Eigen/Core>
#include <vector>

namespace barrow {

class BoxTree {
 public:
  struct Node {
    double lo[2], hi[2];  // bounding box of the node's points
    int begin, end;       // range of order() holding the node's points
    int left = -1, right = -1;  // children (both -1 at a leaf); always after the parent
  };

  /// Builds over the rows of `points` (n x 2, n >= 1). O(n log n).
  explicit BoxTree(const Eigen::MatrixX2d& points, int leafSize = 12);

  const std::vector<Node>& nodes() const { return nodes_; }
  /// Point indices in tree order.
  const std::vector<int>& order() const { return order_; }

  /// Per node, the largest of values(i) over its points (values.size() == points).
  std::vector<double> nodeMaxima(const Eigen::VectorXd& values) const;

  /// Squared distance from (qx, qy) to a node's box (0 inside it).
  static double boxDistance2(const Node& node, double qx, double qy);

 private:
  int build(const Eigen::MatrixX2d& points, int begin, int end, int leafSize);
  std::vector<Node> nodes_;
  std::vector<int> order_;
};

}  // namespace barrow
