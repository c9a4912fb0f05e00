// A static 2-d tree over the sites y_j of one side, carrying per node the largest potential
// v_j below it, for exact branch and bound over min_j (c(q, y_j) − v_j): no site in a box at
// distance d from q can score below c(d) − max v, so whole boxes are skipped. The bound is
// built from the same correctly rounded operations as the scores (a box's distance never
// exceeds a member's), so pruning never hides a site the full scan would report.
// This is what makes pricing all n·m pairs affordable: each query visits the few boxes near
// where q's mass can go. Median splits along the wider side (Bentley 1975, CACM 18(9)).
#pragma once

#include <Eigen/Core>
#include <utility>
#include <vector>

#include "transport/exact_cost.h"

namespace barrow {

class SiteTree {
 public:
  /// Sites (x, y); potentials start at 0. Pre: at least one site.
  SiteTree(const Eigen::Ref<const Eigen::ArrayXd>& x, const Eigen::Ref<const Eigen::ArrayXd>& y, GroundCost cost);

  /// Replaces the potentials (one per site, in input order). O(sites).
  void setPotentials(const Eigen::Ref<const Eigen::ArrayXd>& v);

  /// min_j (c(q, y_j) − v_j).
  double minScore(double qx, double qy) const;
  /// The sites scoring below `limit`, at most `k` (the lowest), as (score, site), lowest first.
  void below(double qx, double qy, double limit, int k, std::vector<std::pair<double, int>>* out) const;
  /// min_j (c(q, y_j) − v_j), and in `ties` how many sites score within `window` of it.
  double minScore(double qx, double qy, double window, int* ties) const;

 private:
  struct Node {
    double lo[2], hi[2];
    double maxV = 0.0;
    int begin = 0, end = 0, left = -1, right = -1;
  };
  int build(int begin, int end);
  double bound(const Node& nd, double qx, double qy) const;
  double score(int t, double qx, double qy) const {
    const double dx = x_[std::size_t(t)] - qx, dy = y_[std::size_t(t)] - qy;
    return cost_.fromSquared(dx * dx + dy * dy) - v_[std::size_t(t)];
  }
  template <class Leaf>
  void search(double qx, double qy, const double& threshold, bool inclusive, Leaf&& leaf) const;

  static constexpr int kLeafSize = 8;
  GroundCost cost_;
  std::vector<double> x_, y_, v_;  // in tree order
  std::vector<int> site_;          // input index of each tree position
  std::vector<Node> nodes_;        // preorder: a parent comes before its children
};

}  // namespace barrow
