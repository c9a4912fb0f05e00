#include "transport/sinkhorn_coarse.h"

#include <algorithm>
#include <cmath>
#include <limits>
#include <vector>

#include "transport/kernel_pass.h"

namespace barrow {

CoarseCloud coarsenOnGrid(const Eigen::MatrixX2d& x, const Eigen::VectorXd& w, int side) {
  side = std::max(1, side);
  const Eigen::RowVector2d lo = x.colwise().minCoeff(), hi = x.colwise().maxCoeff();
  const Eigen::RowVector2d span = (hi - lo).cwiseMax(1e-300);
  const int cells = side * side;
  std::vector<double> mass(cells, 0.0), sx(cells, 0.0), sy(cells, 0.0), px(cells, 0.0), py(cells, 0.0);
  std::vector<int> count(cells, 0);
  for (Eigen::Index i = 0; i < x.rows(); ++i) {
    const int cx = std::clamp(int((x(i, 0) - lo(0)) / span(0) * side), 0, side - 1);
    const int cy = std::clamp(int((x(i, 1) - lo(1)) / span(1) * side), 0, side - 1);
    const int c = cy * side + cx;
    mass[c] += w(i);
    sx[c] += w(i) * x(i, 0);
    sy[c] += w(i) * x(i, 1);
    px[c] += x(i, 0);
    py[c] += x(i, 1);
    ++count[c];
  }
  CoarseCloud out;
  const int used = int(std::count_if(count.begin(), count.end(), [](int k) { return k > 0; }));
  out.x.resize(used, 2);
  out.w.resize(used);
  int k = 0;
  for (int c = 0; c < cells; ++c) {
    if (!count[c]) continue;
    if (mass[c] > 0) out.x.row(k) << sx[c] / mass[c], sy[c] / mass[c];
    else out.x.row(k) << px[c] / count[c], py[c] / count[c];
    out.w(k) = mass[c];
    ++k;
  }
  return out;
}

Eigen::VectorXd extendPotential(const Eigen::MatrixX2d& x, const CoarseCloud& c, const Eigen::VectorXd& q,
                                double epsilon, int p, kernel::RowWorkers& workers,
                                const std::atomic<bool>* stop, const Eigen::VectorXd* near) {
  const double scale = kernel::scaleFor(p, epsilon);
  const kernel::ScaledPoints rows(x, scale), cols(c.x, scale);
  std::vector<double> h = kernel::paddedLogWeights(c.w / c.w.sum());
  for (Eigen::Index j = 0; j < q.size(); ++j) h[std::size_t(j)] += q(j) / epsilon;
  // Without an estimate each row takes its exact maximum as the stabiliser, after a first sum
  // that leaves the range (cheap over a coarse cloud, not over 10^5 points × 8 192 cells).
  std::vector<double> out(std::size_t(x.rows()));
  std::vector<double> guess(std::size_t(x.rows()), -std::numeric_limits<double>::infinity());
  if (near && near->size() == x.rows())
    for (Eigen::Index i = 0; i < x.rows(); ++i)
      if (std::isfinite((*near)(i))) guess[std::size_t(i)] = -(*near)(i) / epsilon;
  kernel::logSumExpRows(rows, cols, h, p, guess.data(), out.data(), nullptr, workers, stop);
  Eigen::VectorXd f(x.rows());
  for (Eigen::Index i = 0; i < x.rows(); ++i) f(i) = -epsilon * out[std::size_t(i)];
  return f;
}

}  // namespace barrow
