// Carrying Sinkhorn potentials from one pair of clouds to the same clouds moved a little —
// the warm start of a sweep step or a drag.
#pragma once

#include <Eigen/Core>

namespace barrow {

/// Adjusts potentials (f, g) solved between (x0, y0) into a start for (x, y) (same sizes).
/// For the cost |x − y|², moving the clouds by translations s (of x) and t (of y) changes
/// the cost by a term separable in i and j: with d = s − t,
///   |x0_i + s − y0_j − t|² = |x0_i − y0_j|² + (2d·x0_i + |d|²) + (−2d·y0_j),
/// and adding such terms to the cost leaves the entropic plan unchanged and shifts the
/// potentials by exactly those terms. So for a pure translation the carried potentials are
/// the new solution, and for other moves the mean translation is taken out first, which
/// leaves Sinkhorn only the rest of the move to catch up with. For p = 1 there is no such
/// identity and the potentials are left as they are.
void carryPotentials(const Eigen::MatrixX2d& x0, const Eigen::MatrixX2d& y0, const Eigen::MatrixX2d& x,
                     const Eigen::MatrixX2d& y, int p, Eigen::VectorXd& f, Eigen::VectorXd& g);

}  // namespace barrow
