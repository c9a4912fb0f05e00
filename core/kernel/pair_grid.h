// Points sorted into a uniform grid of square cells (row-major cell order), so that all points
// of a run of neighbouring cells in one row are contiguous. Shared by the exact median of
// pairwise distances (median_grid) and the near-field part of the binned kernel sums
// (binned_pair_sum). Cells, not a tree: with equal cells the smallest and largest distance
// between two cells depend only on their offset, so a whole family of cell pairs is
// classified at once.
#pragma once

#include <Eigen/Core>
#include <algorithm>
#include <cstdint>
#include <vector>

namespace barrow {

class PairGrid {
 public:
  /// Cells of side `cell` > 0 from the lower-left corner `origin`; every point must lie in
  /// [origin, origin + cols*cell] x [origin, origin + rows*cell] (points on the far edge go to
  /// the last cell).
  PairGrid(const Eigen::MatrixX2d& p, Eigen::Vector2d origin, double cell, int cols, int rows);

  int cols() const { return cols_; }
  int rows() const { return rows_; }
  double cell() const { return cell_; }
  std::int64_t size() const { return std::int64_t(x_.size()); }

  /// First point (in grid order) of cell (cx, cy); cellBegin(cols, cy) ends the row.
  std::int64_t begin(int cx, int cy) const { return start_[std::size_t(cy) * std::size_t(cols_ + 1) + std::size_t(cx)]; }
  std::int64_t end(int cx, int cy) const { return begin(cx + 1, cy); }
  std::int64_t count(int cx, int cy) const { return end(cx, cy) - begin(cx, cy); }
  /// Points in cells [cx0, cx1] of row cy (clipped to the grid), as a contiguous range
  /// (empty, end <= begin, when the clipped range is).
  std::int64_t rowBegin(int cx0, int cy) const { return begin(std::clamp(cx0, 0, cols_), cy); }
  std::int64_t rowEnd(int cx1, int cy) const { return begin(std::clamp(cx1, -1, cols_ - 1) + 1, cy); }

  const double* x() const { return x_.data(); }
  const double* y() const { return y_.data(); }
  /// Original row of each grid-ordered point.
  const std::vector<Eigen::Index>& order() const { return order_; }
  int cellX(std::int64_t k) const { return cx_[std::size_t(k)]; }

 private:
  int cols_, rows_;
  double cell_;
  std::vector<std::int64_t> start_;  // per row: cols + 1 entries, the last one the row's end
  std::vector<double> x_, y_;
  std::vector<Eigen::Index> order_;
  std::vector<int> cx_;
};

/// Cell index of coordinate v on an axis starting at o with `n` cells of side h (clamped).
inline int cellIndex(double v, double o, double h, int n) {
  const double t = (v - o) / h;
  if (!(t > 0)) return 0;
  return t >= double(n - 1) ? n - 1 : int(t);
}

}  // namespace barrow
