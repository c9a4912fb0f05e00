// Two tiny clouds and measure settings decoded from fuzzer bytes; shared by fuzz_measures
// and the unit test that replays its regression inputs (tests/core/fuzz_regressions_test).
//
// Layout (missing bytes read as 0): byte 0 = sizes (A: 1 + low 2 bits, B: 1 + next 2 bits);
// byte 1 = options (bit 0: density estimator knn instead of hist, bit 1: squared Chamfer);
// then per point x, y as (mantissa byte, scale byte) and w as (0..15, scale byte). A scale
// byte below 160 means 1, so most inputs are ordinary clouds; bytes 160..255 give decimal
// scales 1e-300 .. ~1e294. Weights of at most 15e294, four per cloud, cannot overflow
// their sum (that overflow is handled in cloud normalisation, not here).
#pragma once

#include <cmath>
#include <cstddef>
#include <cstdint>

#include "cloud/cloud.h"
#include "measures/evaluate.h"

namespace barrow::fuzz {

inline constexpr const char* kCheapMeasures[] = {"w1",    "w2",    "sliced", "energy", "frechet", "chamfer",
                                                 "hausdorff", "kl_ab", "kl_ba", "js",  "tv",      "hellinger"};

struct CloudPair {
  Cloud a, b;
  EvalRequest request;
};

namespace detail {

struct Reader {
  const std::uint8_t* data;
  std::size_t size;
  std::size_t at = 0;
  std::uint8_t next() { return at < size ? data[at++] : 0; }
};

inline double decimalScale(std::uint8_t s) {
  if (s < 160) return 1.0;
  return std::pow(10.0, double(int(s) - 208) * 300.0 / 48.0);
}

inline Cloud decode(Reader& in, int n, const char* name) {
  Cloud c;
  c.name = name;
  c.points.resize(n, 2);
  c.weights.resize(n);
  for (int i = 0; i < n; ++i) {
    for (int k = 0; k < 2; ++k) {
      const double m = double(std::int8_t(in.next())) / 8.0;
      c.points(i, k) = m * decimalScale(in.next());
    }
    const double w = double(in.next() % 16);
    c.weights(i) = w * decimalScale(in.next());
  }
  if (!(c.weights.sum() > 0)) c.weights.setConstant(1.0);
  return c;
}

}  // namespace detail

inline CloudPair decodeCloudPair(const std::uint8_t* data, std::size_t size) {
  detail::Reader in{data, size};
  const std::uint8_t sizes = in.next();
  const std::uint8_t opts = in.next();
  CloudPair p;
  p.a = detail::decode(in, 1 + (sizes & 3), "A");
  p.b = detail::decode(in, 1 + ((sizes >> 2) & 3), "B");
  p.request.params.set("density.estimator", (opts & 1) ? "knn" : "hist");
  if (opts & 2) p.request.params.set("chamfer.squared", "true");
  return p;
}

}  // namespace barrow::fuzz
