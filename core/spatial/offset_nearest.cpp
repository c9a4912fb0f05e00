#include "spatial/offset_nearest.h"

#include <algorithm>
#include <cmath>
#include <numeric>

namespace barrow {

OffsetNearest::OffsetNearest(const Eigen::MatrixX2d& sites, const Eigen::VectorXd& offsets, int p) : p_(p == 2 ? 2 : 1) {
  const int n = int(sites.rows());
  std::vector<int> order(static_cast<std::size_t>(n));
  std::iota(order.begin(), order.end(), 0);
  x_.resize(order.size());
  y_.resize(order.size());
  c_.resize(order.size());
  for (int i = 0; i < n; ++i) {
    x_[std::size_t(i)] = sites(i, 0);
    y_[std::size_t(i)] = sites(i, 1);
    c_[std::size_t(i)] = offsets(i);
  }
  nodes_.reserve(std::size_t(2 * n / kLeafSize + 2));
  if (n > 0) build(0, n);
}

int OffsetNearest::build(int begin, int end) {
  Node nd;
  nd.begin = begin;
  nd.end = end;
  nd.lo[0] = nd.lo[1] = INFINITY;
  nd.hi[0] = nd.hi[1] = -INFINITY;
  nd.maxOffset = -INFINITY;
  for (int k = begin; k < end; ++k) {
    nd.lo[0] = std::min(nd.lo[0], x_[std::size_t(k)]);
    nd.hi[0] = std::max(nd.hi[0], x_[std::size_t(k)]);
    nd.lo[1] = std::min(nd.lo[1], y_[std::size_t(k)]);
    nd.hi[1] = std::max(nd.hi[1], y_[std::size_t(k)]);
    nd.maxOffset = std::max(nd.maxOffset, c_[std::size_t(k)]);
  }
  const int id = int(nodes_.size());
  nodes_.push_back(nd);
  if (end - begin <= kLeafSize) return id;
  // Median split on the wider axis, moving the three arrays together.
  const int axis = nd.hi[0] - nd.lo[0] >= nd.hi[1] - nd.lo[1] ? 0 : 1;
  std::vector<int> idx(static_cast<std::size_t>(end - begin));
  std::iota(idx.begin(), idx.end(), begin);
  const std::vector<double>& key = axis == 0 ? x_ : y_;
  const int mid = (begin + end) / 2;
  std::nth_element(idx.begin(), idx.begin() + (mid - begin), idx.end(),
                   [&](int a, int b) { return key[std::size_t(a)] < key[std::size_t(b)]; });
  std::vector<double> xs, ys, cs;
  for (int k : idx) {
    xs.push_back(x_[std::size_t(k)]);
    ys.push_back(y_[std::size_t(k)]);
    cs.push_back(c_[std::size_t(k)]);
  }
  std::copy(xs.begin(), xs.end(), x_.begin() + begin);
  std::copy(ys.begin(), ys.end(), y_.begin() + begin);
  std::copy(cs.begin(), cs.end(), c_.begin() + begin);
  const int left = build(begin, mid);
  const int right = build(mid, end);
  nodes_[std::size_t(id)].left = left;
  nodes_[std::size_t(id)].right = right;
  return id;
}

namespace {
// |z − box|^p: the cheapest any site in the box can be before its offset.
double boxCost(const double lo[2], const double hi[2], double x, double y, int p) {
  const double dx = std::max({lo[0] - x, 0.0, x - hi[0]});
  const double dy = std::max({lo[1] - y, 0.0, y - hi[1]});
  const double d2 = dx * dx + dy * dy;
  return p == 2 ? d2 : std::sqrt(d2);
}
}  // namespace

void OffsetNearest::search(int node, double x, double y, double slack, double& best, int& at) const {
  const Node& nd = nodes_[std::size_t(node)];
  if (nd.left < 0) {
    for (int k = nd.begin; k < nd.end; ++k) {
      const double dx = x - x_[std::size_t(k)], dy = y - y_[std::size_t(k)];
      const double d2 = dx * dx + dy * dy;
      const double v = (p_ == 2 ? d2 : std::sqrt(d2)) - c_[std::size_t(k)];
      if (v < best) {
        best = v;
        at = k;
      }
    }
    return;
  }
  const Node& l = nodes_[std::size_t(nd.left)];
  const Node& r = nodes_[std::size_t(nd.right)];
  const double bl = boxCost(l.lo, l.hi, x, y, p_) - l.maxOffset;
  const double br = boxCost(r.lo, r.hi, x, y, p_) - r.maxOffset;
  // Skipped sites are all >= best − slack at the time, hence >= the final best − slack.
  if (bl <= br) {
    if (bl < best - slack) search(nd.left, x, y, slack, best, at);
    if (br < best - slack) search(nd.right, x, y, slack, best, at);
  } else {
    if (br < best - slack) search(nd.right, x, y, slack, best, at);
    if (bl < best - slack) search(nd.left, x, y, slack, best, at);
  }
}

double OffsetNearest::operator()(double x, double y, double slack, int* hint) const {
  if (nodes_.empty()) return INFINITY;
  double best = INFINITY;
  int at = -1;
  if (hint && *hint >= 0 && *hint < int(x_.size())) {
    const std::size_t k = std::size_t(*hint);
    const double d2 = (x - x_[k]) * (x - x_[k]) + (y - y_[k]) * (y - y_[k]);  // as the leaves compute it
    best = (p_ == 2 ? d2 : std::sqrt(d2)) - c_[k];
    at = *hint;
  }
  search(0, x, y, std::max(slack, 0.0), best, at);
  if (hint) *hint = at;
  return best;
}

}  // namespace barrow
