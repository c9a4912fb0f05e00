// A weighted 2-D point set: the object every measure compares.
#pragma once

#include <Eigen/Core>
#include <optional>
#include <string>

namespace barrow {

/// A weighted point cloud in the plane.
/// Weights are non-negative masses; they need not sum to one (they are normalised at use,
/// see normalizedWeights()). Positions are stored column-wise (x column, y column) so that
/// kernels over all points read contiguous memory.
struct Cloud {
  std::string name;
  Eigen::MatrixX2d points;  // n x 2
  Eigen::VectorXd weights;  // n, >= 0, at least one > 0

  Cloud() = default;
  /// Uniform weights 1/n.
  Cloud(std::string name, Eigen::MatrixX2d pts);
  Cloud(std::string name, Eigen::MatrixX2d pts, Eigen::VectorXd w);

  Eigen::Index size() const { return points.rows(); }
  bool empty() const { return points.rows() == 0; }
  Eigen::Vector2d point(Eigen::Index i) const { return points.row(i).transpose(); }

  /// Weights divided by their sum. Pre: validate() passed.
  Eigen::VectorXd normalizedWeights() const;
  /// Weighted mean under the normalised weights. Pre: validate() passed.
  Eigen::Vector2d mean() const;
  /// Largest distance between two points of positive weight (0 for one point).
  double diameter() const;

  /// Checks the invariants; on failure returns a message naming the first offending row
  /// (1-based, as a user counts rows) and what is wrong with it.
  std::optional<std::string> validate() const;
};

/// w / Σw computed without overflow (scaled by the largest weight first). Pre: w >= 0 with
/// a finite positive maximum; otherwise the plain quotient (NaN/inf) is returned.
Eigen::VectorXd normalizeWeights(const Eigen::VectorXd& w);

/// Diameter of the union of two clouds (used to express settings relative to the data).
double jointDiameter(const Cloud& a, const Cloud& b);

}  // namespace barrow
