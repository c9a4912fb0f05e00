// Exact optimal transport between two weighted point sets on the real line.
//
// For a convex cost |x − y|^p (p >= 1) the monotone (quantile) coupling is optimal, so
//   W_p^p = ∫_0^1 |F^{-1}(t) − G^{-1}(t)|^p dt
// (Villani 2003, Topics in Optimal Transportation, Thm 2.18; Santambrogio 2015, Prop. 2.17;
// Peyré & Cuturi 2019, Remark 2.30). Both quantile functions are step functions; merging
// their breakpoints gives the coupling with at most n + m − 1 nonzeros. The two sorts are radix
// sorts (transport/value_order.h), so a problem costs O(n + m) for data without many
// near-ties and O((n + m) log(n + m)) at worst.
//
// Weights are non-negative and normalised here (each set to total mass 1); zero-weight points
// take no part. Results are in cost units (length^p).
#pragma once

#include <Eigen/Core>
#include <vector>

#include "base/plan_entry.h"
#include "transport/value_order.h"

namespace barrow {

/// Reusable workspace: solving many problems of similar size (one per slicing direction)
/// allocates only once. Not thread-safe; use one per thread.
class Ot1dSolver {
 public:
  /// W_p^p between (x, a) and (y, b) for p >= 1. When `coupling` is given it receives the
  /// monotone coupling (i, j, mass) in increasing quantile order, masses summing to 1.
  /// Pre: n, m >= 1, finite values, weights >= 0 with a positive sum.
  double solve(const double* x, const double* a, int n, const double* y, const double* b, int m,
               double p, std::vector<PlanEntry>* coupling = nullptr);

 private:
  struct Atom {
    double value;
    int index;
  };
  std::vector<Atom> sx_, sy_;  // atoms in value order, contiguous for the merge walk
  std::vector<double> cx_, cy_;
  std::vector<int> order_;
  ValueOrderScratch scratch_;
};

/// W_p (not its p-th power) between two weighted sets on the line; see Ot1dSolver::solve.
double wasserstein1d(const Eigen::VectorXd& x, const Eigen::VectorXd& a, const Eigen::VectorXd& y,
                     const Eigen::VectorXd& b, double p);

}  // namespace barrow
