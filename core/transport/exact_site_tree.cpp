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
  const bool envelopes = cost_.kind() != CostKind::Power;
  for (std::size_t k = nodes_.size(); k-- > 0;) {
    Node& nd = nodes_[k];
    if (nd.left < 0) {
      nd.maxV = *std::max_element(v_.begin() + nd.begin, v_.begin() + nd.end);
    } else {
      nd.maxV = std::max(nodes_[std::size_t(nd.left)].maxV, nodes_[std::size_t(nd.right)].maxV);
    }
    if (envelopes) fitEnvelope(nd);
  }
}

// Least-squares slope of v over the box's sites, with a ridge of 1e-9 of the spread so that
// collinear sites get the slope along their line and coincident ones none; then the
// intercept that puts every site on or below the plane. Any slope gives a valid bound.
void SiteTree::fitEnvelope(Node& nd) const {
  const double ox = 0.5 * (nd.lo[0] + nd.hi[0]), oy = 0.5 * (nd.lo[1] + nd.hi[1]);
  const double cnt = double(nd.end - nd.begin);
  double mx = 0, my = 0, mv = 0;
  for (int t = nd.begin; t < nd.end; ++t) mx += x_[std::size_t(t)] - ox, my += y_[std::size_t(t)] - oy, mv += v_[std::size_t(t)];
  mx /= cnt, my /= cnt, mv /= cnt;
  double sxx = 0, sxy = 0, syy = 0, sxv = 0, syv = 0, absV = 0;
  for (int t = nd.begin; t < nd.end; ++t) {
    const double dx = x_[std::size_t(t)] - ox - mx, dy = y_[std::size_t(t)] - oy - my, dv = v_[std::size_t(t)] - mv;
    sxx += dx * dx, sxy += dx * dy, syy += dy * dy, sxv += dx * dv, syv += dy * dv;
    absV = std::max(absV, std::abs(v_[std::size_t(t)]));
  }
  const double ridge = 1e-9 * (sxx + syy);
  sxx += ridge, syy += ridge;
  const double det = sxx * syy - sxy * sxy;
  double bx = 0, by = 0;
  if (det > 0) {
    bx = (syy * sxv - sxy * syv) / det;
    by = (sxx * syv - sxy * sxv) / det;
  }
  if (!std::isfinite(bx) || !std::isfinite(by)) bx = by = 0;
  double top = -INFINITY;
  for (int t = nd.begin; t < nd.end; ++t)
    top = std::max(top, v_[std::size_t(t)] - bx * (x_[std::size_t(t)] - ox) - by * (y_[std::size_t(t)] - oy));
  nd.slope[0] = bx, nd.slope[1] = by, nd.top = top;
  const double widths = (nd.hi[0] - nd.lo[0]) + (nd.hi[1] - nd.lo[1]);
  nd.size = std::abs(top) + absV + (std::abs(bx) + std::abs(by)) * widths + std::abs(ox) + std::abs(oy) + widths;
}

// The affine-envelope bound of the header (p = 1 or 2), lowered by the rounding margin.
double SiteTree::envelopeBound(const Node& nd, double qx, double qy) const {
  constexpr double kMargin = 1e-12;
  const double ox = 0.5 * (nd.lo[0] + nd.hi[0]), oy = 0.5 * (nd.lo[1] + nd.hi[1]);
  const double bx = nd.slope[0], by = nd.slope[1];
  const double rx = qx - ox, ry = qy - oy;  // q − o
  const double tilt = bx * rx + by * ry;    // b·(q − o)
  const double reach = nd.size + std::abs(qx) + std::abs(qy) + std::abs(bx) + std::abs(by);
  if (cost_.kind() == CostKind::Squared) {
    const double px = qx + 0.5 * bx, py = qy + 0.5 * by;
    const double dx = std::max({nd.lo[0] - px, 0.0, px - nd.hi[0]});
    const double dy = std::max({nd.lo[1] - py, 0.0, py - nd.hi[1]});
    return dx * dx + dy * dy - tilt - 0.25 * (bx * bx + by * by) - nd.top - kMargin * (reach * reach + reach);
  }
  const double len = std::sqrt(rx * rx + ry * ry);
  if (!(len > 0)) return -INFINITY;
  const double inv = 1.0 / len;
  const double wx = -rx * inv - bx, wy = -ry * inv - by;  // e − b, e = (o − q)/|o − q|
  const double low = (wx > 0 ? wx * (nd.lo[0] - qx) : wx * (nd.hi[0] - qx)) +
                     (wy > 0 ? wy * (nd.lo[1] - qy) : wy * (nd.hi[1] - qy));
  return low - tilt - nd.top - kMargin * reach * (2.0 + std::abs(bx) + std::abs(by));
}

double SiteTree::bound(const Node& nd, double qx, double qy, double threshold) const {
  const double dx = std::max({nd.lo[0] - qx, 0.0, qx - nd.hi[0]});
  const double dy = std::max({nd.lo[1] - qy, 0.0, qy - nd.hi[1]});
  const double near = cost_.fromSquared(dx * dx + dy * dy) - nd.maxV;
  // The envelope pays for boxes apart from q; for one around q the distance bound is as good.
  if (cost_.kind() == CostKind::Power || near >= threshold || dx + dy == 0) return near;
  return std::max(near, envelopeBound(nd, qx, qy));
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
  bounds[top++] = bound(nodes_[0], qx, qy, threshold);
  while (top > 0) {
    --top;
    if (!enter(bounds[top])) continue;
    const Node& nd = nodes_[std::size_t(stack[top])];
    if (nd.left < 0) {
      leaf(nd.begin, nd.end);
      continue;
    }
    const double bl = bound(nodes_[std::size_t(nd.left)], qx, qy, threshold);
    const double br = bound(nodes_[std::size_t(nd.right)], qx, qy, threshold);
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
