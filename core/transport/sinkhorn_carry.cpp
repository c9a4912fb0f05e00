#include "transport/sinkhorn_carry.h"

namespace barrow {

void carryPotentials(const Eigen::MatrixX2d& x0, const Eigen::MatrixX2d& y0, const Eigen::MatrixX2d& x,
                     const Eigen::MatrixX2d& y, int p, Eigen::VectorXd& f, Eigen::VectorXd& g) {
  if (p != 2 || x0.rows() != x.rows() || y0.rows() != y.rows() || f.size() != x.rows() || g.size() != y.rows() ||
      x.rows() == 0 || y.rows() == 0)
    return;
  const Eigen::RowVector2d s = (x - x0).colwise().mean(), t = (y - y0).colwise().mean();
  const Eigen::Vector2d d = (s - t).transpose();
  if (d.isZero(0.0)) return;
  f.array() += 2.0 * (x0 * d).array() + d.squaredNorm();
  g.array() -= 2.0 * (y0 * d).array();
}

}  // namespace barrow
