#include "cloud/congruence.h"

#include <algorithm>
#include <cmath>
#include <limits>

namespace barrow {

bool rigidlyCongruent(const Cloud& ref, const Cloud& moved, double relTol) {
  const Eigen::Index n = ref.size();
  if (n != moved.size() || n == 0) return false;
  if (ref.weights != moved.weights) return false;  // exact: a self term depends on every weight
  const Eigen::RowVector2d cp = ref.points.colwise().mean(), cq = moved.points.colwise().mean();
  const Eigen::MatrixX2d p = ref.points.rowwise() - cp, q = moved.points.rowwise() - cq;
  // Best rotation taking p onto q: angle of Σ (p_i · q_i, p_i × q_i) (2-D Procrustes).
  double dot = 0.0, cross = 0.0;
  for (Eigen::Index i = 0; i < n; ++i) {
    dot += p(i, 0) * q(i, 0) + p(i, 1) * q(i, 1);
    cross += p(i, 0) * q(i, 1) - p(i, 1) * q(i, 0);
  }
  const double angle = (dot == 0.0 && cross == 0.0) ? 0.0 : std::atan2(cross, dot);
  const double c = std::cos(angle), s = std::sin(angle);
  // Allowed misfit: relTol of the clouds' own extent, plus the rounding that moving a point
  // far from the origin unavoidably costs (a few units in the last place of its coordinates).
  const double extent = std::max(p.cwiseAbs().maxCoeff(), q.cwiseAbs().maxCoeff());
  const double far = std::max(ref.points.cwiseAbs().maxCoeff(), moved.points.cwiseAbs().maxCoeff());
  const double tol = relTol * extent + 8.0 * std::numeric_limits<double>::epsilon() * far;
  const double tol2 = tol * tol;
  for (Eigen::Index i = 0; i < n; ++i) {
    const double rx = c * p(i, 0) - s * p(i, 1) - q(i, 0), ry = s * p(i, 0) + c * p(i, 1) - q(i, 1);
    if (rx * rx + ry * ry > tol2) return false;
  }
  return true;
}

}  // namespace barrow
