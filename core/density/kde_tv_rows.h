// Total variation between the two KDEs, ½∫|f_A − f_B|, with the x-integral done exactly.
// |f_A − f_B| has a kink where the densities cross, so the rectangle rule converges only as
// O(h²) there (0.3 % off for two shifted kernels at 4 nodes per bandwidth). Along one grid row
// y, though, ∫|d(x, y)| dx = Σ_k |G(r_{k+1}) − G(r_k)| [D], where r_k are the sign changes of
// d = f_A − f_B along the row (r_0 = −∞, r_last = +∞) and G(x) = ∫_{−∞}^x d dx is known in closed
// form for Gaussian kernels: Σ_i w_i Φ((x − x_i)/s_x) φ((y − y_i)/s_y)/s_y, minus the same for B.
// A root misplaced by δ changes the row integral only by O(d′δ²), so roots from linear
// interpolation between nodes suffice. The rows are then summed by the rectangle rule in y,
// where the row integrals are smooth except where the crossing curve turns.
#pragma once

#include "cloud/cloud.h"
#include "density/kde_integral.h"
#include "density/kde_pair.h"
#include "measures/run_control.h"

namespace barrow {

/// The TV value, its 2h counterpart (every other row, roots from every other node), the error
/// estimate (|difference| + ½ the mass outside the rows + rounding) and the row masses. `grid` gives the
/// rows and the signs of f_A − f_B at the nodes. `cancelled` is set when `ctl` asked to stop.
KdeIntegral kdeTotalVariation(const Cloud& a, const Cloud& b, const KdePairGrid& grid, double window,
                              const RunControl* ctl, bool* cancelled);

}  // namespace barrow
