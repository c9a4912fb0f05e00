// Total variation between the two KDEs, ½∫∫|f_A − f_B| dx dy, with the x-integral done exactly
// and the y-integral by adaptive Gauss–Kronrod quadrature.
//
// Along one row y, with d = f_A − f_B and G(x) = ∫_{−∞}^x d dx — in closed form for Gaussian
// kernels, Σ_i c_i(y) Φ((x − x_i)/s_x) with c_i(y) = ±w_i φ((y − y_i)/s_y)/s_y (+ for A, − for B)
// — the row integral is T(y) = ∫|d| dx = Σ_k |G(r_{k+1}) − G(r_k)| [D], r_k the sign changes of
// d along the row (r_0 = −∞, r_last = +∞). The sign changes are found on nodes s_x/4 apart
// (d and ∂d/∂x there; a cell where the slope turns toward zero is searched for a hidden pair of
// crossings) and refined by safeguarded Newton on the exact d to 1e-12 s_x, so T(y) is exact to
// rounding up to sign changes closer together than the search resolves.
//
// T(y) is smooth except where the crossing curve {f_A = f_B} turns (two crossings merge: T has
// a (y − y₀)^{3/2} term there), so ∫T dy goes to adaptive Gauss–Kronrod 7/15 panels (Piessens,
// de Doncker-Kapenga, Überhuber, Kahaner 1983, QUADPACK, rule qk15), starting two bandwidths
// wide over the data's y-range ± 9.5 s_y and halving every panel whose |K15 − G7| exceeds its
// share of the tolerance 1e-10·max(value, 1e-3). Error estimate: Σ |K15 − G7| over the panels
// (QUADPACK's raw difference, not its rescaled one: the 15-point result is far more accurate
// than the 7-point one it is compared with, so this overstates the error of K15 except where
// a panel straddles a turn and both are equally poor; tested against a converged reference,
// tests/core/kde_tv_test.cpp) + ½ the mass of A and B outside the integrated rows
// + an allowance for rounding.
#pragma once

#include "base/run_control.h"
#include "cloud/cloud.h"
#include "density/kde_integral.h"
#include "density/kde_pair.h"

namespace barrow {

/// How the integration went (for the result's details and for tests).
struct KdeTvStats {
  int panels = 0;             // Gauss–Kronrod panels at the end
  long long rows = 0;         // rows evaluated (15 per panel evaluated)
  long long hiddenPairs = 0;  // crossing pairs found inside one node cell
  double nodesPerBandwidth = 0.0;  // along x (4 unless the node budget bound it)
  bool panelLimitHit = false;      // stopped at the panel budget before the tolerance
};

/// The TV value, the 7-point Gauss sum as its coarse counterpart, the error estimate and the
/// masses of the two KDEs over the integrated rows, for the diagonal bandwidth s; kernels
/// are cut at `window` bandwidths (below e^{-window²/2} of their peak). `cancelled` is set
/// when `ctl` asked to stop.
KdeIntegral kdeTotalVariation(const Cloud& a, const Cloud& b, const Eigen::Vector2d& s, double window,
                              const RunControl* ctl, bool* cancelled, KdeTvStats* stats = nullptr);

}  // namespace barrow
