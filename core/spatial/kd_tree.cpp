#include "spatial/kd_tree.h"

#include <algorithm>
#include <cmath>
#include <limits>
#include <numeric>

namespace barrow {

KdTree::KdTree(const Eigen::MatrixX2d& points) {
  const Eigen::Index n = points.rows();
  index_.resize(std::size_t(n));
  std::iota(index_.begin(), index_.end(), Eigen::Index(0));
  x_.resize(std::size_t(n));
  y_.resize(std::size_t(n));
  for (Eigen::Index i = 0; i < n; ++i) {
    x_[std::size_t(i)] = points(i, 0);
    y_[std::size_t(i)] = points(i, 1);
  }
  if (n > 0) {
    nodes_.reserve(std::size_t(2 * n / kLeafSize + 2));
    build(0, n);
  }
  // Store coordinates in tree order so that leaf scans read contiguous memory.
  std::vector<double> xs(static_cast<std::size_t>(n)), ys(static_cast<std::size_t>(n));
  for (Eigen::Index t = 0; t < n; ++t) {
    xs[std::size_t(t)] = points(index_[std::size_t(t)], 0);
    ys[std::size_t(t)] = points(index_[std::size_t(t)], 1);
  }
  x_.swap(xs);
  y_.swap(ys);
}

Eigen::Index KdTree::build(Eigen::Index begin, Eigen::Index end) {
  Node node{};
  node.begin = begin;
  node.end = end;
  node.lo[0] = node.lo[1] = std::numeric_limits<double>::infinity();
  node.hi[0] = node.hi[1] = -std::numeric_limits<double>::infinity();
  for (Eigen::Index t = begin; t < end; ++t) {
    const auto i = std::size_t(index_[std::size_t(t)]);
    node.lo[0] = std::min(node.lo[0], x_[i]);
    node.hi[0] = std::max(node.hi[0], x_[i]);
    node.lo[1] = std::min(node.lo[1], y_[i]);
    node.hi[1] = std::max(node.hi[1], y_[i]);
  }
  const auto id = Eigen::Index(nodes_.size());
  nodes_.push_back(node);
  if (end - begin <= kLeafSize) return id;
  const int axis = (node.hi[0] - node.lo[0]) >= (node.hi[1] - node.lo[1]) ? 0 : 1;
  const std::vector<double>& c = axis == 0 ? x_ : y_;
  const Eigen::Index mid = begin + (end - begin) / 2;
  std::nth_element(index_.begin() + begin, index_.begin() + mid, index_.begin() + end,
                   [&](Eigen::Index p, Eigen::Index q) { return c[std::size_t(p)] < c[std::size_t(q)]; });
  const Eigen::Index l = build(begin, mid);
  const Eigen::Index r = build(mid, end);
  nodes_[std::size_t(id)].left = l;
  nodes_[std::size_t(id)].right = r;
  return id;
}

// Depth-first search, nearer child first, pruning boxes that cannot hold a point strictly
// closer than bound2 (squared). Pruning at equality matters: a query onto many coincident
// points would otherwise visit every one of them.
// `visit(d2, t)` sees each candidate point at tree position t and may lower bound2.
template <class Visit>
void KdTree::search(const Eigen::Vector2d& q, double& bound2, Visit&& visit) const {
  if (nodes_.empty()) return;
  auto boxDist2 = [&](const Node& nd) {
    const double dx = std::max({nd.lo[0] - q.x(), 0.0, q.x() - nd.hi[0]});
    const double dy = std::max({nd.lo[1] - q.y(), 0.0, q.y() - nd.hi[1]});
    return dx * dx + dy * dy;
  };
  Eigen::Index stack[128];
  int top = 0;
  stack[top++] = 0;
  while (top > 0) {
    const Node& nd = nodes_[std::size_t(stack[--top])];
    // At bound +inf nothing is pruned: a box whose squared distance overflowed may still
    // hold the only candidates.
    const double box2 = boxDist2(nd);
    if (box2 >= bound2 && bound2 != std::numeric_limits<double>::infinity()) continue;
    if (nd.left < 0) {
      for (Eigen::Index t = nd.begin; t < nd.end; ++t) {
        const double dx = x_[std::size_t(t)] - q.x(), dy = y_[std::size_t(t)] - q.y();
        visit(dx * dx + dy * dy, t);
      }
      continue;
    }
    const double dl = boxDist2(nodes_[std::size_t(nd.left)]);
    const double dr = boxDist2(nodes_[std::size_t(nd.right)]);
    // Push the farther child first so the nearer one is searched first.
    if (dl <= dr) {
      stack[top++] = nd.right;
      stack[top++] = nd.left;
    } else {
      stack[top++] = nd.left;
      stack[top++] = nd.right;
    }
  }
}

std::pair<double, Eigen::Index> KdTree::nearest(const Eigen::Vector2d& q, Eigen::Index exclude) const {
  double best2 = std::numeric_limits<double>::infinity();
  Eigen::Index best = -1, bestT = -1;
  search(q, best2, [&](double d2, Eigen::Index t) {
    const Eigen::Index i = index_[std::size_t(t)];
    if (i == exclude) return;
    // `best < 0`: take the first candidate even when its squared distance overflowed to
    // +inf, so that the index is always a row (it was -1 when every square overflowed).
    if (d2 < best2 || best < 0) {
      best2 = d2;
      best = i;
      bestT = t;
    }
  });
  if (best < 0) return {std::numeric_limits<double>::infinity(), best};
  // Where the square underflowed or overflowed, the distance itself from hypot.
  if (best2 >= std::numeric_limits<double>::min() && best2 < std::numeric_limits<double>::infinity())
    return {std::sqrt(best2), best};
  return {std::hypot(x_[std::size_t(bestT)] - q.x(), y_[std::size_t(bestT)] - q.y()), best};
}

std::vector<std::pair<double, Eigen::Index>> KdTree::knn(const Eigen::Vector2d& q, int k,
                                                         Eigen::Index exclude) const {
  // Sorted list of the best k (d2, index); k is small, so insertion sort is cheapest.
  std::vector<std::pair<double, Eigen::Index>> best;
  if (k <= 0) return best;
  best.reserve(std::size_t(k) + 1);
  double bound2 = std::numeric_limits<double>::infinity();
  search(q, bound2, [&](double d2, Eigen::Index t) {
    const Eigen::Index i = index_[std::size_t(t)];
    if (i == exclude) return;
    const std::pair<double, Eigen::Index> cand{d2, i};
    if (int(best.size()) == k && !(cand < best.back())) return;
    best.insert(std::upper_bound(best.begin(), best.end(), cand), cand);
    if (int(best.size()) > k) best.pop_back();
    if (int(best.size()) == k) bound2 = best.back().first;
  });
  for (auto& b : best) b.first = std::sqrt(b.first);
  return best;
}

double KdTree::kthDistance(const Eigen::Vector2d& q, int k, Eigen::Index exclude) const {
  const auto nn = knn(q, k, exclude);
  return nn.size() < std::size_t(k) ? std::numeric_limits<double>::infinity() : nn.back().first;
}

}  // namespace barrow
