#include "kernel/support_points.h"

namespace barrow {

SupportPoints supportOf(const Cloud& c) {
  SupportPoints s;
  for (Eigen::Index i = 0; i < c.size(); ++i)
    if (c.weights(i) > 0) s.rows.push_back(i);
  const auto k = Eigen::Index(s.rows.size());
  s.points.resize(k, 2);
  s.weights.resize(k);
  for (Eigen::Index t = 0; t < k; ++t) {
    s.points.row(t) = c.points.row(s.rows[std::size_t(t)]);
    s.weights(t) = c.weights(s.rows[std::size_t(t)]);
  }
  s.weights = normalizeWeights(s.weights);
  return s;
}

Eigen::MatrixX2d toCloudRows(const SupportPoints& s, Eigen::Index cloudRows, const Eigen::MatrixX2d& g) {
  Eigen::MatrixX2d out = Eigen::MatrixX2d::Zero(cloudRows, 2);
  for (Eigen::Index t = 0; t < s.size(); ++t) out.row(s.rows[std::size_t(t)]) = g.row(t);
  return out;
}

}  // namespace barrow
