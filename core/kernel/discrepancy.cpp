#include "kernel/discrepancy.h"

#include <algorithm>
#include <cmath>
#include <cstdio>

namespace barrow {

namespace {

std::string describeBinned(const BinnedSums& s) {
  char buf[256];
  std::snprintf(buf, sizeof buf,
                "binned: bilinear binning on a %d x %d grid (spacing %.3g) with FFT convolution, "
                "%.0f near pairs exact; error bounded by the interpolation remainder",
                s.cols, s.rows, s.spacing, s.nearPairs);
  return buf;
}

}  // namespace

DiscrepancySums discrepancySums(const SupportPoints& a, const SupportPoints& b, const PairKernelSpec& k,
                                const WorkSlice& slice, const DiscrepancyOptions& options) {
  using Method = DiscrepancyOptions::Method;
  const double na = double(a.size()), nb = double(b.size());
  const double pairs = 0.5 * na * na + 0.5 * nb * nb + na * nb;
  if (options.method == Method::Binned || (options.method == Method::Auto && pairs > options.binAbovePairs)) {
    auto bs = binnedPairSums(a, b, k, slice, options.binned);
    if (bs && bs->complete && options.method == Method::Auto) {
      const double scale = k.kind == PairKernel::Gaussian ? 1.0 : std::abs(bs->ab);
      if (!(bs->boundAA + bs->boundBB + 2.0 * bs->boundAB <= options.binnedRelativeBound * scale)) bs.reset();
    }
    if (bs) {
      DiscrepancySums s;
      s.complete = bs->complete;
      s.sumSquaresA = a.weights.squaredNorm();
      s.sumSquaresB = b.weights.squaredNorm();
      const double kSame = k.kind == PairKernel::Gaussian ? 1.0 : 0.0;  // k(x, x)
      s.aaDiagonal = kSame * s.sumSquaresA;
      s.bbDiagonal = kSame * s.sumSquaresB;
      s.aaOffDiagonal = bs->aa - s.aaDiagonal;
      s.bbOffDiagonal = bs->bb - s.bbDiagonal;
      s.ab = bs->ab;
      s.boundAA = bs->boundAA;
      s.boundBB = bs->boundBB;
      s.boundAB = bs->boundAB;
      s.binned = true;
      s.method = describeBinned(*bs);
      return s;
    }
  }
  const PackedPoints pa(a.points, a.weights), pb(b.points, b.weights);
  // Split the progress bar by the number of pairs each sum visits.
  const double n = double(a.size()), m = double(b.size());
  const double wAA = 0.5 * n * n, wBB = 0.5 * m * m, wAB = n * m, all = wAA + wBB + wAB;
  const double c1 = wAA / all, c2 = (wAA + wBB) / all;

  DiscrepancySums s;
  const PairSum aa = offDiagonalPairSum(pa, k, slice.sub(0.0, c1));
  const PairSum bb = aa.complete ? offDiagonalPairSum(pb, k, slice.sub(c1, c2)) : PairSum{0.0, false};
  const PairSum ab = bb.complete ? crossPairSum(pa, pb, k, slice.sub(c2, 1.0)) : PairSum{0.0, false};
  s.complete = ab.complete;
  s.aaOffDiagonal = 2.0 * aa.value;
  s.bbOffDiagonal = 2.0 * bb.value;
  s.ab = ab.value;
  s.sumSquaresA = a.weights.squaredNorm();
  s.sumSquaresB = b.weights.squaredNorm();
  const double kSame = k.kind == PairKernel::Gaussian ? 1.0 : 0.0;  // k(x, x)
  s.aaDiagonal = kSame * s.sumSquaresA;
  s.bbDiagonal = kSame * s.sumSquaresB;
  s.method = "direct: all pairs summed";
  return s;
}

double sqrtAccuracy(double v, double bound) {
  const double value = std::sqrt(std::max(v, 0.0));
  return std::max(std::sqrt(std::max(v + bound, 0.0)) - value, value - std::sqrt(std::max(v - bound, 0.0)));
}

Eigen::MatrixX2d discrepancyGradient(const SupportPoints& a, const SupportPoints& b, const PairKernelSpec& k,
                                     double selfScale, const WorkSlice& slice, bool* complete) {
  const PackedPoints pa(a.points, a.weights), pb(b.points, b.weights);
  const double n = double(a.size()), m = double(b.size());
  const RowSums self = rowPairSums(pa, pa, k, slice.sub(0.0, n / (n + m)));
  const RowSums cross = self.complete ? rowPairSums(pa, pb, k, slice.sub(n / (n + m), 1.0)) : RowSums{};
  *complete = self.complete && cross.complete;
  if (!*complete) return Eigen::MatrixX2d::Zero(a.size(), 2);
  Eigen::MatrixX2d g = selfScale * self.grad - cross.grad;
  g.array().colwise() *= 2.0 * a.weights.array();
  return g;
}

}  // namespace barrow
