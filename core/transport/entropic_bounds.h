// Certified bounds on the entropic transport cost OT_ε(a, b) (convention of sinkhorn_solver.h,
// min_P ⟨P, C⟩ + ε KL(P ‖ a⊗b)) from any pair of potentials, solved or not.
//
// Lower bound, weak duality (Peyré & Cuturi 2019, Prop. 4.4 and Rem. 4.22 (mem)): for every
// finite f, g,
//   L(f, g) = ⟨a, f⟩ + ⟨b, g⟩ − ε (M − 1),  M = Σ_ij a_i b_j exp((f_i + g_j − C_ij)/ε),
// is at most OT_ε(a, b). For a given f it is largest at g = the c-transform of f, where M = 1
// (the semi-dual); the bound is taken there. One pass over the pairs. That choice matters:
// with g carried from elsewhere, a few points whose potentials are far off (e.g. points of
// tiny weight far from every representative) can make M astronomically large, while at the
// c-transform their effect is weighted by their mass.
//
// Upper bound: the cost of a feasible coupling, made from the Gibbs plan of (f, g) by the
// rounding of Altschuler, Weed & Rigollet 2017 (Alg. 2, mem). g is first replaced by the
// c-transform of f (the plan's columns are then exact), rows over a_i are scaled down to a_i
// (P' = diag(s) P, s_i = min(1, a_i / r_i)), and the missing mass is added as the product
// E = e hᵀ / |h| of the row and column deficits e = a − P'1, h = b − P'ᵀ1. The coupling
// Π = P' + E has the marginals a and b. Its objective needs no further pass over the pairs:
// with δ = |e| and Π = (1 − δ) Π₁ + δ Π₂ (Π₁ = P'/(1 − δ), Π₂ = E/δ), KL is convex in its first
// argument, so
//   ⟨C, Π⟩ + ε KL(Π ‖ a⊗b) ≤ Σ_i ρ_i (f_i + ε log s_i) + Σ_j κ_j g_j − ε (1 − δ) log(1 − δ)
//                            + ⟨C, E⟩ + ε δ [KL(e/δ ‖ a) + KL(h/|h| ‖ b)]       [D]
// where ρ, κ are the row and column sums of P' (on P' the cost cancels against the exponent
// of the Gibbs form). ⟨C, E⟩ is exact for p = 2 (moments) and bounded by the triangle
// inequality through one centre for p = 1. Three passes over the pairs.
//
// Both bounds are widened by a rounding allowance: 8 (n + m) u times the magnitudes summed,
// with u the unit roundoff (a sum of N terms in floating point errs by at most (N − 1) u Σ|terms|
// to first order, Higham 2002, Sec. 4.2 (mem)).
#pragma once

#include <Eigen/Core>
#include <atomic>

#include "base/row_workers.h"

namespace barrow {

struct EntropicDualBound {
  bool complete = false;  // false: the pass was stopped (value unusable)
  double low = 0.0;       // L(f, c-transform of f) minus the rounding allowance
};

struct EntropicRoundedBound {
  bool complete = false;
  double high = 0.0;     // the rounded coupling's objective bound plus the rounding allowance
  double low = 0.0;      // L(f, g') at the c-transformed g' (a lower bound met on the way)
  double deficit = 0.0;  // δ, the mass the rounding had to add
  // P' = the Gibbs plan of (rowPotential, colPotential): P'_ij = a_i b_j exp((f'_i + g'_j − C_ij)/ε),
  // so that a caller can price other costs on it (measures/entropic_bracket.cpp).
  Eigen::VectorXd rowPotential, colPotential;
};

/// L(f, c-transform of f) as above; g serves only as the pass's stabiliser (a guess of that
/// c-transform). Pre: a, b normalised (sum 1, non-negative), f, g finite, p ∈ {1, 2}.
/// `stop` (optional) cuts the pass short: then complete is false.
EntropicDualBound entropicDualBound(const Eigen::MatrixX2d& x, const Eigen::VectorXd& a, const Eigen::MatrixX2d& y,
                                    const Eigen::VectorXd& b, const Eigen::VectorXd& f, const Eigen::VectorXd& g,
                                    double epsilon, int p, kernel::RowWorkers& workers,
                                    const std::atomic<bool>* stop = nullptr);

/// The rounded coupling's bound (and the dual bound at f and the c-transform of f). Same
/// preconditions; g serves only as the stabiliser of the first pass.
EntropicRoundedBound entropicRoundedBound(const Eigen::MatrixX2d& x, const Eigen::VectorXd& a,
                                          const Eigen::MatrixX2d& y, const Eigen::VectorXd& b,
                                          const Eigen::VectorXd& f, const Eigen::VectorXd& g, double epsilon, int p,
                                          kernel::RowWorkers& workers, const std::atomic<bool>* stop = nullptr);

}  // namespace barrow
