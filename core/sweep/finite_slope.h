// dD/dθ from samples on an uneven θ grid, for measures without an analytic gradient.
#pragma once

#include <vector>

namespace barrow {

/// Three-point derivative at every sample: with h1 = θ_k − θ_k−1 and h2 = θ_k+1 − θ_k,
///   D'(θ_k) ≈ [h1²·D_k+1 − h2²·D_k−1 + (h2² − h1²)·D_k] / (h1·h2·(h1 + h2)),
/// exact for quadratics [D] (Taylor expansion; the usual central difference when h1 = h2).
/// One-sided (two-point) where only one neighbour is usable; NaN where the value itself is
/// not finite or no neighbour is usable. A neighbour is usable when finite and not across a
/// jump: `jumpAfter[k]` true means D jumps between θ_k and θ_k+1, so the slopes on either
/// side are the one-sided derivatives rather than a spike. Pre: theta strictly increasing,
/// same size as value; jumpAfter empty or the same size.
std::vector<double> finiteDifferenceSlopes(const std::vector<double>& theta,
                                           const std::vector<double>& value,
                                           const std::vector<bool>& jumpAfter = {});

}  // namespace barrow
