#include "density/kde_grid.h"

#include <algorithm>
#include <cmath>

namespace barrow {

namespace {

GridAxis axisFor(double lo, double hi, double s, double q, double margin) {
  GridAxis a;
  a.step = s / q;
  a.start = lo - margin * s;
  const double span = hi - lo + 2.0 * margin * s;
  a.count = int(std::ceil(span / a.step)) + 1;
  if (a.count % 2 == 0) ++a.count;
  return a;
}

}  // namespace

KdeGrid makeKdeGrid(const Eigen::Vector2d& lo, const Eigen::Vector2d& hi, const Eigen::Vector2d& s,
                    const KdeGridOptions& opt) {
  // Nodes needed at q per bandwidth: about (span_x/s_x·q)(span_y/s_y·q); solve for the largest
  // q within the budget (in doubles first: a tiny bandwidth must not overflow an int).
  const double ux = (hi.x() - lo.x()) / s.x() + 2.0 * opt.margin;
  const double uy = (hi.y() - lo.y()) / s.y() + 2.0 * opt.margin;
  double q = opt.nodesPerBandwidth;
  const double budget = double(opt.maxCells);
  if ((ux * q + 2) * (uy * q + 2) > budget) q = std::sqrt(budget / (ux * uy)) * 0.98;
  // An axis has at least 3 nodes, so the other may have at most budget/3.
  q = std::min(q, budget / 3.0 / std::max(ux, uy));
  KdeGrid g;
  for (;; q *= 0.95) {
    g.x = axisFor(lo.x(), hi.x(), s.x(), q, opt.margin);
    g.y = axisFor(lo.y(), hi.y(), s.y(), q, opt.margin);
    if (g.cells() <= opt.maxCells) break;
  }
  g.nodesPerBandwidth = q;
  return g;
}

bool addKdeOnGrid(const Cloud& c, const Eigen::Vector2d& s, const KdeGrid& g, double window,
                  std::vector<double>& density, const RunControl* ctl, double p0, double p1) {
  const Eigen::VectorXd w = c.normalizedWeights();
  const double norm = 1.0 / (2.0 * M_PI * s.x() * s.y());
  std::vector<double> kx, ky;
  auto range = [&](const GridAxis& a, double centre, double sd, int* first, int* last) {
    const double lo = std::ceil((centre - window * sd - a.start) / a.step);
    const double hi = std::floor((centre + window * sd - a.start) / a.step);
    *first = int(std::clamp(lo, 0.0, double(a.count - 1)));
    *last = int(std::clamp(hi, -1.0, double(a.count - 1)));
  };
  auto fill = [](const GridAxis& a, int first, int last, double centre, double sd, std::vector<double>& k) {
    k.resize(std::size_t(std::max(0, last - first + 1)));
    for (int t = first; t <= last; ++t) {
      const double u = (a.at(t) - centre) / sd;
      k[std::size_t(t - first)] = std::exp(-0.5 * u * u);
    }
  };
  const Eigen::Index n = c.size();
  for (Eigen::Index i = 0; i < n; ++i) {
    if ((i & 255) == 0 && ctl && ctl->shouldStop(p0 + (p1 - p0) * double(i) / double(n))) return false;
    if (!(w(i) > 0)) continue;
    int x0, x1, y0, y1;
    range(g.x, c.points(i, 0), s.x(), &x0, &x1);
    range(g.y, c.points(i, 1), s.y(), &y0, &y1);
    if (x1 < x0 || y1 < y0) continue;
    fill(g.x, x0, x1, c.points(i, 0), s.x(), kx);
    fill(g.y, y0, y1, c.points(i, 1), s.y(), ky);
    const double coef = w(i) * norm;
    // In node units: the point's x, the spacing of rows in bandwidths, nodes per x-bandwidth.
    const double cx = (c.points(i, 0) - g.x.start) / g.x.step;
    const double rowStep = g.y.step / s.y(), perBandwidth = s.x() / g.x.step;
    double v = (g.y.at(y0) - c.points(i, 1)) / s.y();
    for (int iy = y0; iy <= y1; ++iy, v += rowStep) {
      // The disc's half-width on this row, in nodes, clipped to the square window.
      const double half = std::sqrt(std::max(0.0, window * window - v * v)) * perBandwidth;
      const int r0 = std::max(x0, int(std::ceil(cx - half)));
      const int r1 = std::min(x1, int(std::floor(cx + half)));
      const double cy = coef * ky[std::size_t(iy - y0)];
      if (r1 < r0) continue;
      double* row = density.data() + std::size_t(iy) * std::size_t(g.x.count) + r0;
      Eigen::Map<Eigen::ArrayXd>(row, r1 - r0 + 1) +=
          cy * Eigen::Map<const Eigen::ArrayXd>(kx.data() + (r0 - x0), r1 - r0 + 1);
    }
  }
  return true;
}

UncutLogKde::UncutLogKde(const Cloud& c, const Eigen::Vector2d& s, const GridAxis& x) : s_(s), axis_(&x) {
  const Eigen::VectorXd w = c.normalizedWeights();
  const Eigen::Index m = (w.array() > 0).count();
  x_.resize(m);
  y_.resize(m);
  logWeight_.resize(m);
  const double logNorm = -std::log(2.0 * M_PI * s.x() * s.y());
  Eigen::Index k = 0;
  for (Eigen::Index i = 0; i < c.size(); ++i) {
    if (!(w(i) > 0)) continue;
    x_(k) = c.points(i, 0);
    y_(k) = c.points(i, 1);
    logWeight_(k) = std::log(w(i)) + logNorm;
    ++k;
  }
  if (double(m) * x.count > kMaxCachedKernels) return;  // too large to keep: exps per node
  kx_.resize(m, x.count);
  for (int ix = 0; ix < x.count; ++ix)
    kx_.col(ix) = (-0.5 * ((x_ - x.at(ix)) / s.x()).square()).exp().matrix();
}

void UncutLogKde::beginRow(double y) {
  rowY_ = y;
  row_ = (logWeight_ - 0.5 * ((y_ - y) / s_.y()).square()).exp().matrix();
}

double UncutLogKde::at(int ix) const {
  const double x = axis_->at(ix);
  const double f = kx_.size() > 0 ? kx_.col(ix).dot(row_)
                                  : ((-0.5 * ((x_ - x) / s_.x()).square()).exp() * row_.array()).sum();
  if (f > 1e-280) return std::log(f);
  const Eigen::ArrayXd e = logWeight_ - 0.5 * (((x_ - x) / s_.x()).square() + ((y_ - rowY_) / s_.y()).square());
  const double top = e.maxCoeff();
  return top + std::log((e - top).exp().sum());
}

}  // namespace barrow
