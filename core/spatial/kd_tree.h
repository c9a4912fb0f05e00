// A static 2-d tree over a point set, for nearest-neighbour queries (Chamfer, Hausdorff,
// kNN divergence estimators). Bentley 1975, "Multidimensional binary search trees"
// (CACM 18(9)); median splits on the wider axis, leaves of a few points.
#pragma once

#include <Eigen/Core>
#include <utility>
#include <vector>

namespace barrow {

class KdTree {
 public:
  /// Builds over the rows of `points` (copied; n x 2). O(n log n).
  explicit KdTree(const Eigen::MatrixX2d& points);

  Eigen::Index size() const { return Eigen::Index(index_.size()); }

  /// Nearest point to q, skipping index `exclude` (-1: none): (distance, index).
  /// Among tied points any one may be returned. Pre: the tree has a point other than `exclude`.
  std::pair<double, Eigen::Index> nearest(const Eigen::Vector2d& q, Eigen::Index exclude = -1) const;

  /// The k nearest points to q, closest first (which of several tied points is arbitrary),
  /// skipping `exclude`.
  /// Returns fewer than k when the tree has fewer points.
  std::vector<std::pair<double, Eigen::Index>> knn(const Eigen::Vector2d& q, int k,
                                                   Eigen::Index exclude = -1) const;

  /// Distance from q to its k-th nearest point (k >= 1), skipping `exclude`.
  double kthDistance(const Eigen::Vector2d& q, int k, Eigen::Index exclude = -1) const;

 private:
  struct Node {
    double lo[2], hi[2];  // bounding box of the node's points
    Eigen::Index begin, end;
    Eigen::Index left = -1, right = -1;
  };
  Eigen::Index build(Eigen::Index begin, Eigen::Index end);
  template <class Visit>
  void search(const Eigen::Vector2d& q, double& bound2, Visit&& visit) const;

  static constexpr Eigen::Index kLeafSize = 8;
  std::vector<double> x_, y_;          // coordinates in tree order
  std::vector<Eigen::Index> index_;    // original row of each tree-order point
  std::vector<Node> nodes_;
};

}  // namespace barrow
