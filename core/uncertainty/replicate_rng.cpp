#include "uncertainty/replicate_rng.h"

namespace barrow {

namespace {

std::uint64_t mix(std::uint64_t z) {
  z = (z ^ (z >> 30)) * 0xbf58476d1ce4e5b9ULL;
  z = (z ^ (z >> 27)) * 0x94d049bb133111ebULL;
  return z ^ (z >> 31);
}

}  // namespace

ReplicateRng::ReplicateRng(std::uint64_t masterSeed, std::uint64_t index)
    // Two mixing rounds so that neighbouring (seed, index) pairs start far apart.
    : state_(mix(mix(masterSeed) ^ (index * 0x9e3779b97f4a7c15ULL + 0x632be59bd9b4e019ULL))) {}

std::uint64_t ReplicateRng::next() {
  state_ += 0x9e3779b97f4a7c15ULL;
  return mix(state_);
}

double ReplicateRng::uniform() { return double(next() >> 11) * 0x1.0p-53; }

std::uint64_t ReplicateRng::below(std::uint64_t n) {
  // Accept x only below the largest multiple of n that fits in 2^64.
  const std::uint64_t limit = (~std::uint64_t(0)) - ((~std::uint64_t(0)) % n + 1) % n;
  for (;;) {
    const std::uint64_t x = next();
    if (x <= limit) return x % n;
  }
}

}  // namespace barrow
