#include "transport/exact_site_tree.h"

#include <algorithm>
#include <cmath>
#include <numeric>

namespace barrow {

SiteTree::SiteTree(const Eigen::Ref<const Eigen::ArrayXd>& x, const Eigen::Ref<const Eigen::ArrayXd>& y,
                   GroundCost cost)
    : cost_(cost) {
  const auto n = std::size_t(x.size());
  site_.resize(n);
  std::iota(site_.begin(), site_.end(), 0);
  x_.assign(x.data(), x.data() + n);
  y_.assign(y.data(), y.data() + n);
  nodes_.reserve(4 * n / kLeafSize + 2);
  build(0, int(n));
  std::vector<double> xs(n), ys(n);
  for (std::size_t t = 0; t < n; ++t) {
    xs[t] = x(site_[t]);
    ys[t] = y(site_[t]);
  }
  x_.swap(xs);
  y_.swap(ys);
  v_.assign(n, 0.0);
}

int SiteTree::build(int begin, int end) {
  Node nd;
  nd.begin = begin;
  nd.end = end;
  nd.lo[0] = nd.lo[1] = INFINITY;
  nd.hi[0] = nd.hi[1] = -INFINITY;
  for (int t = begin; t < end; ++t) {
    const auto j = std::size_t(site_[std::size_t(t)]);
    nd.lo[0] = std::min(nd.lo[0], x_[j]), nd.hi[0] = std::max(nd.hi[0], x_[j]);
    nd.lo[1] = std::min(nd.lo[1], y_[j]), nd.hi[1] = std::max(nd.hi[1], y_[j]);
  }
  const int id = int(nodes_.size());
  nodes_.push_back(nd);
  if (end - begin <= kLeafSize) return id;
  const std::vector<double>& axis = nd.hi[0] - nd.lo[0] >= nd.hi[1] - nd.lo[1] ? x_ : y_;
  const int mid = begin + (end - begin) / 2;
  std::nth_element(site_.begin() + begin, site_.begin() + mid, site_.begin() + end,
                   [&](int p, int q) { return axis[std::size_t(p)] < axis[std::size_t(q)]; });
  const int l = build(begin, mid);
  const int r = build(mid, end);
  nodes_[std::size_t(id)].left = l;
  nodes_[std::size_t(id)].right = r;
  return id;
}

void SiteTree::setPotentials(const Eigen::Ref<const Eigen::ArrayXd>& v) {
  for (std::size_t t = 0; t < v_.size(); ++t) v_[t] = v(site_[t]);
  for (std::size_t k = nodes_.size(); k-- > 0;) {
    Node& nd = nodes_[k];
    if (nd.left < 0) {
      nd.maxV = *std::max_element(v_.begin() + nd.begin, v_.begin() + nd.end);
    } else {
      nd.maxV = std::max(nodes_[std::size_t(nd.left)].maxV, nodes_[std::size_t(nd.right)].maxV);
    }
  }
}

double SiteTree::bound(const Node& nd, double qx, double qy) const {
  const double dx = std::max({nd.lo[0] - qx, 0.0, qx - nd.hi[0]});
  const double dy = std::max({nd.lo[1] - qy, 0.0, qy - nd.hi[1]});
  return cost_.fromSquared(dx * dx + dy * dy) - nd.maxV;
}

// Depth first, nearer (lower bound) child first; a node is entered while its bound is below
// `threshold` (or equal to it when `inclusive`). `threshold` may fall as leaves are scanned.
template <class Leaf>
void SiteTree::search(double qx, double qy, const double& threshold, bool inclusive, Leaf&& leaf) const {
  if (nodes_.empty()) return;
  auto enter = [&](double b) { return inclusive ? b <= threshold : b < threshold; };
  int stack[128];
  double bounds[128];
  int top = 0;
  stack[top] = 0;
  bounds[top++] = bound(nodes_[0], qx, qy);
  while (top > 0) {
    --top;
    if (!enter(bounds[top])) continue;
    const Node& nd = nodes_[std::size_t(stack[top])];
    if (nd.left < 0) {
      leaf(nd.begin, nd.end);
      continue;
    }
    const double bl = bound(nodes_[std::size_t(nd.left)], qx, qy);
    const double br = bound(nodes_[std::size_t(nd.right)], qx, qy);
    const bool leftFirst = bl <= br;
    stack[top] = leftFirst ? nd.right : nd.left;
    bounds[top++] = leftFirst ? br : bl;
    stack[top] = leftFirst ? nd.left : nd.right;
    bounds[top++] = leftFirst ? bl : br;
  }
}

double SiteTree::minScore(double qx, double qy) const {
  double best = INFINITY;
  search(qx, qy, best, false, [&](int begin, int end) {
    for (int t = begin; t < end; ++t) best = std::min(best, score(t, qx, qy));
  });
  return best;
}

void SiteTree::below(double qx, double qy, double limit, int k, std::vector<std::pair<double, int>>* out) const {
  out->clear();
  if (k <= 0) return;
  double threshold = limit;
  search(qx, qy, threshold, false, [&](int begin, int end) {
    for (int t = begin; t < end; ++t) {
      const double s = score(t, qx, qy);
      if (!(s < threshold)) continue;
      const std::pair<double, int> hit{s, site_[std::size_t(t)]};
      out->insert(std::upper_bound(out->begin(), out->end(), hit), hit);
      if (int(out->size()) > k) out->pop_back();
      if (int(out->size()) == k) threshold = out->back().first;
    }
  });
}

double SiteTree::minScore(double qx, double qy, double window, int* ties) const {
  double best = INFINITY, threshold = INFINITY;
  std::vector<double> near;  // scores that were within the window of the best so far
  search(qx, qy, threshold, true, [&](int begin, int end) {
    for (int t = begin; t < end; ++t) {
      const double s = score(t, qx, qy);
      if (!(s <= threshold)) continue;
      near.push_back(s);
      if (s < best) best = s, threshold = s + window;
    }
  });
  *ties = int(std::count_if(near.begin(), near.end(), [&](double s) { return s <= threshold; }));
  return best;
}

}  // namespace barrow
