// Reproducible random numbers for the critic: std::mt19937_64 (its output sequence is fixed
// by the C++ standard) turned into doubles by our own rule, so a seed gives the same run on
// every standard library (std::uniform_real_distribution's algorithm is not specified).
#pragma once

#include <cstdint>
#include <random>

namespace barrow::critic {

class RandomStream {
 public:
  explicit RandomStream(std::uint64_t seed) : engine_(seed) {}
  /// Uniform in [0, 1): the top 53 bits of one draw.
  double uniform() { return double(engine_() >> 11) * 0x1.0p-53; }
  double uniform(double lo, double hi) { return lo + (hi - lo) * uniform(); }
  /// Standard normal by Box–Muller (Box & Muller 1958) [P].
  double normal();

 private:
  std::mt19937_64 engine_;
};

}  // namespace barrow::critic
