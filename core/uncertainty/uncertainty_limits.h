// Stated bounds of the resampling commands (the CLI and the window reject anything outside).
#pragma once

#include <cstdint>
#include <optional>
#include <string>

namespace barrow {

inline constexpr int kMaxResamples = 100000;     // spread, sweep --resamples
inline constexpr int kMaxPermutations = 100000;  // permute
inline constexpr int kMaxRepeats = 10000;        // sizes: subsamples per size
inline constexpr int kMaxSizeSteps = 64;         // sizes: entries of the ladder
inline constexpr std::uint64_t kDefaultSeed = 1; // fixed unless the user gives one

/// "--resamples must be in 1..100000, got 0" style checks shared by the engines.
std::optional<std::string> checkCount(const std::string& what, long long value, long long max);
std::optional<std::string> checkLevel(double level);

}  // namespace barrow
