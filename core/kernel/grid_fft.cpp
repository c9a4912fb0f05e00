#include "kernel/grid_fft.h"

#include <algorithm>
#include <cmath>
#include <numbers>

namespace barrow {

namespace {

using Complex = std::complex<double>;

class Fft1d {
 public:
  explicit Fft1d(int n) : n_(n), twiddle_(std::size_t(n / 2)), bitrev_(std::size_t(n)) {
    for (int k = 0; k < n / 2; ++k) twiddle_[std::size_t(k)] = std::polar(1.0, -2.0 * std::numbers::pi * k / n);
    int bits = 0;
    while ((1 << bits) < n) ++bits;
    for (int i = 0; i < n; ++i) {
      int r = 0;
      for (int b = 0; b < bits; ++b) r |= ((i >> b) & 1) << (bits - 1 - b);
      bitrev_[std::size_t(i)] = r;
    }
  }

  void operator()(Complex* v) const {
    for (int i = 0; i < n_; ++i)
      if (int j = bitrev_[std::size_t(i)]; j > i) std::swap(v[i], v[j]);
    for (int len = 2; len <= n_; len <<= 1) {
      const int half = len / 2, step = n_ / len;
      for (int s = 0; s < n_; s += len)
        for (int k = 0; k < half; ++k) {
          const Complex t = twiddle_[std::size_t(k * step)] * v[s + k + half];
          v[s + k + half] = v[s + k] - t;
          v[s + k] += t;
        }
    }
  }

 private:
  int n_;
  std::vector<Complex> twiddle_;
  std::vector<int> bitrev_;
};

constexpr int kLinesPerBlock = 16;

}  // namespace

int nextPowerOfTwo(int n) {
  int p = 1;
  while (p < n) p <<= 1;
  return p;
}

bool fft2d(std::vector<Complex>& data, int cols, int rows, const WorkSlice& slice, int threads) {
  const Fft1d alongX(cols), alongY(rows);
  const int rowBlocks = (rows + kLinesPerBlock - 1) / kLinesPerBlock;
  if (!runBlocks(
          rowBlocks,
          [&](int b) {
            for (int y = b * kLinesPerBlock; y < std::min(rows, (b + 1) * kLinesPerBlock); ++y)
              alongX(data.data() + std::size_t(y) * std::size_t(cols));
          },
          slice.sub(0.0, 0.5), threads))
    return false;
  const int colBlocks = (cols + kLinesPerBlock - 1) / kLinesPerBlock;
  return runBlocks(
      colBlocks,
      [&](int b) {
        const int x0 = b * kLinesPerBlock, x1 = std::min(cols, x0 + kLinesPerBlock);
        // Gather a strip of columns so that the strided reads stay in few cache lines (one
        // buffer per thread, not one allocation per block).
        thread_local std::vector<Complex> strip;
        strip.resize(std::size_t(rows) * std::size_t(x1 - x0));
        for (int y = 0; y < rows; ++y)
          for (int x = x0; x < x1; ++x)
            strip[std::size_t(x - x0) * std::size_t(rows) + std::size_t(y)] = data[std::size_t(y) * std::size_t(cols) + std::size_t(x)];
        for (int x = x0; x < x1; ++x) alongY(strip.data() + std::size_t(x - x0) * std::size_t(rows));
        for (int y = 0; y < rows; ++y)
          for (int x = x0; x < x1; ++x)
            data[std::size_t(y) * std::size_t(cols) + std::size_t(x)] = strip[std::size_t(x - x0) * std::size_t(rows) + std::size_t(y)];
      },
      slice.sub(0.5, 1.0), threads);
}

}  // namespace barrow
