// The product Gaussian KDE of a weighted cloud evaluated on the nodes of a regular grid.
//   f(x, y) = Σ_i w_i φ((x − x_i)/s_x) φ((y − y_i)/s_y) / (s_x s_y),   φ the N(0,1) density,
// with normalised weights w. Each point adds its kernel on the nodes within `window` bandwidths
// (in the metric scaled by s_x, s_y: a disc, filled row by row as a separable product, about
// (π/4)(2·window·q)² nodes for q nodes per bandwidth, instead of n × grid). Outside that disc a
// kernel is below e^{-window²/2} of its peak.
#pragma once

#include <Eigen/Core>
#include <vector>

#include "base/run_control.h"
#include "cloud/cloud.h"

namespace barrow {

struct GridAxis {
  double start = 0.0;
  double step = 1.0;
  int count = 0;
  double at(int t) const { return start + step * t; }
};

struct KdeGridOptions {
  double nodesPerBandwidth = 4.0;  // fine spacing s/4; the check grid (every other node) has s/2
  double margin = 7.5;             // the grid extends the data's box by margin·s on each side
  double window = 10.0;            // kernels cut at 10 s per axis: below e^{-50} of the peak
  long long maxCells = 1LL << 21;  // node budget; the spacing grows when the box needs more
};

/// A grid of nodes covering both clouds' boxes ± margin·s. Node counts are odd so that the
/// even-index subgrid (twice the spacing) spans the same box.
struct KdeGrid {
  GridAxis x, y;
  double nodesPerBandwidth = 0.0;  // actual q (below the option when the budget bound it)
  long long cells() const { return (long long)x.count * y.count; }
};

/// Pre: lo <= hi componentwise, s > 0.
KdeGrid makeKdeGrid(const Eigen::Vector2d& lo, const Eigen::Vector2d& hi, const Eigen::Vector2d& s,
                    const KdeGridOptions& opt);

/// Adds c's KDE (bandwidth s, kernels cut at `window` bandwidths) to `density` (row-major,
/// index iy·x.count + ix). Polls `ctl` with progress in [p0, p1]; false when cancelled.
bool addKdeOnGrid(const Cloud& c, const Eigen::Vector2d& s, const KdeGrid& g, double window,
                  std::vector<double>& density, const RunControl* ctl, double p0, double p1);

/// ln f at grid nodes without the cut, accurate in relative terms however small f is — for
/// nodes where the cut sum is negligible but its logarithm is needed (KL far from a cloud).
/// f(x_ix, y) = Σ_i K_x(ix, i) v_i, with the x-kernels K_x precomputed for every node column
/// and v_i = w_i φ((y − y_i)/s_y)/(s_x s_y) per row: n multiply-adds per node. The sum is exact
/// to rounding while it stays above 1e-280 (every term that matters is a normal double); below
/// that, a log-sum-exp over all points. Keeps per-row state: one instance per thread.
class UncutLogKde {
 public:
  UncutLogKde(const Cloud& c, const Eigen::Vector2d& s, const GridAxis& x);
  void beginRow(double y);
  double at(int ix) const;

 private:
  Eigen::Vector2d s_;
  const GridAxis* axis_;
  Eigen::ArrayXd x_, y_, logWeight_;  // points of positive weight; ln(w_i/(2π s_x s_y))
  Eigen::MatrixXd kx_;                // n × columns: exp(−½((x_ix − x_i)/s_x)²)
  Eigen::VectorXd row_;               // v_i for the current row
  double rowY_ = 0.0;
  static constexpr double kMaxCachedKernels = 32e6;  // 256 MB of K_x; beyond, exps per node
};

}  // namespace barrow
