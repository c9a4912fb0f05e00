#include "cloud/congruence.h"

#include <algorithm>
#include <cmath>
#include <limits>

namespace barrow {

namespace {

// Whether rotating the centred points p by (c, s) = (cos, sin) of an angle lands on the
// centred q, to the misfit allowed for ref → moved.
bool fits(const Eigen::MatrixX2d& ref, const Eigen::MatrixX2d& moved, const Eigen::MatrixX2d& p,
          const Eigen::MatrixX2d& q, double c, double s, double relTol) {
  // Allowed misfit: relTol of the clouds' own extent, plus the rounding that moving a point
  // far from the origin unavoidably costs (a few units in the last place of its coordinates).
  const double extent = std::max(p.cwiseAbs().maxCoeff(), q.cwiseAbs().maxCoeff());
  const double far = std::max(ref.cwiseAbs().maxCoeff(), moved.cwiseAbs().maxCoeff());
  const double tol = relTol * extent + 8.0 * std::numeric_limits<double>::epsilon() * far;
  const double tol2 = tol * tol;
  for (Eigen::Index i = 0; i < p.rows(); ++i) {
    const double rx = c * p(i, 0) - s * p(i, 1) - q(i, 0), ry = s * p(i, 0) + c * p(i, 1) - q(i, 1);
    if (rx * rx + ry * ry > tol2) return false;
  }
  return true;
}

}  // namespace

bool rigidlyMoved(const Eigen::MatrixX2d& ref, const Eigen::MatrixX2d& moved, bool rotationAllowed, double relTol) {
  const Eigen::Index n = ref.rows();
  if (n != moved.rows() || n == 0) return false;
  const Eigen::MatrixX2d p = ref.rowwise() - ref.colwise().mean(), q = moved.rowwise() - moved.colwise().mean();
  if (!rotationAllowed) return fits(ref, moved, p, q, 1.0, 0.0, relTol);
  // Best rotation taking p onto q: angle of Σ (p_i · q_i, p_i × q_i) (2-D Procrustes).
  double dot = 0.0, cross = 0.0;
  for (Eigen::Index i = 0; i < n; ++i) {
    dot += p(i, 0) * q(i, 0) + p(i, 1) * q(i, 1);
    cross += p(i, 0) * q(i, 1) - p(i, 1) * q(i, 0);
  }
  const double angle = (dot == 0.0 && cross == 0.0) ? 0.0 : std::atan2(cross, dot);
  return fits(ref, moved, p, q, std::cos(angle), std::sin(angle), relTol);
}

bool rigidlyCongruent(const Cloud& ref, const Cloud& moved, double relTol) {
  // Weights compared exactly: a self term depends on every one of them. Sizes first: Eigen's
  // == on vectors of different sizes is an assertion failure (Debug) or a wrong read.
  return ref.weights.size() == moved.weights.size() && ref.weights == moved.weights && rigidlyMoved(ref.points, moved.points, true, relTol);
}

}  // namespace barrow
