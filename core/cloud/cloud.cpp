#include "cloud/cloud.h"

#include <cmath>
#include <sstream>

namespace barrow {

Cloud::Cloud(std::string n, Eigen::MatrixX2d pts)
    : name(std::move(n)), points(std::move(pts)) {
  const auto count = points.rows();
  weights = Eigen::VectorXd::Constant(count, count > 0 ? 1.0 / double(count) : 0.0);
}

Cloud::Cloud(std::string n, Eigen::MatrixX2d pts, Eigen::VectorXd w)
    : name(std::move(n)), points(std::move(pts)), weights(std::move(w)) {}

Eigen::VectorXd normalizeWeights(const Eigen::VectorXd& w) {
  // Divide by the largest weight first: the raw sum of finite weights can overflow (two rows
  // of 1e308 sum to +inf), the scaled one is at most n.
  if (w.size() == 0) return w;
  const double top = w.maxCoeff();
  if (!(top > 0) || !std::isfinite(top)) return w / w.sum();  // invalid clouds: no rescue
  const Eigen::VectorXd scaled = w / top;
  return scaled / scaled.sum();
}

Eigen::VectorXd Cloud::normalizedWeights() const { return normalizeWeights(weights); }

Eigen::Vector2d Cloud::mean() const {
  return (points.transpose() * normalizedWeights());
}

namespace {
// Farthest pair among the given points: O(n^2) over the convex hull would be faster, but
// clouds here are small enough that a hull is not worth its code; limit the work instead by
// checking hull candidates only (extreme points in 16 directions) when n is large.
double diameterOf(const Eigen::MatrixX2d& p) {
  const auto n = p.rows();
  if (n < 2) return 0.0;
  if (n <= 2000) {
    double best = 0.0;
    for (Eigen::Index i = 0; i < n; ++i)
      for (Eigen::Index j = i + 1; j < n; ++j)
        best = std::max(best, (p.row(i) - p.row(j)).squaredNorm());
    return std::sqrt(best);
  }
  // Exact diameter is attained between hull vertices; extreme points in many directions
  // give a lower bound within (1 - cos(pi/K)) of the truth, ample for scaling settings.
  constexpr int kDirections = 64;
  Eigen::MatrixX2d ext(kDirections, 2);
  for (int k = 0; k < kDirections; ++k) {
    const double t = M_PI * 2.0 * k / kDirections;
    Eigen::Index arg = 0;
    (p.col(0) * std::cos(t) + p.col(1) * std::sin(t)).maxCoeff(&arg);
    ext.row(k) = p.row(arg);
  }
  return diameterOf(ext);
}
}  // namespace

double Cloud::diameter() const {
  Eigen::MatrixX2d pos(points.rows(), 2);
  Eigen::Index k = 0;
  for (Eigen::Index i = 0; i < points.rows(); ++i)
    if (weights(i) > 0) pos.row(k++) = points.row(i);
  return diameterOf(pos.topRows(k));
}

double jointDiameter(const Cloud& a, const Cloud& b) {
  Eigen::MatrixX2d all(a.size() + b.size(), 2);
  all << a.points, b.points;
  Eigen::VectorXd w(a.size() + b.size());
  w << a.weights, b.weights;
  return Cloud("", all, w).diameter();
}

std::optional<std::string> Cloud::validate() const {
  const std::string label = name.empty() ? std::string("cloud") : "cloud '" + name + "'";
  if (points.rows() == 0) return label + " is empty: it needs at least one point";
  if (weights.size() != points.rows()) {
    std::ostringstream s;
    s << label << " has " << points.rows() << " points but " << weights.size() << " weights";
    return s.str();
  }
  for (Eigen::Index i = 0; i < points.rows(); ++i) {
    const char* bad = nullptr;
    if (!std::isfinite(points(i, 0))) bad = "x is not a finite number";
    else if (!std::isfinite(points(i, 1))) bad = "y is not a finite number";
    else if (!std::isfinite(weights(i))) bad = "weight is not a finite number";
    else if (weights(i) < 0) bad = "weight is negative";
    if (bad) {
      std::ostringstream s;
      s << label << ", row " << (i + 1) << ": " << bad;
      return s.str();
    }
  }
  if (!(weights.sum() > 0)) return label + ": all weights are zero, so there is no mass to compare";
  return std::nullopt;
}

}  // namespace barrow
