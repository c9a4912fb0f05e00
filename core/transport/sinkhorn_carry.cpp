#include "transport/sinkhorn_carry.h"

#include <algorithm>

#include "cloud/congruence.h"

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

bool extrapolatePotentials(const Eigen::MatrixX2d& x0, const Eigen::MatrixX2d& y0, const Eigen::VectorXd& f0,
                           const Eigen::VectorXd& g0, const Eigen::MatrixX2d& x1, const Eigen::MatrixX2d& y1,
                           const Eigen::VectorXd& f1, const Eigen::VectorXd& g1, const Eigen::MatrixX2d& x,
                           const Eigen::MatrixX2d& y, Eigen::VectorXd& f, Eigen::VectorXd& g) {
  const Eigen::Index n = x.rows(), m = y.rows();
  if (n == 0 || m == 0 || x0.rows() != n || x1.rows() != n || y0.rows() != m || y1.rows() != m || f0.size() != n ||
      f1.size() != n || g0.size() != m || g1.size() != m)
    return false;
  const double before = (x1 - x0).squaredNorm() + (y1 - y0).squaredNorm();
  if (!(before > 0)) return false;
  const double along = ((x - x1).cwiseProduct(x1 - x0)).sum() + ((y - y1).cwiseProduct(y1 - y0)).sum();
  const double alpha = along / before;
  if (!(alpha > 0 && alpha <= 2)) return false;
  Eigen::VectorXd fe = f1 + alpha * (f1 - f0), ge = g1 + alpha * (g1 - g0);
  if (!fe.allFinite() || !ge.allFinite()) return false;
  f = std::move(fe);
  g = std::move(ge);
  return true;
}

void startFromPath(const SolvedPotentials* before, const SolvedPotentials& last, const Eigen::MatrixX2d& x,
                   const Eigen::MatrixX2d& y, int p, Eigen::VectorXd& f, Eigen::VectorXd& g) {
  const bool translated = rigidlyMoved(last.x, x, false) && rigidlyMoved(last.y, y, false);
  if (!(p == 2 && translated) && before &&
      extrapolatePotentials(before->x, before->y, before->f, before->g, last.x, last.y, last.f, last.g, x, y, f, g))
    return;
  f = last.f;
  g = last.g;
  carryPotentials(last.x, last.y, x, y, p, f, g);
}

}  // namespace barrow
