// exp(x) for x <= 0, four doubles at a time (AVX2 + FMA, chosen at run time: cpu_features.h),
// for the Gaussian kernel sums.
// Method: Cody & Waite (1980) argument reduction x = k ln2 + r, |r| <= ln2/2, with ln2 split
// in two parts (k ln2_hi exact for |k| < 2^21), then the degree-13 Taylor polynomial of e^r
// (truncation error < 5e-18 relative) and scaling by 2^k through the exponent bits.
// Accuracy: within a few ulp of std::exp on [-708, 0] (checked in pair_sum_test).
// Inputs below -708 give exactly 0 (e^-708 ~ 3e-308: nothing a kernel sum can notice).
// The reduction does not depend on the sign of x: inputs up to 709.7 are exact as well (the
// Sinkhorn passes, transport/kernel_pass_simd.h, use that; beyond it the result is +inf).
#pragma once

#include <cmath>

#include "base/cpu_features.h"

#ifdef BARROW_X86_SIMD
#include <immintrin.h>
#endif

namespace barrow::simd {

inline constexpr double kExpCutoff = -708.0;
inline constexpr double kLog2e = 1.4426950408889634074;
inline constexpr double kLn2Hi = 6.93147180369123816490e-01;  // 0x3FE62E42FEE00000
inline constexpr double kLn2Lo = 1.90821492927058770002e-10;
// 1/k!, k = 13 down to 2 (the k = 1 and k = 0 terms are 1).
inline constexpr double kExpCoef[12] = {
    1.0 / 6227020800.0, 1.0 / 479001600.0, 1.0 / 39916800.0, 1.0 / 3628800.0,
    1.0 / 362880.0,     1.0 / 40320.0,     1.0 / 5040.0,     1.0 / 720.0,
    1.0 / 120.0,        1.0 / 24.0,        1.0 / 6.0,        1.0 / 2.0};

/// Scalar form of the same algorithm (CPUs without AVX2 use it; tests compare both).
inline double expNonPositive(double x) {
  if (!(x >= kExpCutoff)) return 0.0;
  const double magic = 6755399441055744.0;  // 1.5 * 2^52: adding it rounds to an integer
  const double k = std::fma(x, kLog2e, magic) - magic;
  double r = std::fma(-k, kLn2Hi, x);
  r = std::fma(-k, kLn2Lo, r);
  double p = kExpCoef[0];
  for (int c = 1; c < 12; ++c) p = std::fma(p, r, kExpCoef[c]);
  p = std::fma(p, r, 1.0);
  p = std::fma(p, r, 1.0);
  return std::ldexp(p, int(k));
}

#ifdef BARROW_X86_SIMD
/// Four lanes of expNonPositive (bit-identical to it for every lane). AVX2 CPUs only.
BARROW_AVX2_FN inline __m256d expNonPositive4(__m256d x) {
  const __m256d magic = _mm256_set1_pd(6755399441055744.0);  // 1.5 * 2^52: rounds to integer
  const __m256d kd = _mm256_fmadd_pd(x, _mm256_set1_pd(kLog2e), magic);
  const __m256d k = _mm256_sub_pd(kd, magic);
  __m256d r = _mm256_fnmadd_pd(k, _mm256_set1_pd(kLn2Hi), x);
  r = _mm256_fnmadd_pd(k, _mm256_set1_pd(kLn2Lo), r);
  __m256d p = _mm256_set1_pd(kExpCoef[0]);
  for (int c = 1; c < 12; ++c) p = _mm256_fmadd_pd(p, r, _mm256_set1_pd(kExpCoef[c]));
  const __m256d one = _mm256_set1_pd(1.0);
  p = _mm256_fmadd_pd(p, r, one);
  p = _mm256_fmadd_pd(p, r, one);
  // 2^k: the integer k sits in the low bits of kd; move it (+ bias) into the exponent field.
  const __m256i ki = _mm256_sub_epi64(_mm256_castpd_si256(kd), _mm256_castpd_si256(magic));
  const __m256i bits = _mm256_slli_epi64(_mm256_add_epi64(ki, _mm256_set1_epi64x(1023)), 52);
  const __m256d scaled = _mm256_mul_pd(p, _mm256_castsi256_pd(bits));
  const __m256d keep = _mm256_cmp_pd(x, _mm256_set1_pd(kExpCutoff), _CMP_GE_OQ);
  return _mm256_and_pd(scaled, keep);
}
#endif

}  // namespace barrow::simd
