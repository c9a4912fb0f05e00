#include "critic/input_frame.h"

#include <cmath>

namespace barrow::critic {

InputFrame InputFrame::of(const Cloud& a, const Cloud& b) {
  InputFrame f;
  const Eigen::VectorXd wa = a.normalizedWeights(), wb = b.normalizedWeights();
  const Eigen::Vector2d ma = a.points.transpose() * wa, mb = b.points.transpose() * wb;
  f.centre = 0.5 * (ma + mb);
  const double ms = 0.5 * ((a.points.rowwise() - f.centre.transpose()).rowwise().squaredNorm().dot(wa) +
                           (b.points.rowwise() - f.centre.transpose()).rowwise().squaredNorm().dot(wb));
  const double s = std::sqrt(ms);
  f.scale = std::isfinite(s) && s > 0 ? s : 1.0;
  return f;
}

Cloud InputFrame::toUnit(const Cloud& c) const {
  Cloud out = c;
  out.points = ((c.points.rowwise() - centre.transpose()).array() / scale).matrix();
  return out;
}

MlpParams InputFrame::fold(const MlpParams& g) const {
  MlpParams f = g;
  if (f.layers() == 0) return f;
  // W0 (x − c)/s + b0 = (W0/s) x + (b0 − W0 c/s).
  f.w.front() = g.w.front() / scale;
  f.b.front() = g.b.front() - f.w.front() * centre;
  f.w.back() *= scale;
  f.b.back() *= scale;
  return f;
}

}  // namespace barrow::critic
