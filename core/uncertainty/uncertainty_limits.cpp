#include "uncertainty/uncertainty_limits.h"

#include <cmath>

#include "base/number_text.h"

namespace barrow {

std::optional<std::string> checkCount(const std::string& what, long long value, long long max) {
  if (value >= 1 && value <= max) return std::nullopt;
  return what + " must be between 1 and " + std::to_string(max) + ", got " + std::to_string(value);
}

std::optional<std::string> checkLevel(double level) {
  if (std::isfinite(level) && level > 0.0 && level < 1.0) return std::nullopt;
  return "level must be strictly between 0 and 1, got " + shortestText(level);
}

}  // namespace barrow
