// Sinkhorn on a truncated kernel, for ε well below the clouds' extent, where almost every
// pair's entry exp((f_i + g_j − c_ij)/ε) of the plan is negligible.
//
// Method: Schmitzer 2019, SIAM J. Sci. Comput. 41, "Stabilized sparse scaling algorithms for
// entropy regularized transport problems" (Sec. 3, kernel truncation with absorbed
// potentials, and Sec. 4, ε-scaling on a hierarchy) (mem), in the log domain of Peyré &
// Cuturi 2019, Computational Optimal Transport, Sec. 4.4. Only the pairs with
//   f⁰_i + g⁰_j − c_ij ≥ −θ ε⁰
// at the potentials (f⁰, g⁰) and ε⁰ of the last truncation are kept; they are found with box
// bounds on a tree over B (spatial/box_tree.h): a node is skipped when
// f_i + max_node g − dist(x_i, box)^p < −θ ε.
//
// Bound on what is left out [D]: a dropped pair has f⁰_i + g⁰_j − c_ij < −θ ε⁰, so at any
// later (f, g) its plan entry a_i b_j exp((f_i + g_j − c_ij)/ε) is below
//   a_i b_j exp((−θ ε⁰ + max_i (f_i − f⁰_i) + max_j (g_j − g⁰_j)) / ε),
// and the plan mass left out is at most that factor times Σ_dropped a_i b_j = 1 − Σ_kept a_i b_j
// (neglectedBound). The truncation is redone when the potentials have risen by more than
// kDriftLimit ε since, and at every new ε. Each full row or column marginal differs from the
// truncated one by that row's or column's dropped mass, so the full problem's L1 marginal
// errors are within the bound of the truncated ones, and its dual objective within ε × bound.
// After convergence one dense pass over all pairs (kernel_pass.h) measures the full row and
// column errors and the full dual objective when n·m is at most kDenseCheckPairs; above it
// the bound stands in for that pass.
#pragma once

#include <Eigen/Core>
#include <vector>

#include "base/row_workers.h"
#include "base/run_control.h"
#include "spatial/box_tree.h"
#include "transport/sinkhorn_solver.h"

namespace barrow {

/// The kept pairs between rows x (weights a) and columns y (weights b), by rows and by
/// columns, with their costs c_ij = |x_i − y_j|^p. Weights are normalised (sum 1).
class TruncatedKernel {
 public:
  TruncatedKernel(const Eigen::MatrixX2d& x, const Eigen::VectorXd& a, const Eigen::MatrixX2d& y,
                  const Eigen::VectorXd& b, int p);

  /// Keeps the pairs with f_i + g_j − c_ij ≥ −θ ε. A row or column left with no pair first
  /// gets its potential from the exact c-transform over all points (so f, g may change);
  /// after it, its largest entry is ≥ 0 > −θ ε.
  void build(Eigen::VectorXd& f, Eigen::VectorXd& g, double epsilon, double theta, kernel::RowWorkers& workers);

  long long pairs() const { return (long long)rowCol_.size(); }
  /// Upper bound on the full plan's mass on dropped pairs at (f, g, ε) (file comment).
  double neglectedBound(const Eigen::VectorXd& f, const Eigen::VectorXd& g, double epsilon) const;
  /// (max (f − f⁰) + max (g − g⁰)) / ε over points of positive weight: the potentials' rise
  /// since the truncation, in units of ε.
  double drift(const Eigen::VectorXd& f, const Eigen::VectorXd& g, double epsilon) const;
  /// Whether the pair (i, j) is kept (a binary search in row i).
  bool kept(int i, int j) const;

  /// out_i = log Σ_{j kept} exp(h_j − c_ij/ε) for every row, stabilised by guess_i (one exp a
  /// pair; a row whose stabilised sum leaves [1e-250, 1e250] is redone with its maximum).
  /// ratio_i (optional) = exp(out_i − guess_i). h has one entry per column.
  void rowLogSumExp(const std::vector<double>& h, double epsilon, const double* guess, double* out, double* ratio,
                    kernel::RowWorkers& workers) const;
  /// The same over columns: out_j = log Σ_{i kept} exp(h_i − c_ij/ε).
  void colLogSumExp(const std::vector<double>& h, double epsilon, const double* guess, double* out,
                    kernel::RowWorkers& workers) const;

 private:
  void queryRows(const std::vector<int>& rows, const Eigen::VectorXd& f, const Eigen::VectorXd& g, double bound,
                 std::vector<std::vector<std::pair<int, double>>>& lists, kernel::RowWorkers& workers) const;

  const Eigen::MatrixX2d& x_;
  const Eigen::MatrixX2d& y_;
  Eigen::VectorXd a_, b_;
  int p_;
  BoxTree treeY_;
  std::vector<long long> rowStart_, colStart_;
  std::vector<int> rowCol_, colRow_;
  std::vector<double> rowCost_, colCost_;
  Eigen::VectorXd f0_, g0_;
  double eps0_ = 1.0, theta_ = 0.0, keptWeight_ = 0.0;
};

/// Truncation threshold θ for a marginal tolerance: the bound stays below 1e-3 × tolerance
/// even after the allowed drift.
double truncationTheta(double tolerance);

/// Estimated share of all pairs kept at ε (a disc of radius (θ ε)^(1/p) against the box of
/// the clouds) [CP]: the solver truncates only where it is small (kMaxKeptShare).
double keptShareEstimate(const Eigen::MatrixX2d& x, const Eigen::MatrixX2d& y, int p, double epsilon, double theta);

inline constexpr double kMaxKeptShare = 0.1;
/// Memory guard: about 24 bytes a kept pair (both orders), so at most ~1.2 GB.
inline constexpr double kMaxKeptPairs = 5e7;
inline constexpr double kDriftLimit = 2.0;
inline constexpr double kDenseCheckPairs = 4e8;

/// OT_ε on truncated kernels from potentials (f, g) solved (loosely) at startEpsilon ≥ ε:
/// ε-scaling from there down to options.epsilon, the last stage to options.tolerance with
/// over-relaxation, then the full-problem check of the file comment. `symmetric`: y, b are
/// x, a and the averaged update is used (g is then ignored and returned equal to f).
/// `startOmega` > 1: the last stage starts over-relaxed at that factor (one a coarse solve
/// of the same problem at the target ε ended with, as in sinkhorn_solver.h).
SinkhornResult solveSinkhornTruncated(const Eigen::MatrixX2d& x, const Eigen::VectorXd& a, const Eigen::MatrixX2d& y,
                                      const Eigen::VectorXd& b, const SinkhornOptions& options,
                                      const RunControl* control, Eigen::VectorXd f, Eigen::VectorXd g,
                                      double startEpsilon, bool symmetric, kernel::RowWorkers& workers,
                                      double startOmega = 1.0);

}  // namespace barrow
