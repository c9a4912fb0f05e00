// Whether one cloud is another moved rigidly (translated and/or rotated), point by point.
// Any measure whose cost depends only on distances within one cloud (a self term such as
// OT_ε(a, a)) has the same value and the same per-point potentials on both, so a sweep that
// shifts or rotates A can reuse such a term instead of solving it again.
#pragma once

#include "cloud/cloud.h"

namespace barrow {

/// True when `moved` has the same size and weights as `ref` and there is a rotation R and a
/// translation t with |R·p_i + t − q_i| ≤ relTol·extent (+ a few ulps of the coordinates) for
/// every point i, extent being the larger distance of a coordinate from its cloud's mean.
/// The rotation is the least-squares (Procrustes) fit, so the test is O(n). Reflections are
/// not detected (reported as not congruent, which is only a missed reuse).
bool rigidlyCongruent(const Cloud& ref, const Cloud& moved, double relTol = 1e-11);

/// The same test on point sets alone (weights not looked at); with !rotationAllowed, whether
/// `moved` is `ref` translated (R = identity).
bool rigidlyMoved(const Eigen::MatrixX2d& ref, const Eigen::MatrixX2d& moved, bool rotationAllowed,
                  double relTol = 1e-11);

}  // namespace barrow
