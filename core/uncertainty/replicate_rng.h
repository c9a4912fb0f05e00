// Random numbers for resampling, reproducible for a seed on every platform and independent of
// how replicates are spread over threads: replicate r of a run draws from its own stream,
// seeded from (master seed, r) alone.
#pragma once

#include <cstdint>

namespace barrow {

/// SplitMix64 (Steele, Lea & Flood 2014, "Fast splittable pseudorandom number generators",
/// OOPSLA): a 64-bit state advanced by a constant and passed through a bijective mixer.
/// Used instead of std:: distributions, whose output the C++ standard leaves to each library.
class ReplicateRng {
 public:
  /// The stream of replicate `index` under `masterSeed` (streams of different indices are
  /// decorrelated by the mixer; [CP] for SplitMix64 stream splitting).
  ReplicateRng(std::uint64_t masterSeed, std::uint64_t index);

  std::uint64_t next();
  /// Uniform in [0, 1) with 53 random bits.
  double uniform();
  /// Uniform integer in [0, n), n > 0, without modulo bias (rejection of the short tail).
  std::uint64_t below(std::uint64_t n);

 private:
  std::uint64_t state_;
};

}  // namespace barrow
