// The three pair sums behind kernel discrepancies between weighted empirical measures
// a = sum_i a_i delta_{x_i} and b = sum_j b_j delta_{y_j}:
//   K_aa = sum_{i,k} a_i a_k k(x_i, x_k),  K_bb likewise,  K_ab = sum_{i,j} a_i b_j k(x_i, y_j),
// so that MMD^2 = K_aa + K_bb - 2 K_ab (Gretton et al. 2012, JMLR 13, Lemma 6 (mem)) and the
// energy distance is the same with k(x, y) = -||x - y|| (Sejdinovic et al. 2013, Ann. Stat. 41).
// Also their gradients with respect to the points of a.
#pragma once

#include <Eigen/Core>
#include <string>

#include "kernel/binned_pair_sum.h"
#include "kernel/pair_sum.h"
#include "kernel/support_points.h"

namespace barrow {

struct DiscrepancySums {
  double aaOffDiagonal = 0.0;  // sum_{i != k} a_i a_k k(x_i, x_k)   (both orders)
  double bbOffDiagonal = 0.0;
  double ab = 0.0;             // sum_{i,j} a_i b_j k(x_i, y_j)
  double aaDiagonal = 0.0;     // sum_i a_i^2 k(x_i, x_i)
  double bbDiagonal = 0.0;
  double sumSquaresA = 0.0;    // sum_i a_i^2 (for the U-statistic's renormalisation)
  double sumSquaresB = 0.0;
  // Binned sums only (kernel/binned_pair_sum.h): bounds on the absolute error of
  // aaDiagonal + aaOffDiagonal, of bbDiagonal + bbOffDiagonal and of ab. 0 for direct sums.
  double boundAA = 0.0, boundBB = 0.0, boundAB = 0.0;
  bool binned = false;
  std::string method;          // for result details
  bool complete = true;
};

struct DiscrepancyOptions {
  enum class Method { Auto, Direct, Binned };
  Method method = Method::Auto;
  // Auto bins above this many pair evaluations (n^2/2 + m^2/2 + n m): ~2.2*10^4 + 2.2*10^4 points,
  // where the direct sums cost about what binning does (tests/bench/RESULTS-kernel.md).
  double binAbovePairs = 1e9;
  // Auto keeps binned sums only when their bound, K_aa + K_bb + 2 K_ab's, is below this share
  // of the sums' scale (Gaussian: 1, its largest value; distance: K_ab, the mean cross
  // distance); otherwise (a bandwidth far below the grid spacing, far outliers) it sums directly.
  double binnedRelativeBound = 1e-3;
  BinnedSumOptions binned;
};

/// Pre: both supports non-empty with weights summing to 1.
/// Direct sums are exact to rounding; binned ones carry the bounds above. Binned falls back to
/// direct when binning declines (many coincident points).
DiscrepancySums discrepancySums(const SupportPoints& a, const SupportPoints& b, const PairKernelSpec& k,
                                const WorkSlice& slice, const DiscrepancyOptions& options = {});

/// Absolute accuracy of sqrt(max(v, 0)) when v is known within +-bound: the larger move of the
/// square root over [v - bound, v + bound]; sqrt(bound) at v = 0.
double sqrtAccuracy(double v, double bound);

/// For each support point x_i of a:
///   2 a_i [ selfScale * sum_k a_k grad k(x_i, x_k) - sum_j b_j grad k(x_i, y_j) ],
/// the gradient of selfScale * K_aa - 2 K_ab (selfScale = 1 for the V-statistic; the i = k
/// terms have zero gradient for both kernels here). Rows follow a's support order.
/// `complete` is set false when stopped through RunControl.
Eigen::MatrixX2d discrepancyGradient(const SupportPoints& a, const SupportPoints& b, const PairKernelSpec& k,
                                     double selfScale, const WorkSlice& slice, bool* complete);

}  // namespace barrow
