// Which vector instructions the running CPU has, for kernels built in two forms: a generic
// one (any x86-64 or other CPU) and an AVX2+FMA one chosen at run time. The build itself
// assumes nothing beyond the compiler's default target (no -march unless BARROW_NATIVE).
#pragma once

#if defined(__GNUC__) && (defined(__x86_64__) || defined(__i386__))
// Functions marked BARROW_AVX2_FN are compiled for AVX2+FMA whatever the build flags; they
// may only be called when cpuHasAvx2Fma() is true.
#define BARROW_X86_SIMD 1
#define BARROW_AVX2_FN __attribute__((target("avx2,fma")))
#endif

namespace barrow {

/// True when the vectorised kernels may run: the CPU reports AVX2 and FMA and the
/// environment variable BARROW_NO_AVX2 is not set (it forces the generic path, for tests and
/// comparisons). Computed once.
bool cpuHasAvx2Fma();

}  // namespace barrow
