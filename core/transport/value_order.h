// The order that sorts an array of doubles, fast enough to run 400 times per sliced
// evaluation on 10^5 points: an LSD radix sort on a 32-bit order-preserving key, then an exact
// comparison sort inside the (rare) runs whose keys tie.
//
// The key is the bit pattern of float(v) (+0 for either zero) mapped so that unsigned order is
// numeric order [CP]. Rounding to float is monotone (v <= u implies float(v) <= float(u)), so
// distinct keys already order their values strictly; only values sharing a key need the
// second look at the full doubles.
#pragma once

#include <cstdint>
#include <vector>

namespace barrow {

/// Buffers reused between calls (one per thread).
struct ValueOrderScratch {
  std::vector<std::uint64_t> items, spare;  // (key << 32) | index, ping-ponged by the passes
};

/// Fills `order` with the permutation that lists v[0..n) in non-decreasing order, equal
/// values by increasing index: exactly std::stable_sort of 0..n-1 by v, with −0 == +0.
/// Pre: no NaN (±inf is fine), 0 <= n < 2^31.
void orderByValue(const double* v, int n, std::vector<int>& order, ValueOrderScratch& scratch);

}  // namespace barrow
