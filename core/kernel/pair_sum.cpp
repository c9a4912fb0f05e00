#include "kernel/pair_sum.h"

#include <algorithm>
#include <cmath>

#include "base/cpu_features.h"
#include "base/simd_exp.h"

namespace barrow {

PackedPoints::PackedPoints(const Eigen::MatrixX2d& p, const Eigen::VectorXd& w) : n_(p.rows()) {
  const Eigen::Index padded = (n_ + 3) / 4 * 4;
  x_.resize(std::size_t(padded));
  y_.resize(std::size_t(padded));
  w_.assign(std::size_t(padded), 0.0);
  for (Eigen::Index i = 0; i < padded; ++i) {
    const Eigen::Index src = std::min(i, n_ - 1);
    x_[std::size_t(i)] = p(src, 0);
    y_[std::size_t(i)] = p(src, 1);
    if (i < n_) w_[std::size_t(i)] = w(i);
  }
}

namespace {

using Index = Eigen::Index;
constexpr Index kRowBlock = 32;   // rows per unit of work (and per cancellation check)
constexpr Index kColTile = 2048;  // columns per tile: 48 KiB of x, y, w stays in L1/L2

struct RowAcc {
  double s = 0.0, gx = 0.0, gy = 0.0;
};

// Skip the thread start-up for small problems.
int threadsFor(double pairs, int threads) {
  if (threads > 0) return threads;
  return pairs < double(1 << 18) ? 1 : 0;  // 0: the control's budget (runBlocks)
}

#ifdef BARROW_X86_SIMD
// The AVX2+FMA form (used only when the CPU has them: cpuHasAvx2Fma).
struct Acc4 {
  __m256d s, gx, gy;
};

// Four columns j..j+3 with weights w (lanes masked to 0 are left out).
template <PairKernel K, bool Grad>
BARROW_AVX2_FN inline void step4(Acc4& a, __m256d vx, __m256d vy, __m256d negGamma, const double* qx,
                                 const double* qy, Index j, __m256d w) {
  const __m256d zero = _mm256_setzero_pd();
  const __m256d dx = _mm256_sub_pd(vx, _mm256_loadu_pd(qx + j));
  const __m256d dy = _mm256_sub_pd(vy, _mm256_loadu_pd(qy + j));
  const __m256d d2 = _mm256_fmadd_pd(dx, dx, _mm256_mul_pd(dy, dy));
  if constexpr (K == PairKernel::Gaussian) {
    const __m256d wk = _mm256_mul_pd(w, simd::expNonPositive4(_mm256_mul_pd(negGamma, d2)));
    a.s = _mm256_add_pd(a.s, wk);
    if constexpr (Grad) {
      a.gx = _mm256_fmadd_pd(wk, dx, a.gx);
      a.gy = _mm256_fmadd_pd(wk, dy, a.gy);
    }
  } else {
    const __m256d d = _mm256_sqrt_pd(d2);
    a.s = _mm256_fmadd_pd(w, d, a.s);
    if constexpr (Grad) {
      const __m256d pos = _mm256_cmp_pd(d, zero, _CMP_GT_OQ);
      const __m256d wInv = _mm256_and_pd(_mm256_div_pd(w, _mm256_max_pd(d, _mm256_set1_pd(1e-300))), pos);
      a.gx = _mm256_fmadd_pd(wInv, dx, a.gx);
      a.gy = _mm256_fmadd_pd(wInv, dy, a.gy);
    }
  }
}

BARROW_AVX2_FN inline double hsum4(__m256d v) {
  const __m128d lo = _mm256_castpd256_pd128(v), hi = _mm256_extractf128_pd(v, 1);
  const __m128d pair = _mm_add_pd(lo, hi);
  return _mm_cvtsd_f64(_mm_add_sd(pair, _mm_unpackhi_pd(pair, pair)));
}

template <PairKernel K, bool Grad>
BARROW_AVX2_FN void accumulateRowAvx2(double px, double py, const PackedPoints& q, Index j0, Index j1, Index from,
                                      double gamma, RowAcc& acc) {
  const double* qx = q.x();
  const double* qy = q.y();
  const double* qw = q.w();
  const __m256d vx = _mm256_set1_pd(px), vy = _mm256_set1_pd(py);
  const __m256d negGamma = _mm256_set1_pd(-gamma);
  Acc4 a{_mm256_setzero_pd(), _mm256_setzero_pd(), _mm256_setzero_pd()};
  Index j = j0;
  if (j < from) {  // first vector straddles the diagonal: mask the lanes j < from
    const __m256d lane = _mm256_set_pd(double(j + 3), double(j + 2), double(j + 1), double(j));
    const __m256d keep = _mm256_cmp_pd(lane, _mm256_set1_pd(double(from)), _CMP_GE_OQ);
    step4<K, Grad>(a, vx, vy, negGamma, qx, qy, j, _mm256_and_pd(_mm256_loadu_pd(qw + j), keep));
    j += 4;
  }
  for (; j < j1; j += 4) step4<K, Grad>(a, vx, vy, negGamma, qx, qy, j, _mm256_loadu_pd(qw + j));
  acc.s += hsum4(a.s);
  if constexpr (Grad) {
    acc.gx += hsum4(a.gx);
    acc.gy += hsum4(a.gy);
  }
}
#endif

// The generic form: any CPU.
template <PairKernel K, bool Grad>
void accumulateRowScalar(double px, double py, const PackedPoints& q, Index j0, Index j1, Index from,
                         double gamma, RowAcc& acc) {
  const double* qx = q.x();
  const double* qy = q.y();
  const double* qw = q.w();
  for (Index j = std::max(j0, from); j < j1; ++j) {
    const double dx = px - qx[j], dy = py - qy[j];
    const double d2 = dx * dx + dy * dy;
    if constexpr (K == PairKernel::Gaussian) {
      const double wk = qw[j] * simd::expNonPositive(-gamma * d2);
      acc.s += wk;
      if constexpr (Grad) {
        acc.gx += wk * dx;
        acc.gy += wk * dy;
      }
    } else {
      const double d = std::sqrt(d2);
      acc.s += qw[j] * d;
      if constexpr (Grad) {
        if (d > 0) {
          acc.gx += qw[j] / d * dx;
          acc.gy += qw[j] / d * dy;
        }
      }
    }
  }
}

// Adds sum_j w_j k(p, q_j) (and the gradient sums) over columns [j0, j1) to acc; columns
// j < from are left out. j0 and j1 are multiples of 4 (the padding guarantees j1).
template <PairKernel K, bool Grad>
void accumulateRow(bool avx, double px, double py, const PackedPoints& q, Index j0, Index j1, Index from,
                   double gamma, RowAcc& acc) {
#ifdef BARROW_X86_SIMD
  if (avx) return accumulateRowAvx2<K, Grad>(px, py, q, j0, j1, from, gamma, acc);
#endif
  (void)avx;
  accumulateRowScalar<K, Grad>(px, py, q, j0, j1, from, gamma, acc);
}

Index floor4(Index j) { return j / 4 * 4; }

// The tiled loop shared by all sums: row blocks of p (the unit of threading and cancellation)
// against column tiles of q, over all columns or, when `upper` (q is p), only j > i.
// finish(block, r0, r1, acc) receives the block's per-row accumulators.
template <PairKernel K, bool Grad, class Finish>
bool tiledRows(const PackedPoints& p, const PackedPoints& q, bool upper, double gamma, const WorkSlice& slice,
               int threads, Finish&& finish) {
  const Index n = p.size();
  const int blocks = int((n + kRowBlock - 1) / kRowBlock);
  const double pairs = upper ? 0.5 * double(n) * double(n) : double(n) * double(q.size());
  return runBlocks(
      blocks,
      [&](int b) {
        const Index r0 = b * kRowBlock, r1 = std::min(n, r0 + kRowBlock);
        RowAcc acc[kRowBlock];
        const bool avx = cpuHasAvx2Fma();
        for (Index t0 = upper ? floor4(r0 + 1) : 0; t0 < q.paddedSize(); t0 += kColTile) {
          const Index t1 = std::min(q.paddedSize(), t0 + kColTile);
          for (Index i = r0; i < r1; ++i) {
            const Index from = upper ? i + 1 : 0;
            const Index j0 = std::max(t0, floor4(from));
            if (j0 < t1) accumulateRow<K, Grad>(avx, p.x()[i], p.y()[i], q, j0, t1, from, gamma, acc[i - r0]);
          }
        }
        finish(b, r0, r1, acc);
      },
      slice, threadsFor(pairs, threads));
}

// sum_i p.w_i sum_j q.w_j k(p_i, q_j) (j > i only when `upper`), blocks added in order.
template <PairKernel K>
PairSum weightedSum(const PackedPoints& p, const PackedPoints& q, bool upper, double gamma, const WorkSlice& slice,
                    int threads) {
  std::vector<double> partial(std::size_t((p.size() + kRowBlock - 1) / kRowBlock), 0.0);
  PairSum out;
  out.complete = tiledRows<K, false>(p, q, upper, gamma, slice, threads,
                                     [&](int b, Index r0, Index r1, const RowAcc* acc) {
                                       double sum = 0.0;
                                       for (Index i = r0; i < r1; ++i) sum += p.w()[i] * acc[i - r0].s;
                                       partial[std::size_t(b)] = sum;
                                     });
  for (double v : partial) out.value += v;
  return out;
}

template <PairKernel K>
RowSums rowSums(const PackedPoints& p, const PackedPoints& q, double gamma, const WorkSlice& slice,
                int threads) {
  RowSums out;
  out.value.setZero(p.size());
  out.grad.setZero(p.size(), 2);
  // d/dx exp(-gamma |x-y|^2) = -2 gamma (x - y) k; d/dx |x-y| = (x - y)/|x-y|.
  const double scale = K == PairKernel::Gaussian ? -2.0 * gamma : 1.0;
  out.complete = tiledRows<K, true>(p, q, false, gamma, slice, threads,
                                    [&](int, Index r0, Index r1, const RowAcc* acc) {
                                      for (Index i = r0; i < r1; ++i) {
                                        out.value(i) = acc[i - r0].s;
                                        out.grad(i, 0) = scale * acc[i - r0].gx;
                                        out.grad(i, 1) = scale * acc[i - r0].gy;
                                      }
                                    });
  return out;
}

}  // namespace

PairSum crossPairSum(const PackedPoints& p, const PackedPoints& q, const PairKernelSpec& k,
                     const WorkSlice& slice, int threads) {
  return k.kind == PairKernel::Gaussian ? weightedSum<PairKernel::Gaussian>(p, q, false, k.gamma, slice, threads)
                                        : weightedSum<PairKernel::Distance>(p, q, false, 0.0, slice, threads);
}

PairSum offDiagonalPairSum(const PackedPoints& p, const PairKernelSpec& k, const WorkSlice& slice,
                           int threads) {
  return k.kind == PairKernel::Gaussian ? weightedSum<PairKernel::Gaussian>(p, p, true, k.gamma, slice, threads)
                                        : weightedSum<PairKernel::Distance>(p, p, true, 0.0, slice, threads);
}

RowSums rowPairSums(const PackedPoints& p, const PackedPoints& q, const PairKernelSpec& k,
                    const WorkSlice& slice, int threads) {
  return k.kind == PairKernel::Gaussian ? rowSums<PairKernel::Gaussian>(p, q, k.gamma, slice, threads)
                                        : rowSums<PairKernel::Distance>(p, q, 0.0, slice, threads);
}

}  // namespace barrow
