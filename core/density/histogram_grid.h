// Plug-in histogram on a fixed grid of square bins, and the rules that choose the grid.
// Bin (i, j) is [ox + i·h, ox + (i+1)·h) × [oy + j·h, oy + (j+1)·h): every bin edge lies at
// origin + k·bin, and the grid extends without bound (only occupied bins are stored).
#pragma once

#include <Eigen/Core>
#include <string>

#include "cloud/cloud.h"
#include "density/pooled_stats.h"

namespace barrow {

struct HistogramGrid {
  double bin = 1.0;                                  // bin width, > 0, coordinate units
  Eigen::Vector2d origin = Eigen::Vector2d::Zero();  // a corner of the grid
};

/// Scott's normal-reference rule for bivariate histograms, h = 3.504·σ·N^{-1/4}
/// (Scott 1992, Multivariate Density Estimation, Sec. 3.4 (mem)), with σ the root mean square
/// of the two per-axis sds of the pooled sample (one square bin, and never 0 for a segment)
/// and N its effective size. Falls back to 1 when every point coincides (σ = 0).
double autoBinWidth(const PooledStats& s);
/// The pooled minimum per axis (over points of positive weight): the lowest bin's lower edge
/// passes through the lowest point. Derived from the data alone, so shifting both clouds by
/// t shifts the grid by t and leaves every bin's contents unchanged [D]. (Rounding the
/// minimum to a multiple of the bin, counted from 0, made the answer depend on where the
/// data sit.) `bin` is unused; kept so callers state which grid the origin belongs to.
Eigen::Vector2d autoOrigin(const PooledStats& s, double bin);

/// The masses of A (p) and B (q) in every bin that holds mass of either, in the same order.
struct BinnedMasses {
  Eigen::VectorXd p, q;
  long long binsA = 0, binsB = 0;          // bins with positive mass of A, of B
  long long loX = 0, loY = 0, hiX = 0, hiY = 0;  // index range of the occupied bins
  std::string error;                       // non-empty: the grid cannot index these points
};

/// Bins both clouds' normalised weights. Pre: clouds validated, grid.bin > 0 and finite.
BinnedMasses binMasses(const Cloud& a, const Cloud& b, const HistogramGrid& grid);

}  // namespace barrow
