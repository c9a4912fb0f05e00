// Vectorised exp for the kernel passes (4 doubles per AVX2 register, used when the CPU has
// AVX2+FMA: cpu_features.h), with a scalar form for other CPUs.
//
// Method: that of base/simd_exp.h (Cody & Waite reduction, degree-13 Taylor polynomial);
// accuracy checked against std::exp in tests/core/sinkhorn_kernel_test.cpp.
// Range: results below e^-708 are flushed to 0 (no subnormals), and x above ~709.4 gives +inf;
// the Sinkhorn passes keep their exponents near 0 and recompute a row exactly otherwise.
#pragma once

#include <cmath>

#include "base/simd_exp.h"


namespace barrow::kernel {

/// Doubles in one AVX2 register; column arrays are padded to a multiple of it on every
/// CPU, so one layout serves both forms of the passes.
inline constexpr int kLanes = 4;

/// Exponents below this give exactly 0.
inline constexpr double kExpUnderflow = simd::kExpCutoff;

#ifdef BARROW_X86_SIMD
/// e^x for 4 doubles; see the file comment for the range. The algorithm is the one of the
/// kernel sums (base/simd_exp.h), whose reduction holds for positive x as well.
BARROW_AVX2_FN inline __m256d exp4(__m256d x) {
  // min_pd returns its second operand when either is NaN: a NaN stays NaN and then gives 0.
  return simd::expNonPositive4(_mm256_min_pd(_mm256_set1_pd(709.78), x));
}

/// Sum of the 4 lanes.
BARROW_AVX2_FN inline double hsum4(__m256d v) {
  const __m128d lo = _mm256_castpd256_pd128(v);
  const __m128d hi = _mm256_extractf128_pd(v, 1);
  const __m128d s = _mm_add_pd(lo, hi);
  return _mm_cvtsd_f64(_mm_add_sd(s, _mm_unpackhi_pd(s, s)));
}

/// Largest of the 4 lanes.
BARROW_AVX2_FN inline double hmax4(__m256d v) {
  const __m128d lo = _mm256_castpd256_pd128(v);
  const __m128d hi = _mm256_extractf128_pd(v, 1);
  const __m128d m = _mm_max_pd(lo, hi);
  return _mm_cvtsd_f64(_mm_max_sd(m, _mm_unpackhi_pd(m, m)));
}
#endif

/// Scalar e^x with the same range convention as exp4 (flush below kExpUnderflow).
inline double expScalar(double x) { return x < kExpUnderflow ? 0.0 : std::exp(x); }

}  // namespace barrow::kernel
