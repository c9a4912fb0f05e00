#include "kernel/binned_pair_sum.h"

#include <algorithm>
#include <cmath>
#include <complex>
#include <limits>
#include <vector>

#include "kernel/grid_fft.h"
#include "kernel/pair_grid.h"

namespace barrow {

namespace {

using Complex = std::complex<double>;
constexpr int kNear = 1;  // cell pairs up to this many cells apart (each axis) are summed exactly

struct Layout {
  Eigen::Vector2d origin;
  double h = 0;
  int nx = 0, ny = 0;  // nodes; cells are (nx - 1) x (ny - 1)
  int px = 0, py = 0;  // FFT size: >= 2 nx - 1, a power of two
  std::size_t wrap(int dx, int dy) const {
    return std::size_t(dy < 0 ? dy + py : dy) * std::size_t(px) + std::size_t(dx < 0 ? dx + px : dx);
  }
};

struct Loc {
  int cx, cy;
  double u, v;  // position inside the cell, in [0, 1]
};

Loc locate(double x, double y, const Layout& g) {
  Loc l;
  l.cx = cellIndex(x, g.origin.x(), g.h, g.nx - 1);
  l.cy = cellIndex(y, g.origin.y(), g.h, g.ny - 1);
  l.u = std::clamp((x - g.origin.x()) / g.h - l.cx, 0.0, 1.0);
  l.v = std::clamp((y - g.origin.y()) / g.h - l.cy, 0.0, 1.0);
  return l;
}

double kernelAt(const PairKernelSpec& k, double dx, double dy) {
  const double d2 = dx * dx + dy * dy;
  return k.kind == PairKernel::Gaussian ? std::exp(-k.gamma * d2) : std::sqrt(d2);
}

// sum_g A_g (T * B)(g) for the three pairings of A = Re z, B = Im z, by Parseval's identity
// (1/P) sum_w conj(A^(w)) T^(w) B^(w); T is real and even, so T^ is real.
struct Triple {
  double aa = 0, bb = 0, ab = 0;
};

Triple parseval(const std::vector<Complex>& z, const std::vector<Complex>& t, const Layout& g) {
  Triple s;
  for (int ky = 0; ky < g.py; ++ky)
    for (int kx = 0; kx < g.px; ++kx) {
      const std::size_t w = std::size_t(ky) * std::size_t(g.px) + std::size_t(kx);
      const Complex zw = z[w], zm = std::conj(z[g.wrap(kx == 0 ? 0 : -kx, ky == 0 ? 0 : -ky)]);
      const Complex fa = 0.5 * (zw + zm), fb = Complex(0, -0.5) * (zw - zm);
      const double tw = t[w].real();
      s.aa += std::norm(fa) * tw;
      s.bb += std::norm(fb) * tw;
      s.ab += (std::conj(fa) * fb).real() * tw;
    }
  const double p = double(g.px) * double(g.py);
  s.aa /= p;
  s.bb /= p;
  s.ab /= p;
  return s;
}

// Weighted points with their cells, in the order of a PairGrid over the cells.
struct Gridded {
  PairGrid grid;
  std::vector<Loc> loc;
  std::vector<double> w;
};

Gridded gridded(const SupportPoints& s, const Layout& g) {
  Gridded out{PairGrid(s.points, g.origin, g.h, g.nx - 1, g.ny - 1), {}, {}};
  const auto& order = out.grid.order();
  out.loc.reserve(order.size());
  out.w.reserve(order.size());
  for (Eigen::Index i : order) {
    out.loc.push_back(locate(s.points(i, 0), s.points(i, 1), g));
    out.w.push_back(s.weights(i));
  }
  return out;
}

double nearPairCount(const Gridded& p, const Gridded& q) {
  double total = 0;
  for (int cy = 0; cy < p.grid.rows(); ++cy)
    for (int cx = 0; cx < p.grid.cols(); ++cx) {
      const double np = double(p.grid.count(cx, cy));
      if (np == 0) continue;
      for (int ry = std::max(0, cy - kNear); ry <= std::min(q.grid.rows() - 1, cy + kNear); ++ry)
        total += np * double(q.grid.rowEnd(cx + kNear, ry) - q.grid.rowBegin(cx - kNear, ry));
    }
  return total;
}

// sum over near point pairs of p_i q_j (k(x_i - y_j) - interpolant), the near-field correction.
bool nearCorrection(const Gridded& p, const Gridded& q, const PairKernelSpec& k, const std::vector<double>& table,
                    const Layout& g, const WorkSlice& slice, int threads, double* out) {
  const int rows = p.grid.rows();
  std::vector<double> partial(std::size_t(rows), 0.0);
  const bool complete = runBlocks(
      rows,
      [&](int cy) {
        double sum = 0;
        for (std::int64_t i = p.grid.begin(0, cy); i < p.grid.begin(p.grid.cols(), cy); ++i) {
          const Loc& li = p.loc[std::size_t(i)];
          const double lam[4] = {(1 - li.u) * (1 - li.v), li.u * (1 - li.v), (1 - li.u) * li.v, li.u * li.v};
          double row = 0;
          for (int ry = std::max(0, cy - kNear); ry <= std::min(q.grid.rows() - 1, cy + kNear); ++ry)
            for (std::int64_t j = q.grid.rowBegin(li.cx - kNear, ry); j < q.grid.rowEnd(li.cx + kNear, ry); ++j) {
              const Loc& lj = q.loc[std::size_t(j)];
              const double mu[4] = {(1 - lj.u) * (1 - lj.v), lj.u * (1 - lj.v), (1 - lj.u) * lj.v, lj.u * lj.v};
              double interp = 0;
              for (int s = 0; s < 4; ++s)
                for (int t = 0; t < 4; ++t)
                  interp += lam[s] * mu[t] *
                            table[g.wrap(li.cx + (s & 1) - lj.cx - (t & 1), li.cy + (s >> 1) - lj.cy - (t >> 1))];
              const double exact =
                  kernelAt(k, p.grid.x()[i] - q.grid.x()[j], p.grid.y()[i] - q.grid.y()[j]);
              row += q.w[std::size_t(j)] * (exact - interp);
            }
          sum += p.w[std::size_t(i)] * row;
        }
        partial[std::size_t(cy)] = sum;
      },
      slice, threads);
  *out = 0;
  for (double v : partial) *out += v;
  return complete;
}

double sumSquares(const std::vector<Complex>& z, bool imag) {
  double s = 0;
  for (const Complex& c : z) s += imag ? c.imag() * c.imag() : c.real() * c.real();
  return s;
}

}  // namespace

double curvatureBound(const PairKernelSpec& k, const Eigen::Vector2d& lo, const Eigen::Vector2d& hi) {
  // Smallest |t| over [l, u].
  auto nearest = [](double l, double u) { return l > 0 ? l : (u < 0 ? -u : 0.0); };
  auto farthest = [](double l, double u) { return std::max(std::abs(l), std::abs(u)); };
  if (k.kind == PairKernel::Distance) {
    const double r = std::hypot(nearest(lo.x(), hi.x()), nearest(lo.y(), hi.y()));
    return r > 0 ? 2.0 / r : std::numeric_limits<double>::infinity();
  }
  const double gamma = k.gamma;
  // sup over t in [l, u] of |2 s - 1| e^-s, s = gamma t^2: |2s - 1| e^-s falls on [0, 1/2],
  // rises on [1/2, 3/2] to 2 e^-1.5 and falls after, so the sup is at an end or at s = 3/2.
  auto supPhi = [&](double l, double u) {
    const double s0 = gamma * nearest(l, u) * nearest(l, u), s1 = gamma * farthest(l, u) * farthest(l, u);
    auto phi = [](double s) { return std::abs(2 * s - 1) * std::exp(-s); };
    double r = std::max(phi(s0), phi(s1));
    if (s0 <= 1.5 && 1.5 <= s1) r = std::max(r, 2 * std::exp(-1.5));
    return r;
  };
  auto supGauss = [&](double l, double u) { return std::exp(-gamma * nearest(l, u) * nearest(l, u)); };
  return 2 * gamma *
         (supPhi(lo.x(), hi.x()) * supGauss(lo.y(), hi.y()) + supPhi(lo.y(), hi.y()) * supGauss(lo.x(), hi.x()));
}

std::optional<BinnedSums> binnedPairSums(const SupportPoints& a, const SupportPoints& b, const PairKernelSpec& k,
                                         const WorkSlice& slice, const BinnedSumOptions& options) {
  const Eigen::Vector2d lo = a.points.colwise().minCoeff().cwiseMin(b.points.colwise().minCoeff());
  const Eigen::Vector2d hi = a.points.colwise().maxCoeff().cwiseMax(b.points.colwise().maxCoeff());
  const Eigen::Vector2d extent = hi - lo;
  const double longest = extent.maxCoeff();
  if (!(longest > 0) || !std::isfinite(longest) || options.nodes < 4) return std::nullopt;
  Layout g;
  g.origin = lo;
  g.h = longest / double(options.nodes - 1) * (1 + 1e-12);
  g.nx = std::max(2, int(std::floor(extent.x() / g.h)) + 2);
  g.ny = std::max(2, int(std::floor(extent.y() / g.h)) + 2);
  g.px = nextPowerOfTwo(2 * g.nx - 1);
  g.py = nextPowerOfTwo(2 * g.ny - 1);
  const std::size_t cellsP = std::size_t(g.px) * std::size_t(g.py);

  const Gridded ga = gridded(a, g), gb = gridded(b, g);
  BinnedSums out;
  out.cols = g.nx;
  out.rows = g.ny;
  out.spacing = g.h;
  out.nearPairs = nearPairCount(ga, ga) + nearPairCount(gb, gb) + nearPairCount(ga, gb);
  if (out.nearPairs > options.nearPairLimit) return std::nullopt;

  // Kernel at node offsets (wrapped), then A + iB on the nodes.
  std::vector<double> table(cellsP, 0.0);
  for (int iy = 0; iy < g.py; ++iy) {
    const int dy = iy <= g.py / 2 ? iy : iy - g.py;
    for (int ix = 0; ix < g.px; ++ix) {
      const int dx = ix <= g.px / 2 ? ix : ix - g.px;
      table[std::size_t(iy) * std::size_t(g.px) + std::size_t(ix)] = kernelAt(k, dx * g.h, dy * g.h);
    }
  }
  // Two transform buffers, used twice (the values, then the bound): large fresh allocations
  // cost page faults that show on a virtual machine.
  std::vector<Complex> t(table.begin(), table.end());
  std::vector<Complex> z(cellsP, 0.0);
  auto bin = [&](const Gridded& s, bool imag, bool masses) {
    for (std::size_t i = 0; i < s.loc.size(); ++i) {
      const Loc& l = s.loc[i];
      if (masses) {
        z[g.wrap(l.cx, l.cy)] += imag ? Complex(0, s.w[i]) : Complex(s.w[i], 0);
        continue;
      }
      const double lam[4] = {(1 - l.u) * (1 - l.v), l.u * (1 - l.v), (1 - l.u) * l.v, l.u * l.v};
      for (int c = 0; c < 4; ++c) {
        Complex& node = z[g.wrap(l.cx + (c & 1), l.cy + (c >> 1))];
        node += imag ? Complex(0, s.w[i] * lam[c]) : Complex(s.w[i] * lam[c], 0);
      }
    }
  };
  bin(ga, false, false);
  bin(gb, true, false);
  double tableSum = 0;
  for (double v : table) tableSum += std::abs(v);
  // 2-norms of the packed inputs A + iB (the rounding of a packed transform scales with them).
  const double nodeNorm = std::sqrt(sumSquares(z, false) + sumSquares(z, true));
  const int threads = options.threads;
  if (!fft2d(t, g.px, g.py, slice.sub(0.0, 0.2), threads) || !fft2d(z, g.px, g.py, slice.sub(0.2, 0.4), threads)) {
    out.complete = false;
    return out;
  }
  const Triple s = parseval(z, t, g);

  // Error weights of far cell offsets (near offsets are exact: 0) against the cell masses.
  std::fill(t.begin(), t.end(), Complex(0.0));
  std::fill(z.begin(), z.end(), Complex(0.0));
  double betaSum = 0;
  for (int dy = -(g.ny - 2); dy <= g.ny - 2; ++dy)
    for (int dx = -(g.nx - 2); dx <= g.nx - 2; ++dx) {
      if (std::abs(dx) <= kNear && std::abs(dy) <= kNear) continue;
      const Eigen::Vector2d boxLo((dx - 1) * g.h, (dy - 1) * g.h), boxHi((dx + 1) * g.h, (dy + 1) * g.h);
      const double v = 0.25 * g.h * g.h * curvatureBound(k, boxLo, boxHi);
      t[g.wrap(dx, dy)] = v;
      betaSum += v;
    }
  bin(ga, false, true);
  bin(gb, true, true);
  const double massNorm = std::sqrt(sumSquares(z, false) + sumSquares(z, true));
  if (!fft2d(t, g.px, g.py, slice.sub(0.4, 0.6), threads) || !fft2d(z, g.px, g.py, slice.sub(0.6, 0.8), threads)) {
    out.complete = false;
    return out;
  }
  const Triple e = parseval(z, t, g);

  double nearAA = 0, nearBB = 0, nearAB = 0;
  const double na = nearPairCount(ga, ga), nb = nearPairCount(gb, gb), all = std::max(1.0, out.nearPairs);
  const double c1 = 0.8 + 0.2 * na / all, c2 = c1 + 0.2 * nb / all;
  out.complete = nearCorrection(ga, ga, k, table, g, slice.sub(0.8, c1), threads, &nearAA) &&
                 nearCorrection(gb, gb, k, table, g, slice.sub(c1, c2), threads, &nearBB) &&
                 nearCorrection(ga, gb, k, table, g, slice.sub(c2, 1.0), threads, &nearAB);
  if (!out.complete) return out;
  out.aa = s.aa + nearAA;
  out.bb = s.bb + nearBB;
  out.ab = s.ab + nearAB;
  // FFT rounding: each computed transform is within ~6 log2(P) u of the exact one in the
  // 2-norm (Higham 2002, Sec. 24.1 (mem)); through the three factors of a Parseval sum and Cauchy-Schwarz
  // (|A^|_2 = sqrt(P) |A|_2, |T^|_inf <= sum |T|) the sum is off by at most
  // 3 * 6 log2(P) u |Z|_2^2 sum|T| (Z = A + iB, packed); we allow twice that. [D]
  const double u = std::numeric_limits<double>::epsilon();
  const double rounding = 36.0 * std::log2(double(cellsP)) * u *
                          (massNorm * massNorm * betaSum + nodeNorm * nodeNorm * tableSum);
  out.boundAA = std::max(e.aa, 0.0) + rounding;
  out.boundBB = std::max(e.bb, 0.0) + rounding;
  out.boundAB = std::max(e.ab, 0.0) + rounding;
  return out;
}

}  // namespace barrow
