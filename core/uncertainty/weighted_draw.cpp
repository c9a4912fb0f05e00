#include "uncertainty/weighted_draw.h"

#include <algorithm>
#include <numeric>

namespace barrow {

WeightedSampler::WeightedSampler(const Cloud& c) : cumulative_(std::size_t(c.size())) {
  const Eigen::VectorXd w = c.normalizedWeights();
  double sum = 0.0;
  for (Eigen::Index i = 0; i < w.size(); ++i) cumulative_[std::size_t(i)] = (sum += w[i]);
  // Rounding may leave the total a few ulps from 1: from the last row of positive weight on,
  // the cumulative weight is exactly 1, so every u in [0, 1) lands on a row.
  Eigen::Index last = 0;
  for (Eigen::Index i = 0; i < w.size(); ++i)
    if (w[i] > 0.0) last = i;
  std::fill(cumulative_.begin() + last, cumulative_.end(), 1.0);
}

int WeightedSampler::at(double u) const {
  // First row whose cumulative weight exceeds u: rows of zero weight have an empty interval.
  const auto it = std::upper_bound(cumulative_.begin(), cumulative_.end(), u);
  return int(std::min<std::ptrdiff_t>(it - cumulative_.begin(), std::ptrdiff_t(cumulative_.size()) - 1));
}

int WeightedSampler::draw(ReplicateRng& rng) const { return at(rng.uniform()); }

std::vector<int> drawRows(const WeightedSampler& sampler, int k, ReplicateRng& rng) {
  std::vector<int> rows(std::size_t(std::max(k, 0)));
  for (int& r : rows) r = sampler.draw(rng);
  return rows;
}

Cloud sampleOfRows(const Cloud& c, const std::vector<int>& rows) {
  Eigen::MatrixX2d pts(Eigen::Index(rows.size()), 2);
  for (std::size_t r = 0; r < rows.size(); ++r) pts.row(Eigen::Index(r)) = c.points.row(rows[r]);
  return Cloud(c.name, std::move(pts));
}

Cloud mergedSampleOfRows(const Cloud& c, const std::vector<int>& rows) {
  std::vector<int> count(std::size_t(c.size()), 0);
  for (int r : rows) ++count[std::size_t(r)];
  Eigen::Index distinct = 0;
  for (int n : count) distinct += n > 0;
  Eigen::MatrixX2d pts(distinct, 2);
  Eigen::VectorXd w(distinct);
  Eigen::Index k = 0;
  for (std::size_t i = 0; i < count.size(); ++i)
    if (count[i] > 0) {
      pts.row(k) = c.points.row(Eigen::Index(i));
      w(k++) = double(count[i]);  // counts: normalised at use, exact in double
    }
  return Cloud(c.name, std::move(pts), std::move(w));
}

Cloud drawSample(const Cloud& c, const WeightedSampler& sampler, int k, ReplicateRng& rng) {
  return sampleOfRows(c, drawRows(sampler, k, rng));
}

PooledPair::PooledPair(const Cloud& a, const Cloud& b) : sizeA(a.size()) {
  points.resize(a.size() + b.size(), 2);
  points << a.points, b.points;
  weights.resize(points.rows());
  weights << a.normalizedWeights(), b.normalizedWeights();
}

void PooledPair::split(ReplicateRng& rng, Cloud* a, Cloud* b) const {
  const Eigen::Index n = points.rows();
  std::vector<Eigen::Index> order(static_cast<std::size_t>(n));
  std::iota(order.begin(), order.end(), Eigen::Index(0));
  for (Eigen::Index i = n - 1; i > 0; --i)
    std::swap(order[std::size_t(i)], order[std::size_t(rng.below(std::uint64_t(i + 1)))]);
  const Eigen::Index nb = n - sizeA;
  a->points.resize(sizeA, 2);
  a->weights.resize(sizeA);
  b->points.resize(nb, 2);
  b->weights.resize(nb);
  for (Eigen::Index r = 0; r < n; ++r) {
    const Eigen::Index src = order[std::size_t(r)];
    if (r < sizeA) {
      a->points.row(r) = points.row(src);
      a->weights[r] = weights[src];
    } else {
      b->points.row(r - sizeA) = points.row(src);
      b->weights[r - sizeA] = weights[src];
    }
  }
}

}  // namespace barrow
