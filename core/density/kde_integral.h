// f-divergences between the two KDEs of a KdePairGrid by the rectangle rule on the grid nodes.
// For smooth, rapidly decaying integrands (KL, JS, Hellinger) the rule converges faster than
// any power of the spacing; TV's |f_A − f_B| has a kink where the densities cross, so it
// converges as O(h²). Error estimate = |I(h) − I(2h)| (the same rule on the even-index nodes;
// it bounds the error of I(h) whenever I(2h) is the less accurate one, which holds in both
// regimes) + a tail term for the mass outside the included nodes (kde_pair.h):
//   TV, H² ≤ ½(out_A + out_B); JS ≤ ½ ln 2 (out_A + out_B) — pointwise bounds on the integrand;
//   KL(A‖B): out_A · max(1, max |ln f_A − ln f_B| on the grid) — an estimate, not a bound;
// + a rounding allowance kRoundingAllowance·max(1, |value|) (sums over 10⁴–10⁵ nodes).
#pragma once

#include "density/divergence_kind.h"
#include "density/kde_pair.h"

namespace barrow {

inline constexpr double kRoundingAllowance = 1e-13;

struct KdeIntegral {
  double value = 0.0;          // on the full grid (spacing h)
  double coarseValue = 0.0;    // on the even-index nodes (2h)
  double errorEstimate = 0.0;  // |value − coarse| + tail
  double massA = 0.0, massB = 0.0;  // ∫f on the included nodes (1 up to the outside mass)
};

/// Pre: grid not cancelled.
KdeIntegral integrateKdeDivergence(const KdePairGrid& grid, DivergenceKind kind);

}  // namespace barrow
