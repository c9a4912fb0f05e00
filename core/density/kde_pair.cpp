#include "density/kde_pair.h"

#include <cmath>
#include <limits>
#include <optional>

namespace barrow {

namespace {

// The box of the points of positive weight of both clouds.
void positiveBox(const Cloud& a, const Cloud& b, Eigen::Vector2d* lo, Eigen::Vector2d* hi) {
  *lo = Eigen::Vector2d::Constant(std::numeric_limits<double>::infinity());
  *hi = -*lo;
  for (const Cloud* c : {&a, &b})
    for (Eigen::Index i = 0; i < c->size(); ++i)
      if (c->weights(i) > 0) {
        *lo = lo->cwiseMin(c->point(i));
        *hi = hi->cwiseMax(c->point(i));
      }
}

}  // namespace

KdePairGrid evaluateKdePair(const Cloud& a, const Cloud& b, const Eigen::Vector2d& s,
                            const KdeGridOptions& opt, ExactLogs exact, const RunControl* ctl) {
  KdePairGrid out;
  out.s = s;
  Eigen::Vector2d lo, hi;
  positiveBox(a, b, &lo, &hi);
  out.grid = makeKdeGrid(lo, hi, s, opt);
  const KdeGrid& g = out.grid;
  const std::size_t cells = std::size_t(g.cells());
  std::vector<double> da(cells, 0.0), db(cells, 0.0);
  if (!addKdeOnGrid(a, s, g, opt.window, da, ctl, 0.0, 0.3) ||
      !addKdeOnGrid(b, s, g, opt.window, db, ctl, 0.3, 0.6)) {
    out.cancelled = true;
    return out;
  }
  const double threshold = std::exp(-25.0) / (2.0 * M_PI * s.x() * s.y());
  out.logA.resize(cells);
  out.logB.resize(cells);
  out.included.assign(cells, 0);
  std::optional<UncutLogKde> exactA, exactB;
  if (exact.a) exactA.emplace(a, s, g.x);
  if (exact.b) exactB.emplace(b, s, g.x);
  for (int iy = 0; iy < g.y.count; ++iy) {
    if ((iy & 15) == 0 && ctl && ctl->shouldStop(0.6 + 0.4 * double(iy) / g.y.count)) {
      out.cancelled = true;
      return out;
    }
    const double y = g.y.at(iy);
    if (exactA) exactA->beginRow(y);
    if (exactB) exactB->beginRow(y);
    for (int ix = 0; ix < g.x.count; ++ix) {
      const std::size_t c = std::size_t(iy) * std::size_t(g.x.count) + std::size_t(ix);
      const bool nearA = da[c] >= threshold, nearB = db[c] >= threshold;
      if (!nearA && !nearB) {
        // Outside the integration region, but the signs of f_A − f_B still matter to TV.
        out.logA[c] = std::log(da[c]);
        out.logB[c] = std::log(db[c]);
        continue;
      }
      out.included[c] = 1;
      const bool fullA = exact.a && !nearA, fullB = exact.b && !nearB;
      out.logA[c] = fullA ? exactA->at(ix) : std::log(da[c]);
      out.logB[c] = fullB ? exactB->at(ix) : std::log(db[c]);
      out.exactNodes += fullA + fullB;
    }
  }
  return out;
}

}  // namespace barrow
