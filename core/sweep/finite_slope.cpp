#include "sweep/finite_slope.h"

#include <cmath>

namespace barrow {

std::vector<double> finiteDifferenceSlopes(const std::vector<double>& theta,
                                           const std::vector<double>& value,
                                           const std::vector<bool>& jumpAfter) {
  auto cut = [&](std::size_t k) { return k < jumpAfter.size() && jumpAfter[k]; };
  const std::size_t n = value.size();
  std::vector<double> slope(n, NAN);
  for (std::size_t k = 0; k < n; ++k) {
    if (!std::isfinite(value[k])) continue;
    const bool left = k > 0 && std::isfinite(value[k - 1]) && !cut(k - 1);
    const bool right = k + 1 < n && std::isfinite(value[k + 1]) && !cut(k);
    if (left && right) {
      const double h1 = theta[k] - theta[k - 1], h2 = theta[k + 1] - theta[k];
      slope[k] = (h1 * h1 * value[k + 1] - h2 * h2 * value[k - 1] + (h2 * h2 - h1 * h1) * value[k]) /
                 (h1 * h2 * (h1 + h2));
    } else if (right) {
      slope[k] = (value[k + 1] - value[k]) / (theta[k + 1] - theta[k]);
    } else if (left) {
      slope[k] = (value[k] - value[k - 1]) / (theta[k] - theta[k - 1]);
    }
  }
  return slope;
}

}  // namespace barrow
