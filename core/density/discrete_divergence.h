// f-divergences between two discrete distributions p and q on the same cells (histogram bins).
// Natural logarithms (nats). Pre: p, q same size, entries >= 0, each summing to 1 (the callers
// pass normalised masses; nothing is renormalised here, so a caller's error is not hidden).
// Definitions: Lin 1991, IEEE TIT 37:145–151 (JS with the ½ factors, ≤ ln 2); TV = ½Σ|p−q|;
// Hellinger H = sqrt(½Σ(√p−√q)²) = sqrt(1 − Σ√(pq)).
#pragma once

#include <Eigen/Core>

#include "density/divergence_kind.h"

namespace barrow {

/// KL(p‖q) with the conventions 0·ln(0/q) = 0 and p·ln(p/0) = +∞ for p > 0.
struct DiscreteKl {
  double value = 0.0;        // +inf when some cell has p > 0 = q
  long long emptyCells = 0;  // cells with p > 0 and q = 0
  double unmatchedMass = 0;  // p's mass in those cells
};
DiscreteKl discreteKl(const Eigen::VectorXd& p, const Eigen::VectorXd& q);

double discreteJs(const Eigen::VectorXd& p, const Eigen::VectorXd& q);
double discreteTv(const Eigen::VectorXd& p, const Eigen::VectorXd& q);
double discreteHellinger(const Eigen::VectorXd& p, const Eigen::VectorXd& q);

/// The value of `kind` (KL(A‖B) reads p as A; KL(B‖A) swaps the arguments).
double discreteDivergence(DivergenceKind kind, const Eigen::VectorXd& p, const Eigen::VectorXd& q);

}  // namespace barrow
