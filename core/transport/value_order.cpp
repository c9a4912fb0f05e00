#include "transport/value_order.h"

#include <algorithm>
#include <bit>
#include <cmath>
#include <cfloat>
#include <numeric>

namespace barrow {

namespace {

// Below this size the passes' fixed cost (three 2048-entry histograms) outweighs a plain sort.
constexpr int kSmall = 96;
constexpr int kDigitBits = 11;
constexpr std::uint32_t kDigitMask = (1u << kDigitBits) - 1;
constexpr int kPasses = 3;  // 11 + 11 + 10 bits cover the 32-bit float key
constexpr std::uint32_t kLinearMax = (1u << (2 * kDigitBits)) - 1;  // the linear key: two digits

// float(v) as an unsigned key in numeric order: flip all bits of negatives, the sign bit of
// the rest [CP]. The clamp keeps the conversion defined (a double beyond the float range
// would be undefined behaviour) and monotone; + 0.0f turns −0 into +0 so both zeros tie.
inline std::uint32_t floatKey(double v) {
  const float f = float(std::clamp(v, -double(FLT_MAX), double(FLT_MAX))) + 0.0f;
  const std::uint32_t b = std::bit_cast<std::uint32_t>(f);
  return (b & 0x80000000u) ? ~b : (b | 0x80000000u);
}

// The order the result must have: by value, equal values by index.
struct ByValueThenIndex {
  const double* v;
  bool operator()(int i, int j) const { return v[i] < v[j] || (v[i] == v[j] && i < j); }
};

}  // namespace

void orderByValue(const double* v, int n, std::vector<int>& order, ValueOrderScratch& scratch) {
  order.resize(std::size_t(n));
  if (n < kSmall) {
    std::iota(order.begin(), order.end(), 0);
    std::sort(order.begin(), order.end(), ByValueThenIndex{v});
    return;
  }
  std::vector<std::uint64_t>& cur = scratch.items;
  std::vector<std::uint64_t>& next = scratch.spare;
  cur.resize(std::size_t(n));
  next.resize(std::size_t(n));

  // One pass builds the items and the digit histograms. First choice: a 22-bit key linear in
  // the value over [min, max] (two passes); data bunched by a far outlier would tie in long
  // runs under it, so then (most items in one top digit) the float key with three passes.
  std::vector<std::uint32_t> counts(std::size_t(kPasses) << kDigitBits, 0);
  std::uint32_t* count[kPasses] = {counts.data(), counts.data() + (1 << kDigitBits),
                                   counts.data() + (2 << kDigitBits)};
  auto build = [&](auto key) {
    std::fill(counts.begin(), counts.end(), 0u);
    for (int i = 0; i < n; ++i) {
      const std::uint32_t k = key(v[i]);
      cur[std::size_t(i)] = std::uint64_t(k) << 32 | std::uint32_t(i);
      ++count[0][k & kDigitMask];
      ++count[1][(k >> kDigitBits) & kDigitMask];
      ++count[2][k >> (2 * kDigitBits)];
    }
  };
  int passes = kPasses;
  const auto [lo, hi] = std::minmax_element(v, v + n);
  const double span = *hi - *lo, low = *lo;
  const double scale = double(kLinearMax) / span;
  if (std::isfinite(span) && span > 0 && std::isfinite(scale)) {
    // (x − low)·scale is non-decreasing in x (each rounded step is), in [0, kLinearMax] up to
    // rounding: the min() keeps it there.
    build([low, scale](double x) { return std::min(kLinearMax, std::uint32_t((x - low) * scale)); });
    if (*std::max_element(count[1], count[1] + (1 << kDigitBits)) <= std::uint32_t(n / 4)) passes = 2;
  }
  if (passes == kPasses) build(floatKey);

  // Stable counting passes, least significant digit first; the index starts in increasing
  // order, so equal keys stay by index. A digit all items share moves nothing: skipped.
  for (int pass = 0; pass < passes; ++pass) {
    const int shift = 32 + pass * kDigitBits;
    std::uint32_t* c = count[pass];
    if (c[(cur[0] >> shift) & kDigitMask] == std::uint32_t(n)) continue;
    std::uint32_t sum = 0;
    for (std::uint32_t d = 0; d <= kDigitMask; ++d) {
      const std::uint32_t k = c[d];
      c[d] = sum;
      sum += k;
    }
    for (const std::uint64_t item : cur) next[c[(item >> shift) & kDigitMask]++] = item;
    cur.swap(next);
  }

  // Values that share a key are ordered by the full double, then by index.
  int runStart = 0;
  for (int k = 0; k < n; ++k) {
    order[std::size_t(k)] = int(std::uint32_t(cur[std::size_t(k)]));
    if (k > 0 && (cur[std::size_t(k)] >> 32) != (cur[std::size_t(k - 1)] >> 32)) {
      if (k - runStart > 1) std::sort(order.begin() + runStart, order.begin() + k, ByValueThenIndex{v});
      runStart = k;
    }
  }
  if (n - runStart > 1) std::sort(order.begin() + runStart, order.end(), ByValueThenIndex{v});
}

}  // namespace barrow
