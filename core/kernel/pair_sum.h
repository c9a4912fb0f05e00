// Exact O(n m) kernel sums over all pairs of two weighted point sets: the engine behind the
// MMD and energy distance. Blocked (row blocks x column tiles that stay in cache),
// vectorised (AVX2/FMA when the build enables it) and spread over all cores (runBlocks).
// No n x m matrix is ever stored. Results do not depend on the thread count: every block's
// partial sum is kept and the blocks are added in a fixed order.
#pragma once

#include <Eigen/Core>
#include <vector>

#include "base/parallel_blocks.h"

namespace barrow {

enum class PairKernel {
  Gaussian,  // k(x, y) = exp(-gamma ||x - y||^2), gamma > 0
  Distance,  // k(x, y) = ||x - y|| (energy distance)
};

struct PairKernelSpec {
  PairKernel kind = PairKernel::Gaussian;
  double gamma = 0.5;  // Gaussian only: 1 / (2 sigma^2)
};

/// Weighted points laid out for the pair loops: x, y and w as separate arrays, padded to a
/// multiple of 4 with zero-weight copies of the last point (so the loops need no tails).
class PackedPoints {
 public:
  /// Pre: p.rows() == w.size() >= 1.
  PackedPoints(const Eigen::MatrixX2d& p, const Eigen::VectorXd& w);

  Eigen::Index size() const { return n_; }
  Eigen::Index paddedSize() const { return Eigen::Index(x_.size()); }
  const double* x() const { return x_.data(); }
  const double* y() const { return y_.data(); }
  const double* w() const { return w_.data(); }

 private:
  Eigen::Index n_ = 0;
  std::vector<double> x_, y_, w_;
};

struct PairSum {
  double value = 0.0;
  bool complete = true;  // false: stopped through RunControl, value is meaningless
};

/// sum_i sum_j p.w_i q.w_j k(p_i, q_j).
PairSum crossPairSum(const PackedPoints& p, const PackedPoints& q, const PairKernelSpec& k,
                     const WorkSlice& slice, int threads = 0);

/// sum_{i<j} p.w_i p.w_j k(p_i, p_j): the off-diagonal half of the self sum (the full
/// V-statistic sum is sum_i w_i^2 k(p_i, p_i) + 2 * this). Uses the symmetry: half the work.
PairSum offDiagonalPairSum(const PackedPoints& p, const PairKernelSpec& k, const WorkSlice& slice,
                           int threads = 0);

struct RowSums {
  Eigen::VectorXd value;  // value_i = sum_j q.w_j k(p_i, q_j)        (p's weights unused)
  Eigen::MatrixX2d grad;  // grad_i  = sum_j q.w_j grad_x k(x, q_j) at x = p_i
  bool complete = true;
};

/// Row sums and their gradients (for closed-form gradients of kernel measures). For the
/// Distance kernel the gradient of ||x - y|| at x = y is taken as 0 (the minimal-norm
/// element of the subdifferential, the unit ball).
RowSums rowPairSums(const PackedPoints& p, const PackedPoints& q, const PairKernelSpec& k,
                    const WorkSlice& slice, int threads = 0);

}  // namespace barrow
