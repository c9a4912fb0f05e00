#include "spatial/cloud_quantiser.h"

#include <algorithm>
#include <cmath>
#include <queue>
#include <utility>

namespace barrow {

namespace {

struct Cell {
  Eigen::Index begin = 0, end = 0;  // range of the order array
  double mass = 0.0;
  double mx = 0.0, my = 0.0;        // weighted mean
  double vx = 0.0, vy = 0.0;        // weighted sums of squared deviations per axis
  double spread() const { return vx + vy; }
};

// Two passes (mean, then deviations) so that a cell far from the origin keeps its digits.
Cell describe(Eigen::Index begin, Eigen::Index end, const std::vector<Eigen::Index>& order,
              const Eigen::MatrixX2d& p, const Eigen::VectorXd& w) {
  Cell c;
  c.begin = begin;
  c.end = end;
  double sx = 0.0, sy = 0.0;
  for (Eigen::Index k = begin; k < end; ++k) {
    const Eigen::Index i = order[std::size_t(k)];
    c.mass += w(i);
    sx += w(i) * p(i, 0);
    sy += w(i) * p(i, 1);
  }
  c.mx = sx / c.mass;
  c.my = sy / c.mass;
  // A cell of one position gets that position exactly (w·x / w may be an ulp off), so a
  // cloud of repeated points is quantised without error, exactly 0.
  bool onePosition = true;
  const Eigen::Index first = order[std::size_t(begin)];
  for (Eigen::Index k = begin; k < end && onePosition; ++k) {
    const Eigen::Index i = order[std::size_t(k)];
    onePosition = p(i, 0) == p(first, 0) && p(i, 1) == p(first, 1);
  }
  if (onePosition) {
    c.mx = p(first, 0);
    c.my = p(first, 1);
    return c;
  }
  for (Eigen::Index k = begin; k < end; ++k) {
    const Eigen::Index i = order[std::size_t(k)];
    const double dx = p(i, 0) - c.mx, dy = p(i, 1) - c.my;
    c.vx += w(i) * dx * dx;
    c.vy += w(i) * dy * dy;
  }
  return c;
}

}  // namespace

double Quantisation::errorBound(int p) const { return p == 1 ? cost1 : std::sqrt(cost2); }

Quantisation quantiseCloud(const Cloud& c, Eigen::Index cells, const RunControl* control) {
  Quantisation q;
  const Eigen::VectorXd w = c.normalizedWeights();
  const Eigen::MatrixX2d& p = c.points;
  std::vector<Eigen::Index> order;
  order.reserve(std::size_t(c.size()));
  for (Eigen::Index i = 0; i < c.size(); ++i)
    if (w(i) > 0) order.push_back(i);
  std::vector<Cell> done;
  auto worse = [](const Cell& x, const Cell& y) { return x.spread() < y.spread(); };
  std::priority_queue<Cell, std::vector<Cell>, decltype(worse)> open(worse);
  open.push(describe(0, Eigen::Index(order.size()), order, p, w));
  cells = std::max<Eigen::Index>(cells, 1);
  Eigen::Index checks = 0;
  while (Eigen::Index(open.size()) + Eigen::Index(done.size()) < cells && !open.empty()) {
    if ((++checks & 1023) == 0 && control && control->shouldStop()) {
      q.cancelled = true;
      return q;
    }
    Cell top = open.top();
    open.pop();
    if (!(top.spread() > 0)) {  // coincident points: nothing left to cut anywhere worse
      done.push_back(top);
      continue;
    }
    const int axis = top.vx >= top.vy ? 0 : 1;
    const double cut = axis == 0 ? top.mx : top.my;
    auto first = order.begin() + top.begin, last = order.begin() + top.end;
    auto mid = std::partition(first, last, [&](Eigen::Index i) { return p(i, axis) < cut; });
    if (mid == first || mid == last) {  // spread below rounding on that axis: keep the cell whole
      done.push_back(top);
      continue;
    }
    const Eigen::Index split = Eigen::Index(mid - order.begin());
    open.push(describe(top.begin, split, order, p, w));
    open.push(describe(split, top.end, order, p, w));
  }
  while (!open.empty()) {
    done.push_back(open.top());
    open.pop();
  }
  const Eigen::Index k = Eigen::Index(done.size());
  Eigen::MatrixX2d reps(k, 2);
  Eigen::VectorXd mass(k);
  q.cellOf.assign(std::size_t(c.size()), -1);
  q.cellDistance = Eigen::VectorXd::Zero(k);
  q.cellSquare = Eigen::VectorXd::Zero(k);
  for (Eigen::Index r = 0; r < k; ++r) {
    const Cell& cell = done[std::size_t(r)];
    reps(r, 0) = cell.mx;
    reps(r, 1) = cell.my;
    mass(r) = cell.mass;
    for (Eigen::Index t = cell.begin; t < cell.end; ++t) {
      const Eigen::Index i = order[std::size_t(t)];
      q.cellOf[std::size_t(i)] = r;
      const double dx = p(i, 0) - cell.mx, dy = p(i, 1) - cell.my;
      const double d2 = dx * dx + dy * dy;
      q.cellDistance(r) += w(i) * std::sqrt(d2);
      q.cellSquare(r) += w(i) * d2;
    }
    q.cost1 += q.cellDistance(r);
    q.cost2 += q.cellSquare(r);
    q.cellDistance(r) /= cell.mass;
    q.cellSquare(r) /= cell.mass;
  }
  q.representatives = Cloud(c.name, std::move(reps), std::move(mass));
  return q;
}

}  // namespace barrow
