#include "density/knn_kl.h"

#include <algorithm>
#include <cmath>
#include <limits>
#include <sstream>

#include "spatial/kd_tree.h"

namespace barrow {

namespace {

// The k-th smallest positive distance from q to the tree's points (skipping `exclude`); +inf
// when fewer than k points lie at a positive distance. `tied` tells whether a zero was skipped.
double kthPositiveDistance(const KdTree& tree, const Eigen::Vector2d& q, int k, Eigen::Index exclude,
                           bool* tied) {
  int want = k;
  for (;;) {
    const auto nn = tree.knn(q, want, exclude);
    int zeros = 0;
    while (zeros < int(nn.size()) && nn[std::size_t(zeros)].first == 0.0) ++zeros;
    *tied = zeros > 0;
    if (int(nn.size()) - zeros >= k) return nn[std::size_t(zeros + k - 1)].first;
    if (int(nn.size()) < want) return std::numeric_limits<double>::infinity();
    want = std::max(2 * want, zeros + k);
  }
}

std::string pointText(const Eigen::Vector2d& x) {
  std::ostringstream s;
  s.precision(8);
  s << "(" << x.x() << ", " << x.y() << ")";
  return s.str();
}

}  // namespace

KnnKl knnKl(const Eigen::MatrixX2d& p, const Eigen::MatrixX2d& q, int k, const std::string& nameP,
            const std::string& nameQ, const RunControl* ctl) {
  KnnKl r;
  const Eigen::Index n = p.rows(), m = q.rows();
  const KdTree treeP(p), treeQ(q);
  double sum = 0.0;
  for (Eigen::Index i = 0; i < n; ++i) {
    if ((i & 1023) == 0 && ctl && ctl->shouldStop(double(i) / double(n))) {
      r.cancelled = true;
      return r;
    }
    const Eigen::Vector2d x = p.row(i).transpose();
    bool tiedRho = false, tiedNu = false;
    const double rho = kthPositiveDistance(treeP, x, k, i, &tiedRho);
    const double nu = kthPositiveDistance(treeQ, x, k, -1, &tiedNu);
    if (std::isinf(rho) || std::isinf(nu)) {
      const bool own = std::isinf(rho);
      r.error = "kNN with k = " + std::to_string(k) + ": the point " + pointText(x) + " of " + nameP +
                " has fewer than " + std::to_string(k) + " points of " + (own ? nameP + " (other than itself)" : nameQ) +
                " at a positive distance (coincident points are not neighbours); lower density.k";
      return r;
    }
    r.tiesRho += tiedRho;
    r.tiesNu += tiedNu;
    sum += std::log(nu / rho);
  }
  r.value = 2.0 / double(n) * sum + std::log(double(m) / double(n - 1));
  return r;
}

std::optional<Eigen::MatrixX2d> uniformSample(const Cloud& c, const std::string& name, std::string* why) {
  double lo = std::numeric_limits<double>::infinity(), hi = 0.0;
  Eigen::Index count = 0;
  for (Eigen::Index i = 0; i < c.size(); ++i)
    if (c.weights(i) > 0) {
      lo = std::min(lo, c.weights(i));
      hi = std::max(hi, c.weights(i));
      ++count;
    }
  if (hi > lo * (1.0 + 1e-9)) {
    std::ostringstream s;
    s.precision(6);
    s << "the kNN estimator is for unweighted samples, but " << name << " has weights from " << lo
      << " to " << hi << "; use density.estimator=hist or kde for weighted clouds";
    *why = s.str();
    return std::nullopt;
  }
  Eigen::MatrixX2d out(count, 2);
  Eigen::Index k = 0;
  for (Eigen::Index i = 0; i < c.size(); ++i)
    if (c.weights(i) > 0) out.row(k++) = c.points.row(i);
  return out;
}

}  // namespace barrow
