#include "density/kde_integral.h"

#include <algorithm>
#include <cmath>

namespace barrow {

namespace {

// f·(ln f − ln g) with 0·ln 0 = 0 (a density that underflowed to 0 adds nothing).
double xlog(double f, double lf, double lg) { return f > 0 ? f * (lf - lg) : 0.0; }

double integrand(DivergenceKind kind, double la, double lb) {
  const double fa = std::exp(la), fb = std::exp(lb);
  switch (kind) {
    case DivergenceKind::KlAB: return xlog(fa, la, lb);
    case DivergenceKind::KlBA: return xlog(fb, lb, la);
    case DivergenceKind::Js: {
      // ln of the mixture (f_A + f_B)/2 without forming a sum that may underflow.
      const double top = std::max(la, lb);
      const double lm = top + std::log(std::exp(la - top) + std::exp(lb - top)) - std::log(2.0);
      return 0.5 * (xlog(fa, la, lm) + xlog(fb, lb, lm));
    }
    case DivergenceKind::Tv: return 0.5 * std::abs(fa - fb);
    case DivergenceKind::Hellinger: {
      const double d = std::exp(0.5 * la) - std::exp(0.5 * lb);
      return 0.5 * d * d;  // H² here; the square root is taken at the end
    }
  }
  return 0.0;
}

}  // namespace

KdeIntegral integrateKdeDivergence(const KdePairGrid& grid, DivergenceKind kind) {
  const KdeGrid& g = grid.grid;
  double fine = 0.0, coarse = 0.0, massA = 0.0, massB = 0.0, maxRatio = 0.0;
  for (int iy = 0; iy < g.y.count; ++iy)
    for (int ix = 0; ix < g.x.count; ++ix) {
      const std::size_t c = std::size_t(iy) * std::size_t(g.x.count) + std::size_t(ix);
      if (!grid.included[c]) continue;
      const double la = grid.logA[c], lb = grid.logB[c];
      const double v = integrand(kind, la, lb);
      fine += v;
      if (ix % 2 == 0 && iy % 2 == 0) coarse += v;
      massA += std::exp(la);
      massB += std::exp(lb);
      if (std::isfinite(la) && std::isfinite(lb)) maxRatio = std::max(maxRatio, std::abs(la - lb));
    }
  const double area = g.x.step * g.y.step;
  KdeIntegral r;
  r.value = fine * area;
  r.coarseValue = coarse * 4.0 * area;
  r.massA = massA * area;
  r.massB = massB * area;
  const double outA = std::abs(1.0 - r.massA), outB = std::abs(1.0 - r.massB);
  double tail = 0.0;
  switch (kind) {
    case DivergenceKind::KlAB: tail = outA * std::max(1.0, maxRatio); break;
    case DivergenceKind::KlBA: tail = outB * std::max(1.0, maxRatio); break;
    case DivergenceKind::Js: tail = 0.5 * std::log(2.0) * (outA + outB); break;
    case DivergenceKind::Tv:
    case DivergenceKind::Hellinger: tail = 0.5 * (outA + outB); break;
  }
  // The exact values lie in these ranges, so clamping a rounding excess only moves toward them.
  const double top = kind == DivergenceKind::Js ? std::log(2.0)
                     : isKl(kind)              ? INFINITY
                                               : 1.0;
  r.value = std::clamp(r.value, 0.0, top);
  r.coarseValue = std::clamp(r.coarseValue, 0.0, top);
  if (kind == DivergenceKind::Hellinger) {
    const double h2 = r.value;
    r.value = std::sqrt(h2);
    r.coarseValue = std::sqrt(r.coarseValue);
    tail = std::sqrt(h2 + tail) - r.value;
  }
  r.errorEstimate = std::abs(r.value - r.coarseValue) + tail + kRoundingAllowance * std::max(1.0, r.value);
  return r;
}

}  // namespace barrow
