// A static 2-d tree over the sites y_j of one side, for exact branch and bound over
// min_j (c(q, y_j) − v_j): whole boxes of sites that cannot score low enough are skipped.
// Two lower bounds per box, the larger is used:
// - c(d) − max v, where d is the distance from q to the box (no site is nearer);
// - for p = 1 and p = 2, an affine envelope of the potentials: with slope b fitted to the
//   box's potentials (least squares about the box centre o) and A = max_j (v_j − b·(y_j − o)),
//   every site has v_j <= A + b·(y_j − o), so
//     p = 2:  c − v_j >= dist²(q + b/2, box) − b·(q − o) − |b|²/4 − A
//     p = 1:  c − v_j >= min over the box of (e − b)·(y − q) − b·(q − o) − A
//   for any unit e (|z| >= e·z); e points from q to o. Optimal potentials are nearly affine
//   over a small box, and over whole clouds that lie apart (then c − v_j is almost flat
//   and the first bound skips almost nothing), so this one keeps queries local.
// Both bounds are lowered by a margin far above the rounding of the few operations in the
// bound and in a score, so pruning never hides a site the full scan would report.
// This is what makes pricing all n·m pairs affordable. Median splits along the wider side
// (Bentley 1975, CACM 18(9)).
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
    double slope[2] = {0.0, 0.0};  // b of the affine envelope, about the box centre
    double top = 0.0;              // A = max (v_j − b·(y_j − centre)) over the box
    double size = 0.0;             // magnitudes in the bound, for its rounding margin
    int begin = 0, end = 0, left = -1, right = -1;
  };
  int build(int begin, int end);
  void fitEnvelope(Node& nd) const;
  double envelopeBound(const Node& nd, double qx, double qy) const;
  /// A lower bound on the box's scores; the cheap one alone once it reaches `threshold`.
  double bound(const Node& nd, double qx, double qy, double threshold) const;
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
