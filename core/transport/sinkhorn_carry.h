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

/// A start for the next step of a path of moves (a sweep): with (f0, g0) solved on (x0, y0)
/// and (f1, g1) on (x1, y1) one step later, extrapolates the potentials linearly to (x, y):
/// f = f1 + α (f1 − f0), g likewise, α the step from (x1, y1) to (x, y) measured along the
/// previous step (least squares over all coordinates). The potentials of a smooth path
/// change smoothly, so this halves the distance Sinkhorn has to catch up with in the usual
/// case. Returns false (f, g untouched) unless the sizes match and 0 < α ≤ 2, i.e. the path
/// goes on in the same direction by a comparable step.
bool extrapolatePotentials(const Eigen::MatrixX2d& x0, const Eigen::MatrixX2d& y0, const Eigen::VectorXd& f0,
                           const Eigen::VectorXd& g0, const Eigen::MatrixX2d& x1, const Eigen::MatrixX2d& y1,
                           const Eigen::VectorXd& f1, const Eigen::VectorXd& g1, const Eigen::MatrixX2d& x,
                           const Eigen::MatrixX2d& y, Eigen::VectorXd& f, Eigen::VectorXd& g);

/// Potentials solved on one pair of clouds.
struct SolvedPotentials {
  Eigen::MatrixX2d x, y;
  Eigen::VectorXd f, g;
};

/// The start for (x, y) after the solves `last` and, one step earlier, `before` (may be
/// null): for p = 2 and a pure translation the exact carry; else the linear extrapolation
/// when it applies; else `last` carried by its mean translation (p = 2) or as it is.
void startFromPath(const SolvedPotentials* before, const SolvedPotentials& last, const Eigen::MatrixX2d& x,
                   const Eigen::MatrixX2d& y, int p, Eigen::VectorXd& f, Eigen::VectorXd& g);

}  // namespace barrow
