// min_s (|z − p_s|^p − c_s), p ∈ {1, 2}: the cost to the cheapest site when each site p_s is
// made cheaper by its offset c_s (p = 2: the c-transform for the squared cost). With c the dual potentials of W1 on one side, this is the
// c-transform φ(z) of Kantorovich–Rubinstein duality, a 1-Lipschitz function on the whole
// plane (transport/kr_potential.h computes it by brute force; this answers 10^5 queries over
// 10^4 sites fast). Branch and bound over a 2-d tree of the sites [CP]: a box cannot hold a
// better site when (distance from z to the box) − (largest offset in it) ≥ the best so far
// (less an optional slack).
#pragma once

#include <Eigen/Core>
#include <vector>

namespace barrow {

class OffsetNearest {
 public:
  /// Pre: sites.rows() == offsets.size() >= 1, all finite; p is 1 or 2.
  OffsetNearest(const Eigen::MatrixX2d& sites, const Eigen::VectorXd& offsets, int p = 1);

  /// The minimum, exact up to `slack` >= 0: the answer m satisfies φ(z) ≤ m ≤ φ(z) + slack
  /// (boxes that cannot beat the best so far by more than the slack are skipped; with near-ties
  /// along a ray, as W1 potentials have, this is what keeps a query short).
  /// `hint` (may be null): a site to try first, in and out (the best site found); queries in
  /// spatial order that pass it along start with a good bound and prune early.
  double operator()(double x, double y, double slack = 0.0, int* hint = nullptr) const;

 private:
  struct Node {
    double lo[2], hi[2];
    double maxOffset;
    int begin, end;
    int left = -1, right = -1;
  };
  int build(int begin, int end);
  void search(int node, double x, double y, double slack, double& best, int& at) const;

  static constexpr int kLeafSize = 8;
  int p_ = 1;
  std::vector<double> x_, y_, c_;  // sites in tree order
  std::vector<Node> nodes_;
};

}  // namespace barrow
