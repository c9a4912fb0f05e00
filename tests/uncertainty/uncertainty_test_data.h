// Test data for the uncertainty suites: reproducible Gaussian and uniform clouds.
#pragma once

#include <random>

#include "cloud/cloud.h"

namespace barrow::test {

/// n points from N(mean, diag(vx, vy)), uniform weights, from std::mt19937(seed).
inline Cloud diagonalGaussian(int n, unsigned seed, double mx, double my, double vx, double vy) {
  std::mt19937 gen(seed);
  std::normal_distribution<double> z(0.0, 1.0);
  Eigen::MatrixX2d p(n, 2);
  for (int i = 0; i < n; ++i) {
    p(i, 0) = mx + std::sqrt(vx) * z(gen);
    p(i, 1) = my + std::sqrt(vy) * z(gen);
  }
  return Cloud("g", p);
}

/// k × k jittered grid on the unit square (one uniform point per cell): a fine, even stand-in
/// for the uniform distribution when small samples are drawn from it.
inline Cloud jitteredSquare(int k, unsigned seed) {
  std::mt19937 gen(seed);
  std::uniform_real_distribution<double> u(0.0, 1.0);
  Eigen::MatrixX2d p(k * k, 2);
  for (int i = 0; i < k; ++i)
    for (int j = 0; j < k; ++j) {
      p(i * k + j, 0) = (i + u(gen)) / k;
      p(i * k + j, 1) = (j + u(gen)) / k;
    }
  return Cloud("u", p);
}

}  // namespace barrow::test
