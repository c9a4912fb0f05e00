// A radix-2 complex FFT in two dimensions, for the binned kernel sums (kernel/binned_pair_sum.h).
// Cooley & Tukey 1965 (Math. Comp. 19), iterative in-place form with exactly computed twiddle
// factors; rows, then columns, each spread over the cores (results do not depend on the
// thread count: every row and column is transformed the same way by one thread).
#pragma once

#include <complex>
#include <vector>

#include "base/parallel_blocks.h"

namespace barrow {

/// Forward transform X(k) = sum_n x(n) exp(-2 pi i k.n / size) of a cols x rows array stored
/// row-major (index y * cols + x). Pre: cols and rows are powers of two.
/// Returns false when stopped through RunControl (the data is then partly transformed).
bool fft2d(std::vector<std::complex<double>>& data, int cols, int rows, const WorkSlice& slice, int threads = 0);

/// The smallest power of two >= n.
int nextPowerOfTwo(int n);

}  // namespace barrow
