#include "transport/kernel_pass.h"

#include <algorithm>
#include <cmath>
#include <limits>

#include "base/cpu_features.h"
#include "transport/kernel_pass_simd.h"

namespace barrow::kernel {

namespace {

constexpr double kInf = std::numeric_limits<double>::infinity();

#ifdef BARROW_X86_SIMD
// The AVX2+FMA form, compiled for those instructions whatever the build flags and used only
// when the CPU has them (cpuHasAvx2Fma).
namespace avx2 {

// c̃ for 4 columns from the broadcast row point (xr, yr).
template <int P>
BARROW_AVX2_FN inline __m256d cost4(__m256d xr, __m256d yr, const double* xc, const double* yc, int j,
                     __m256d* dx, __m256d* dy) {
  *dx = _mm256_sub_pd(xr, _mm256_loadu_pd(xc + j));
  *dy = _mm256_sub_pd(yr, _mm256_loadu_pd(yc + j));
  const __m256d d2 = _mm256_fmadd_pd(*dx, *dx, _mm256_mul_pd(*dy, *dy));
  if constexpr (P == 2) return d2;
  else return _mm256_sqrt_pd(d2);
}

// Σ_j exp(h_j − c̃_ij − s) over one row.
template <int P>
BARROW_AVX2_FN double rowSum(double xi, double yi, const ScaledPoints& cols, const double* h, double s) {
  const __m256d xr = _mm256_set1_pd(xi), yr = _mm256_set1_pd(yi), sv = _mm256_set1_pd(s);
  __m256d acc0 = _mm256_setzero_pd(), acc1 = _mm256_setzero_pd();
  const double* xc = cols.x.data();
  const double* yc = cols.y.data();
  const int m = cols.padded();
  int j = 0;
  __m256d dx, dy;
  for (; j + 8 <= m; j += 8) {
    const __m256d c0 = cost4<P>(xr, yr, xc, yc, j, &dx, &dy);
    const __m256d c1 = cost4<P>(xr, yr, xc, yc, j + 4, &dx, &dy);
    const __m256d t0 = _mm256_sub_pd(_mm256_sub_pd(_mm256_loadu_pd(h + j), sv), c0);
    const __m256d t1 = _mm256_sub_pd(_mm256_sub_pd(_mm256_loadu_pd(h + j + 4), sv), c1);
    acc0 = _mm256_add_pd(acc0, exp4(t0));
    acc1 = _mm256_add_pd(acc1, exp4(t1));
  }
  for (; j < m; j += 4) {
    const __m256d c0 = cost4<P>(xr, yr, xc, yc, j, &dx, &dy);
    acc0 = _mm256_add_pd(acc0, exp4(_mm256_sub_pd(_mm256_sub_pd(_mm256_loadu_pd(h + j), sv), c0)));
  }
  return hsum4(_mm256_add_pd(acc0, acc1));
}

// max_j (h_j − c̃_ij) over one row.
template <int P>
BARROW_AVX2_FN double rowMax(double xi, double yi, const ScaledPoints& cols, const double* h) {
  const __m256d xr = _mm256_set1_pd(xi), yr = _mm256_set1_pd(yi);
  __m256d best = _mm256_set1_pd(-kInf);
  __m256d dx, dy;
  for (int j = 0; j < cols.padded(); j += 4) {
    const __m256d c = cost4<P>(xr, yr, cols.x.data(), cols.y.data(), j, &dx, &dy);
    best = _mm256_max_pd(best, _mm256_sub_pd(_mm256_loadu_pd(h + j), c));
  }
  return hmax4(best);
}

template <int P>
BARROW_AVX2_FN void rowGradient(double xi, double yi, const ScaledPoints& cols, const double* h, double o,
                 double* s0, double* sx, double* sy) {
  const __m256d xr = _mm256_set1_pd(xi), yr = _mm256_set1_pd(yi), ov = _mm256_set1_pd(o);
  __m256d a0 = _mm256_setzero_pd(), ax = _mm256_setzero_pd(), ay = _mm256_setzero_pd();
  __m256d dx, dy;
  for (int j = 0; j < cols.padded(); j += 4) {
    const __m256d c = cost4<P>(xr, yr, cols.x.data(), cols.y.data(), j, &dx, &dy);
    const __m256d e = exp4(_mm256_sub_pd(_mm256_sub_pd(_mm256_loadu_pd(h + j), ov), c));
    a0 = _mm256_add_pd(a0, e);
    __m256d w = e;
    if constexpr (P == 1) {
      // unit vector: divide by c̃ = |d|, and drop coincident points (c̃ = 0).
      const __m256d nz = _mm256_cmp_pd(c, _mm256_setzero_pd(), _CMP_GT_OQ);
      w = _mm256_and_pd(_mm256_div_pd(e, _mm256_max_pd(c, _mm256_set1_pd(1e-300))), nz);
    }
    ax = _mm256_fmadd_pd(w, dx, ax);
    ay = _mm256_fmadd_pd(w, dy, ay);
  }
  *s0 = hsum4(a0);
  *sx = hsum4(ax);
  *sy = hsum4(ay);
}

template <int P>
BARROW_AVX2_FN void rowKernel(double xi, double yi, const ScaledPoints& cols, const double* h, double o, double* out) {
  const __m256d xr = _mm256_set1_pd(xi), yr = _mm256_set1_pd(yi), ov = _mm256_set1_pd(o);
  __m256d dx, dy;
  for (int j = 0; j < cols.padded(); j += 4) {
    const __m256d c = cost4<P>(xr, yr, cols.x.data(), cols.y.data(), j, &dx, &dy);
    _mm256_storeu_pd(out + j, exp4(_mm256_sub_pd(_mm256_sub_pd(_mm256_loadu_pd(h + j), ov), c)));
  }
}

}  // namespace avx2
#endif

// The generic form: any CPU.
namespace scalar {

template <int P>
inline double costScalar(double dx, double dy) {
  const double d2 = dx * dx + dy * dy;
  if constexpr (P == 2) return d2;
  else return std::sqrt(d2);
}

template <int P>
double rowSum(double xi, double yi, const ScaledPoints& cols, const double* h, double s) {
  double acc = 0.0;
  for (int j = 0; j < cols.padded(); ++j)
    acc += expScalar(h[j] - s - costScalar<P>(xi - cols.x[j], yi - cols.y[j]));
  return acc;
}

template <int P>
double rowMax(double xi, double yi, const ScaledPoints& cols, const double* h) {
  double best = -kInf;
  for (int j = 0; j < cols.padded(); ++j)
    best = std::max(best, h[j] - costScalar<P>(xi - cols.x[j], yi - cols.y[j]));
  return best;
}

template <int P>
void rowGradient(double xi, double yi, const ScaledPoints& cols, const double* h, double o,
                 double* s0, double* sx, double* sy) {
  double a0 = 0, ax = 0, ay = 0;
  for (int j = 0; j < cols.padded(); ++j) {
    const double dx = xi - cols.x[j], dy = yi - cols.y[j];
    const double c = costScalar<P>(dx, dy);
    const double e = expScalar(h[j] - o - c);
    a0 += e;
    double w = e;
    if constexpr (P == 1) w = c > 0 ? e / c : 0.0;
    ax += w * dx;
    ay += w * dy;
  }
  *s0 = a0;
  *sx = ax;
  *sy = ay;
}

template <int P>
void rowKernel(double xi, double yi, const ScaledPoints& cols, const double* h, double o, double* out) {
  for (int j = 0; j < cols.padded(); ++j)
    out[j] = expScalar(h[j] - o - costScalar<P>(xi - cols.x[j], yi - cols.y[j]));
}

}  // namespace scalar

// One form's row functions, chosen once per pass.
template <int P, bool Avx>
double rowSum(double xi, double yi, const ScaledPoints& cols, const double* h, double s) {
#ifdef BARROW_X86_SIMD
  if constexpr (Avx) return avx2::rowSum<P>(xi, yi, cols, h, s);
#endif
  return scalar::rowSum<P>(xi, yi, cols, h, s);
}

template <int P, bool Avx>
double rowMax(double xi, double yi, const ScaledPoints& cols, const double* h) {
#ifdef BARROW_X86_SIMD
  if constexpr (Avx) return avx2::rowMax<P>(xi, yi, cols, h);
#endif
  return scalar::rowMax<P>(xi, yi, cols, h);
}

template <int P, bool Avx>
void lseRange(int begin, int end, const ScaledPoints& rows, const ScaledPoints& cols, const double* h,
              const double* guess, double* out, double* ratio) {
  for (int i = begin; i < end; ++i) {
    const double xi = rows.x[i], yi = rows.y[i];
    const double g = guess ? guess[i] : 0.0;
    double s = std::isfinite(g) ? rowSum<P, Avx>(xi, yi, cols, h, g) : 0.0;
    if (s >= kSumLow && s <= kSumHigh) {
      out[i] = g + std::log(s);
      if (ratio) ratio[i] = s;
      continue;
    }
    // Poor stabiliser: take the exact row maximum, so the largest term is exp(0) = 1.
    const double mx = rowMax<P, Avx>(xi, yi, cols, h);
    s = rowSum<P, Avx>(xi, yi, cols, h, mx);
    out[i] = mx + std::log(s);
    if (ratio) ratio[i] = std::isfinite(g) ? std::exp(out[i] - g) : kInf;
  }
}

}  // namespace

int paddedLength(int n) { return (n + kLanes - 1) / kLanes * kLanes; }

ScaledPoints::ScaledPoints(const Eigen::MatrixX2d& pts, double scale)
    : x(paddedLength(int(pts.rows())), 0.0), y(paddedLength(int(pts.rows())), 0.0), size(int(pts.rows())) {
  for (int i = 0; i < size; ++i) {
    x[i] = pts(i, 0) * scale;
    y[i] = pts(i, 1) * scale;
  }
}

double scaleFor(int p, double epsilon) { return p == 2 ? 1.0 / std::sqrt(epsilon) : 1.0 / epsilon; }

std::vector<double> paddedLogWeights(const Eigen::VectorXd& w) {
  std::vector<double> h(paddedLength(int(w.size())), -kInf);
  for (Eigen::Index j = 0; j < w.size(); ++j) h[j] = w(j) > 0 ? std::log(w(j)) : -kInf;
  return h;
}

int grainFor(int rows, int cols) {
  const long long pairs = (long long)rows * cols;
  if (pairs < 40000) return std::max(1, rows);  // a wake-up would cost more than the work
  return std::clamp(int(32768 / std::max(1, cols)), 1, 64);
}

void logSumExpRows(const ScaledPoints& rows, const ScaledPoints& cols, const std::vector<double>& h,
                   int p, const double* guess, double* out, double* ratio, RowWorkers& workers,
                   const std::atomic<bool>* stop) {
  const double* hp = h.data();
  const bool avx = useAvx2();
  workers.run(rows.size, grainFor(rows.size, cols.size), [&](int b, int e) {
    if (stop && stop->load(std::memory_order_relaxed)) return;
    if (avx && p == 2) lseRange<2, true>(b, e, rows, cols, hp, guess, out, ratio);
    else if (avx) lseRange<1, true>(b, e, rows, cols, hp, guess, out, ratio);
    else if (p == 2) lseRange<2, false>(b, e, rows, cols, hp, guess, out, ratio);
    else lseRange<1, false>(b, e, rows, cols, hp, guess, out, ratio);
  });
}

void gradientRows(const ScaledPoints& rows, const ScaledPoints& cols, const std::vector<double>& h,
                  int p, const double* o, double* s0, double* sx, double* sy, RowWorkers& workers) {
  const double* hp = h.data();
  const bool avx = useAvx2();
  workers.run(rows.size, grainFor(rows.size, cols.size), [&](int b, int e) {
    for (int i = b; i < e; ++i) {
#ifdef BARROW_X86_SIMD
      if (avx) {
        if (p == 2) avx2::rowGradient<2>(rows.x[i], rows.y[i], cols, hp, o[i], s0 + i, sx + i, sy + i);
        else avx2::rowGradient<1>(rows.x[i], rows.y[i], cols, hp, o[i], s0 + i, sx + i, sy + i);
        continue;
      }
#endif
      if (p == 2) scalar::rowGradient<2>(rows.x[i], rows.y[i], cols, hp, o[i], s0 + i, sx + i, sy + i);
      else scalar::rowGradient<1>(rows.x[i], rows.y[i], cols, hp, o[i], s0 + i, sx + i, sy + i);
    }
  });
}

void kernelRow(const ScaledPoints& rows, int i, const ScaledPoints& cols, const std::vector<double>& h,
               int p, double o, double* out) {
#ifdef BARROW_X86_SIMD
  if (useAvx2()) {
    if (p == 2) avx2::rowKernel<2>(rows.x[i], rows.y[i], cols, h.data(), o, out);
    else avx2::rowKernel<1>(rows.x[i], rows.y[i], cols, h.data(), o, out);
    return;
  }
#endif
  if (p == 2) scalar::rowKernel<2>(rows.x[i], rows.y[i], cols, h.data(), o, out);
  else scalar::rowKernel<1>(rows.x[i], rows.y[i], cols, h.data(), o, out);
}

bool useAvx2() {
#ifdef BARROW_X86_SIMD
  return cpuHasAvx2Fma();
#else
  return false;
#endif
}

}  // namespace barrow::kernel
