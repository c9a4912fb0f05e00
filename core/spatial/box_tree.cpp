#include "spatial/box_tree.h"

#include <algorithm>
#include <limits>
#include <numeric>

namespace barrow {

BoxTree::BoxTree(const Eigen::MatrixX2d& points, int leafSize) : order_(points.rows()) {
  std::iota(order_.begin(), order_.end(), 0);
  nodes_.reserve(std::size_t(2 * points.rows() / std::max(1, leafSize) + 2));
  if (points.rows() > 0) build(points, 0, int(points.rows()), std::max(1, leafSize));
}

int BoxTree::build(const Eigen::MatrixX2d& points, int begin, int end, int leafSize) {
  Node node;
  node.begin = begin;
  node.end = end;
  node.lo[0] = node.lo[1] = std::numeric_limits<double>::infinity();
  node.hi[0] = node.hi[1] = -std::numeric_limits<double>::infinity();
  for (int k = begin; k < end; ++k)
    for (int d = 0; d < 2; ++d) {
      node.lo[d] = std::min(node.lo[d], points(order_[k], d));
      node.hi[d] = std::max(node.hi[d], points(order_[k], d));
    }
  const int id = int(nodes_.size());
  nodes_.push_back(node);
  if (end - begin <= leafSize) return id;
  const int axis = node.hi[0] - node.lo[0] >= node.hi[1] - node.lo[1] ? 0 : 1;
  const int mid = begin + (end - begin) / 2;
  std::nth_element(order_.begin() + begin, order_.begin() + mid, order_.begin() + end,
                   [&](int i, int j) { return points(i, axis) < points(j, axis); });
  const int left = build(points, begin, mid, leafSize);
  const int right = build(points, mid, end, leafSize);
  nodes_[id].left = left;
  nodes_[id].right = right;
  return id;
}

std::vector<double> BoxTree::nodeMaxima(const Eigen::VectorXd& values) const {
  std::vector<double> best(nodes_.size());
  // Children come after their parent, so a backward sweep sees them first.
  for (int k = int(nodes_.size()) - 1; k >= 0; --k) {
    const Node& n = nodes_[k];
    if (n.left < 0) {
      double m = -std::numeric_limits<double>::infinity();
      for (int t = n.begin; t < n.end; ++t) m = std::max(m, values(order_[t]));
      best[k] = m;
    } else {
      best[k] = std::max(best[n.left], best[n.right]);
    }
  }
  return best;
}

double BoxTree::boxDistance2(const Node& node, double qx, double qy) {
  const double dx = std::max({node.lo[0] - qx, 0.0, qx - node.hi[0]});
  const double dy = std::max({node.lo[1] - qy, 0.0, qy - node.hi[1]});
  return dx * dx + dy * dy;
}

}  // namespace barrow
