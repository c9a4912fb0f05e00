// Over-relaxation for the final stage of Sinkhorn: f ← (1 − ω) f + ω T(g), the same for g.
//
// Near the solution the two half-steps act like block Gauss–Seidel on a 2-cyclic linear
// system, which contracts the error by a rate λ per full step; successive over-relaxation
// with ω* = 2 / (1 + sqrt(1 − λ)) contracts it by ω* − 1 instead (Young 1971, Iterative
// Solution of Large Linear Systems, optimal SOR for consistently ordered matrices (mem);
// applied to Sinkhorn by Thibault, Chizat, Dossal, Papadakis 2021, Algorithms 14:143,
// "Overrelaxed Sinkhorn–Knopp algorithm for regularized optimal transport" (mem)).
// At λ = 0.995 that is 0.87 per step instead of 0.995.
//
// λ is read off the observed L1 marginal errors. Plain steps run until two consecutive
// windows show the same rate (early steps are transient and look faster than the asymptotic
// rate); then ω = ω*(λ). The window after any change of ω is skipped (the switch itself
// bumps the error). While relaxed, a window whose rate ρ is clearly above ω − 1 means
// λ was underestimated: Young's relation (ρ + ω − 1)² = ρ ω² λ gives a better λ. Near and
// past the optimum the SOR eigenvalues are complex, the error oscillates with modulus ω − 1,
// and ω is left alone. ω never decreases except on rejection.
//
// Far from the solution the linear picture fails, so every step is checked: block steps with
// ω ∈ (0, 2) raise the locally quadratic concave dual, so a drop of the dual means the step
// overshot; the caller undoes it and plain steps resume. Relaxation is then retried from
// scratch with the cap on ω − 1 halved (restored once the error has dropped tenfold), and
// given up after kMaxRejections.
#pragma once

namespace barrow {

class SinkhornRelaxation {
 public:
  /// The factor for the next update (1 = plain Sinkhorn).
  double omega() const { return omega_; }
  /// Reports the state reached by the last update: its L1 marginal error and exact dual
  /// objective. Returns false when that update must be undone (the dual dropped).
  bool accept(double error, double dual);
  /// Starts relaxed at ω (clamped to [1, cap]) instead of learning it from plain steps: the
  /// factor a coarse solve of the same problem ended with (its rate is nearly the same,
  /// sinkhorn_coarse.h). The safeguards apply as to a learnt ω.
  void startAt(double omega);
  /// Times a relaxed step had to be undone.
  int rejections() const { return rejections_; }

 private:
  static constexpr int kWindow = 6;  // steps at one ω whose error ratios give one rate
  static constexpr int kMaxRejections = 6;
  static constexpr double kMaxOmega = 1.98;

  void resetWindow();
  void endWindow(double rho);

  double omega_ = 1.0;
  double cap_ = kMaxOmega;        // largest ω allowed; halved towards 1 at each rejection
  double errorAtRejection_ = 0.0;  // marginal error of the state restored at the last one
  double lastError_ = -1.0;
  double lastDual_ = 0.0;
  bool haveDual_ = false;
  double logRatioSum_ = 0.0;       // over the current window
  int windowSteps_ = 0;
  double previousPlainRho_ = -1.0;  // rate of the previous plain window
  bool settling_ = false;           // ω just changed: the next window is not a rate
  int rejections_ = 0;
};

}  // namespace barrow
