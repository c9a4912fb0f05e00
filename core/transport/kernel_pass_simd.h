// Vectorised exp for the kernel passes (4 doubles per AVX2 register), with a scalar
// fallback when the build has no AVX2 (BARROW_ARCH="").
//
// Method: exp(x) = 2^k · e^r with k = round(x / ln 2) and |r| <= ln(2)/2, ln 2 split into a
// high and a low part (Cody & Waite style reduction), e^r by its degree-12 Taylor polynomial
// (truncation error r^13/13! < 2e-16 relative). [D] elementary; accuracy checked against
// std::exp in tests/core/sinkhorn_kernel_test.cpp.
// Range: results below e^-708 are flushed to 0 (no subnormals), and x above ~709.4 gives +inf;
// the Sinkhorn passes keep their exponents near 0 and recompute a row exactly otherwise.
#pragma once

#include <cmath>

#if defined(__AVX2__) && defined(__FMA__)
#include <immintrin.h>
#define BARROW_KERNEL_AVX2 1
#endif

namespace barrow::kernel {

/// Number of doubles processed together; column arrays are padded to a multiple of it.
#ifdef BARROW_KERNEL_AVX2
inline constexpr int kLanes = 4;
#else
inline constexpr int kLanes = 1;
#endif

/// Exponents below this give exactly 0.
inline constexpr double kExpUnderflow = -708.0;

#ifdef BARROW_KERNEL_AVX2
/// e^x for 4 doubles; see the file comment for the range.
inline __m256d exp4(__m256d x) {
  const __m256d log2e = _mm256_set1_pd(1.4426950408889634074);
  const __m256d ln2hi = _mm256_set1_pd(6.93147180369123816490e-01);
  const __m256d ln2lo = _mm256_set1_pd(1.90821492927058770002e-10);
  const __m256d lowMask = _mm256_cmp_pd(x, _mm256_set1_pd(kExpUnderflow), _CMP_GE_OQ);
  x = _mm256_min_pd(_mm256_max_pd(x, _mm256_set1_pd(kExpUnderflow)), _mm256_set1_pd(709.78));
  const __m256d k = _mm256_round_pd(_mm256_mul_pd(x, log2e), _MM_FROUND_TO_NEAREST_INT | _MM_FROUND_NO_EXC);
  __m256d r = _mm256_fnmadd_pd(k, ln2hi, x);
  r = _mm256_fnmadd_pd(k, ln2lo, r);
  // Horner on 1/j!, j = 12 .. 0.
  __m256d p = _mm256_set1_pd(1.0 / 479001600.0);
  p = _mm256_fmadd_pd(p, r, _mm256_set1_pd(1.0 / 39916800.0));
  p = _mm256_fmadd_pd(p, r, _mm256_set1_pd(1.0 / 3628800.0));
  p = _mm256_fmadd_pd(p, r, _mm256_set1_pd(1.0 / 362880.0));
  p = _mm256_fmadd_pd(p, r, _mm256_set1_pd(1.0 / 40320.0));
  p = _mm256_fmadd_pd(p, r, _mm256_set1_pd(1.0 / 5040.0));
  p = _mm256_fmadd_pd(p, r, _mm256_set1_pd(1.0 / 720.0));
  p = _mm256_fmadd_pd(p, r, _mm256_set1_pd(1.0 / 120.0));
  p = _mm256_fmadd_pd(p, r, _mm256_set1_pd(1.0 / 24.0));
  p = _mm256_fmadd_pd(p, r, _mm256_set1_pd(1.0 / 6.0));
  p = _mm256_fmadd_pd(p, r, _mm256_set1_pd(0.5));
  p = _mm256_fmadd_pd(p, r, _mm256_set1_pd(1.0));
  p = _mm256_fmadd_pd(p, r, _mm256_set1_pd(1.0));
  // 2^k through the exponent field: (k + 1023) << 52.
  const __m256i ki = _mm256_cvtepi32_epi64(_mm256_cvtpd_epi32(k));
  const __m256i bits = _mm256_slli_epi64(_mm256_add_epi64(ki, _mm256_set1_epi64x(1023)), 52);
  const __m256d scaled = _mm256_mul_pd(p, _mm256_castsi256_pd(bits));
  return _mm256_and_pd(scaled, lowMask);
}

/// Sum of the 4 lanes.
inline double hsum4(__m256d v) {
  const __m128d lo = _mm256_castpd256_pd128(v);
  const __m128d hi = _mm256_extractf128_pd(v, 1);
  const __m128d s = _mm_add_pd(lo, hi);
  return _mm_cvtsd_f64(_mm_add_sd(s, _mm_unpackhi_pd(s, s)));
}

/// Largest of the 4 lanes.
inline double hmax4(__m256d v) {
  const __m128d lo = _mm256_castpd256_pd128(v);
  const __m128d hi = _mm256_extractf128_pd(v, 1);
  const __m128d m = _mm_max_pd(lo, hi);
  return _mm_cvtsd_f64(_mm_max_sd(m, _mm_unpackhi_pd(m, m)));
}
#endif

/// Scalar e^x with the same range convention as exp4 (flush below kExpUnderflow).
inline double expScalar(double x) { return x < kExpUnderflow ? 0.0 : std::exp(x); }

}  // namespace barrow::kernel
