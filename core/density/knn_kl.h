// k-nearest-neighbour estimator of KL(P‖Q) from samples, d = 2:
//   D̂ = (d/n) Σ_i ln(ν_k(i)/ρ_k(i)) + ln(m/(n−1))
// ρ_k(i): distance from x_i to its k-th nearest neighbour among the other n−1 points of P;
// ν_k(i): distance from x_i to its k-th nearest neighbour among the m points of Q.
// [P] Wang, Kulkarni, Verdú 2009, IEEE TIT 55:2392–2405 (k = 1: Pérez-Cruz 2008, ISIT).
// The estimator is for unweighted samples (see uniformSample) and may be negative.
//
// Ties: coincident points have probability 0 under a density, but drawn clouds have them, and
// a zero distance makes a term ±∞ (ρ = 0 → +∞, ν = 0 → −∞; both → undefined). Rule used here:
// a point at distance exactly 0 is not counted as a neighbour, so ρ_k and ν_k are the k-th
// smallest *positive* distances. The counts of points where this changed ρ or ν are reported.
// Consequence to know: identical clouds (A = B) give ≈ ln(n/(n−1)) ≈ 0, while B = A moved by
// a tiny t gives a large negative value (ν ≈ t): the estimator assumes independent samples.
#pragma once

#include <Eigen/Core>
#include <optional>
#include <string>

#include "base/run_control.h"
#include "cloud/cloud.h"

namespace barrow {

struct KnnKl {
  double value = 0.0;
  long long tiesRho = 0;   // points of P with another point of P at the same location
  long long tiesNu = 0;    // points of P with a point of Q at the same location
  std::string error;       // non-empty: not enough distinct neighbours
  bool cancelled = false;
};

/// p (n × 2, n >= 2) and q (m × 2, m >= 1) are the samples; k >= 1. `nameP`/`nameQ` ("A",
/// "B") are used in the error message.
KnnKl knnKl(const Eigen::MatrixX2d& p, const Eigen::MatrixX2d& q, int k, const std::string& nameP,
            const std::string& nameQ, const RunControl* ctl);

/// The points of positive weight, when those weights are all equal (relative spread ≤ 1e-9);
/// otherwise nullopt and the reason in `why`.
std::optional<Eigen::MatrixX2d> uniformSample(const Cloud& c, const std::string& name, std::string* why);

}  // namespace barrow
