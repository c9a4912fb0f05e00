// The order that sorts an array of doubles, fast enough to run 400 times per sliced
// evaluation on 10^5 points: an LSD radix sort on a 22- or 32-bit order-preserving key, then
// an exact comparison sort inside the (rare) runs whose keys tie.
//
// Keys are non-decreasing functions of the value, so distinct keys already order their values
// strictly; only values sharing a key need the second look at the full doubles. The usual key
// is linear in the value over [min, max] with 2^22 steps (two 11-bit passes). When most
// values fall into one 2^-11 slice of that range (a far outlier), it would leave long ties, and
// the key is the bit pattern of float(v) (+0 for either zero), mapped so that unsigned order
// is numeric order [CP] (three passes); rounding to float is monotone.
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
