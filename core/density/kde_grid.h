// The product Gaussian KDE of a weighted cloud evaluated on the nodes of a regular grid.
//   f(x, y) = Σ_i w_i φ((x − x_i)/s_x) φ((y − y_i)/s_y) / (s_x s_y),   φ the N(0,1) density,
// with normalised weights w. Each point adds its kernel on the nodes within `window` bandwidths
// per axis (a separable outer product: O(n·(2·window·q)²) for q nodes per bandwidth, instead
// of n × grid). Outside that window a kernel is below e^{-window²/2} of its peak.
#pragma once

#include <Eigen/Core>
#include <vector>

#include "cloud/cloud.h"
#include "measures/run_control.h"

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

/// ln f at any point by a full log-sum-exp over the cloud (no cut, no underflow): used where
/// the cut sum is too small to be accurate, e.g. far from the cloud. O(n) per call; keeps a
/// scratch buffer, so one instance per thread.
class ExactLogKde {
 public:
  ExactLogKde(const Cloud& c, const Eigen::Vector2d& s);
  double at(double x, double y);

 private:
  Eigen::ArrayXd x_, y_, logWeight_;  // points of positive weight; ln(w_i/(2π s_x s_y))
  Eigen::Vector2d s_;
  Eigen::ArrayXd scratch_;
};

}  // namespace barrow
