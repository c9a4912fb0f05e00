#include "density/kde_tv_rows.h"

#include <algorithm>
#include <cmath>
#include <vector>

namespace barrow {

namespace {

// One cloud's points of positive weight, sorted by y, for the rows' y-windows.
struct RowSource {
  std::vector<double> x, y, w;

  RowSource(const Cloud& c) {
    const Eigen::VectorXd nw = c.normalizedWeights();
    std::vector<Eigen::Index> order;
    for (Eigen::Index i = 0; i < c.size(); ++i)
      if (nw(i) > 0) order.push_back(i);
    std::sort(order.begin(), order.end(), [&](Eigen::Index p, Eigen::Index q) { return c.points(p, 1) < c.points(q, 1); });
    for (Eigen::Index i : order) {
      x.push_back(c.points(i, 0));
      y.push_back(c.points(i, 1));
      w.push_back(nw(i));
    }
  }
};

// The points of one cloud that reach row y (within window·s_y) and their row weights
// w_i φ((y − y_i)/s_y)/s_y, whose sum is the row mass ∫f(x, y) dx.
struct RowWeights {
  std::vector<double> x, k;
  double mass = 0.0;

  void fill(const RowSource& src, double row, double sy, double window) {
    x.clear();
    k.clear();
    mass = 0.0;
    const auto lo = std::lower_bound(src.y.begin(), src.y.end(), row - window * sy) - src.y.begin();
    const auto hi = std::upper_bound(src.y.begin(), src.y.end(), row + window * sy) - src.y.begin();
    for (auto i = lo; i < hi; ++i) {
      const double u = (row - src.y[std::size_t(i)]) / sy;
      const double v = src.w[std::size_t(i)] * std::exp(-0.5 * u * u) / (sy * std::sqrt(2.0 * M_PI));
      x.push_back(src.x[std::size_t(i)]);
      k.push_back(v);
      mass += v;
    }
  }
  // ∫_{−∞}^{r} f(x, row) dx.
  double below(double r, double sx) const {
    double sum = 0.0;
    for (std::size_t i = 0; i < x.size(); ++i) sum += k[i] * 0.5 * std::erfc(-(r - x[i]) / (sx * M_SQRT2));
    return sum;
  }
};

// ∫|f_A − f_B| dx along one row, from the sign changes of d at the nodes ix = 0, stride, ...
double rowIntegral(const std::vector<double>& d, int stride, const GridAxis& ax, const RowWeights& ra,
                   const RowWeights& rb, double sx) {
  double total = 0.0, previousG = 0.0;
  int last = -1;  // last node with d ≠ 0
  for (int ix = 0; ix < int(d.size()); ix += stride) {
    if (d[std::size_t(ix)] == 0.0) continue;
    if (last >= 0 && (d[std::size_t(ix)] > 0) != (d[std::size_t(last)] > 0)) {
      const double dl = d[std::size_t(last)], dr = d[std::size_t(ix)];
      const double r = ax.at(last) + (ax.at(ix) - ax.at(last)) * dl / (dl - dr);
      const double g = ra.below(r, sx) - rb.below(r, sx);
      total += std::abs(g - previousG);
      previousG = g;
    }
    last = ix;
  }
  return total + std::abs((ra.mass - rb.mass) - previousG);
}

}  // namespace

KdeIntegral kdeTotalVariation(const Cloud& a, const Cloud& b, const KdePairGrid& grid, double window,
                              const RunControl* ctl, bool* cancelled) {
  const KdeGrid& g = grid.grid;
  const RowSource sa(a), sb(b);
  RowWeights ra, rb;
  std::vector<double> d(std::size_t(g.x.count));
  double fine = 0.0, coarse = 0.0, massA = 0.0, massB = 0.0;
  *cancelled = false;
  for (int iy = 0; iy < g.y.count; ++iy) {
    if ((iy & 7) == 0 && ctl && ctl->shouldStop(double(iy) / g.y.count)) {
      *cancelled = true;
      return {};
    }
    const double y = g.y.at(iy);
    ra.fill(sa, y, grid.s.y(), window);
    rb.fill(sb, y, grid.s.y(), window);
    for (int ix = 0; ix < g.x.count; ++ix) {
      const std::size_t c = std::size_t(iy) * std::size_t(g.x.count) + std::size_t(ix);
      d[std::size_t(ix)] = std::exp(grid.logA[c]) - std::exp(grid.logB[c]);
    }
    fine += rowIntegral(d, 1, g.x, ra, rb, grid.s.x());
    if (iy % 2 == 0) coarse += rowIntegral(d, 2, g.x, ra, rb, grid.s.x());
    massA += ra.mass;
    massB += rb.mass;
  }
  KdeIntegral r;
  r.value = std::clamp(0.5 * fine * g.y.step, 0.0, 1.0);
  r.coarseValue = std::clamp(0.5 * coarse * 2.0 * g.y.step, 0.0, 1.0);
  r.massA = massA * g.y.step;
  r.massB = massB * g.y.step;
  r.errorEstimate = std::abs(r.value - r.coarseValue) + 0.5 * (std::abs(1 - r.massA) + std::abs(1 - r.massB)) +
                    kRoundingAllowance;
  return r;
}

}  // namespace barrow
