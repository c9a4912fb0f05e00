// Gaussian moments of a weighted cloud and the W2 distance between two Gaussians.
// W2^2(N(m1,S1), N(m2,S2)) = |m1 - m2|^2 + tr(S1 + S2 - 2 (S2^{1/2} S1 S2^{1/2})^{1/2})
// (Dowson & Landau 1982, JMVA 12:450-455; Olkin & Pukelsheim 1982, LAA 48:257-263), valid
// for singular (PSD) covariances too. Square roots are symmetric PSD roots by
// eigen-decomposition with negative rounding-level eigenvalues clipped to 0, so no complex
// parts arise (unlike sqrtm(S1 S2)). Near-singular covariances: FD is not Lipschitz in the
// covariance there (tr sqrt), so rounding at the eps level can only be kept out by the
// clipping in psdSqrt; a genuine eigenvalue below 1e-14 of the largest is dropped (changing
// FD by at most ~1e-7 x the larger standard deviation).
#pragma once

#include <Eigen/Core>

#include "kernel/support_points.h"

namespace barrow {

struct GaussianFit {
  Eigen::Vector2d mean = Eigen::Vector2d::Zero();
  /// sum_i w_i (x_i - mean)(x_i - mean)^T with normalised weights (ddof = 0, i.e. the
  /// covariance of the empirical measure itself, not the unbiased sample estimate).
  Eigen::Matrix2d cov = Eigen::Matrix2d::Zero();
  int rank = 0;  // numerical rank of cov (0: one point, 1: collinear points)
};

/// Two-pass (centred) moments of the support points. Pre: s non-empty.
GaussianFit fitGaussian(const SupportPoints& s);

/// Symmetric PSD square root. Eigenvalues <= 1e-14 x the largest are taken as 0 (they are
/// rounding noise of a singular matrix; their roots would be ~1e-8 errors). Pre: m symmetric.
Eigen::Matrix2d psdSqrt(const Eigen::Matrix2d& m);

/// Numerical rank of a symmetric PSD 2x2 matrix: eigenvalues <= 1e-12 * (largest
/// eigenvalue) count as 0, and so does everything when the largest is <= 1e-300.
int psdRank(const Eigen::Matrix2d& m);

/// The squared distance above (may be a rounding-level negative when the Gaussians coincide).
double gaussianW2Squared(const GaussianFit& g1, const GaussianFit& g2);

/// Gradient of gaussianW2Squared with respect to cov of g1 (symmetric): I - T, where
/// T = S2^{1/2} (S2^{1/2} S1 S2^{1/2})^{-1/2} S2^{1/2} is the optimal linear map from
/// N(0,S1) to N(0,S2) (T S1 T = S2). Pre: S1 and S2 nonsingular.
Eigen::Matrix2d gaussianW2CovGradient(const GaussianFit& g1, const GaussianFit& g2);

}  // namespace barrow
