#include "density/pooled_stats.h"

#include <algorithm>
#include <cmath>
#include <utility>
#include <vector>

namespace barrow {

namespace {

// Linear-interpolation quantile of a weighted sample sorted by value (pooled_stats.h).
double weightedQuantile(const std::vector<std::pair<double, double>>& sorted, double u) {
  const std::size_t n = sorted.size();
  if (n == 1) return sorted.front().first;
  std::vector<double> mid(n);  // centre of each point's share of the cumulative weight
  double total = 0.0;
  for (std::size_t k = 0; k < n; ++k) {
    mid[k] = total + 0.5 * sorted[k].second;
    total += sorted[k].second;
  }
  const double target = mid.front() + u * (mid.back() - mid.front());
  if (!(target > mid.front())) return sorted.front().first;
  if (!(target < mid.back())) return sorted.back().first;
  const std::size_t hi = std::size_t(std::upper_bound(mid.begin(), mid.end(), target) - mid.begin());
  const std::size_t lo = hi - 1;
  const double t = (target - mid[lo]) / (mid[hi] - mid[lo]);
  return sorted[lo].first + t * (sorted[hi].first - sorted[lo].first);
}

}  // namespace

PooledStats pooledStats(const Cloud& a, const Cloud& b) {
  std::vector<std::pair<Eigen::Vector2d, double>> pts;
  pts.reserve(std::size_t(a.size() + b.size()));
  for (const Cloud* c : {&a, &b}) {
    const Eigen::VectorXd w = c->normalizedWeights();
    for (Eigen::Index i = 0; i < c->size(); ++i)
      if (w(i) > 0) pts.push_back({c->point(i), 0.5 * w(i)});
  }
  PooledStats s;
  if (pts.empty()) return s;
  s.min = s.max = pts.front().first;
  Eigen::Vector2d mean = Eigen::Vector2d::Zero();
  double sumW2 = 0.0;
  for (const auto& [p, w] : pts) {
    s.min = s.min.cwiseMin(p);
    s.max = s.max.cwiseMax(p);
    mean += w * p;
    sumW2 += w * w;
  }
  // The weights sum to 1 only up to rounding, so the mean of coincident points can miss
  // their common value by an ulp (giving sd 4e-16 instead of 0, and a different answer at
  // each optimisation level); it lies within [min, max] by definition.
  mean = mean.cwiseMax(s.min).cwiseMin(s.max);
  // Deviations divided by a power of two near the spread before squaring, so that
  // coordinates near 1e±200 neither overflow nor underflow in the square.
  for (int axis = 0; axis < 2; ++axis) {
    const double spread = s.max(axis) - s.min(axis);
    if (!(spread > 0)) {
      s.sd(axis) = 0.0;  // every point on one line x = const (or one location)
      continue;
    }
    const double unit = std::ldexp(1.0, std::ilogb(spread));
    double var = 0.0;
    for (const auto& [p, w] : pts) {
      const double d = (p(axis) - mean(axis)) / unit;
      var += w * d * d;
    }
    s.sd(axis) = std::sqrt(var) * unit;
  }
  s.effectiveSize = 1.0 / sumW2;
  for (int axis = 0; axis < 2; ++axis) {
    std::vector<std::pair<double, double>> col;
    col.reserve(pts.size());
    for (const auto& [p, w] : pts) col.push_back({p(axis), w});
    std::sort(col.begin(), col.end());
    s.iqr(axis) = weightedQuantile(col, 0.75) - weightedQuantile(col, 0.25);
  }
  return s;
}

}  // namespace barrow
