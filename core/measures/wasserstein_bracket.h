// A certified bracket [low, high] on W_p(A, B), p ∈ {1, 2}, for clouds too large for the exact
// solve in the time a user waits (issue 13; DEVELOPERS.md, Measure conventions for W_p).
//
// Rule [D] (W_p is a metric, Villani 2009, Def. 6.1 and Thm 6.9 (mem)):
//   QA, QB = each cloud quantised to k representatives at its cells' weighted means
//   (spatial/cloud_quantiser.h); eA = (Σ a_i |x_i − q(x_i)|^p)^(1/p) ≥ W_p(A, QA), likewise eB
//   (the map to the representative is a coupling); W = W_p(QA, QB), solved exactly by the
//   network simplex (transport/exact_ot.h). Then
//     low  = max(W − eA − eB, |mean A − mean B|, dual bound, [p = 2] Gelbrich bound)
//     high = cost of the coupling glued through the cells (p = 1: at most W + eA + eB;
//            p = 2: exactly sqrt(W² + eA² + eB²), see below)
//   The dual bound: Kantorovich duality with c-transforms of the quantised solve's potentials,
//   evaluated at every original point, so every pair's constraint holds (dualLowW1/W2 in the .cpp).
//   |mean A − mean B| ≤ W1 ≤ W2 by Jensen's inequality [D]; W2 is at least the W2 distance of
//   the Gaussians with the clouds' means and covariances (Gelbrich 1990). For p = 2 the
//   coupling that sends a point of cell r, spread over its cell's mass, along the quantised
//   plan π_rs to the points of cell s costs Σ π_rs (|m_r − m_s|² + V_r + V_s) = W² + eA² + eB²
//   exactly, because m_r is the cell mean and V_r the cell's mean squared deviation [D].
// Both ends are widened by a rounding allowance of kBracketRounding relative (the exact
// solve's certificate is at the 1e-9 level). The reported value is the midpoint.
#pragma once

#include <Eigen/Core>
#include <memory>

#include "base/run_control.h"
#include "base/warm_state.h"
#include "cloud/cloud.h"
#include "transport/exact_ot.h"

namespace barrow {

inline constexpr double kBracketRounding = 1e-9;

struct WassersteinBracket {
  Cloud representativesOfA, representativesOfB;  // QA, QB (weights: cell masses)
  ExactOtResult quantised;        // the exact solve between QA and QB
  bool cancelled = false;
  double errorA = 0.0, errorB = 0.0;  // eA, eB (length)
  double triangleLow = 0.0;       // max(0, W − eA − eB)
  double meanLow = 0.0;           // |mean A − mean B|
  double gaussianLow = 0.0;       // p = 2: W2 of the fitted Gaussians; 0 for p = 1
  double dualLow = 0.0;           // Kantorovich dual bound from the quantised potentials
  double low = 0.0, high = 0.0;   // with the rounding allowance
  const char* lowRule = "";       // which lower bound won: "triangle", "dual", "means", "gaussian"
  double quantiseSeconds = 0.0, solveSeconds = 0.0, boundSeconds = 0.0;
};

/// Pre: a and b validated, p ∈ {1, 2}, representatives >= 1. The bracket is meaningful only
/// when quantised.status is Optimal (the caller checks its certificate). `warm` as in
/// solveExactOt (the quantised problem's basis; it fits again when the cells keep their masses,
/// e.g. under a shift).
WassersteinBracket bracketWasserstein(const Cloud& a, const Cloud& b, int p, Eigen::Index representatives,
                                      const RunControl* control, std::shared_ptr<WarmState>* warm);

}  // namespace barrow
