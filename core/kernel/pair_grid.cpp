#include "kernel/pair_grid.h"

#include <algorithm>

namespace barrow {

PairGrid::PairGrid(const Eigen::MatrixX2d& p, Eigen::Vector2d origin, double cell, int cols, int rows)
    : cols_(std::max(cols, 1)), rows_(std::max(rows, 1)), cell_(cell) {
  const Eigen::Index n = p.rows();
  const std::size_t stride = std::size_t(cols_ + 1);
  std::vector<std::int64_t> counts(stride * std::size_t(rows_), 0);
  std::vector<std::size_t> slot(static_cast<std::size_t>(n));
  for (Eigen::Index i = 0; i < n; ++i) {
    const int cx = cellIndex(p(i, 0), origin.x(), cell, cols_), cy = cellIndex(p(i, 1), origin.y(), cell, rows_);
    slot[std::size_t(i)] = std::size_t(cy) * stride + std::size_t(cx);
    ++counts[slot[std::size_t(i)]];
  }
  // Exclusive prefix over the row-major cells; the extra entry of each row holds the row's end.
  start_.assign(counts.size(), 0);
  std::int64_t run = 0;
  for (int cy = 0; cy < rows_; ++cy) {
    for (int cx = 0; cx < cols_; ++cx) {
      const std::size_t c = std::size_t(cy) * stride + std::size_t(cx);
      start_[c] = run;
      run += counts[c];
    }
    start_[std::size_t(cy) * stride + std::size_t(cols_)] = run;
  }
  x_.resize(std::size_t(n));
  y_.resize(std::size_t(n));
  order_.resize(std::size_t(n));
  cx_.resize(std::size_t(n));
  std::vector<std::int64_t> fill(start_);
  for (Eigen::Index i = 0; i < n; ++i) {  // stable: points keep their input order within a cell
    const auto k = std::size_t(fill[slot[i]]++);
    x_[k] = p(i, 0);
    y_[k] = p(i, 1);
    order_[k] = i;
    cx_[k] = int(slot[i] % stride);
  }
}

}  // namespace barrow
