// A coarse-to-fine start for Sinkhorn on large clouds: solve between grid summaries of the
// clouds (a few hundred points each), then carry the potentials to every point by one
// c-transform, and let the solver finish on the full clouds.
//
// Why it helps: Sinkhorn's slow error modes are the smooth ones (a potential off by a
// slowly varying function over the plane), and a grid summary resolves exactly those at a
// hundredth of the cost per iteration; the full clouds are left with the fine detail, which
// the updates remove quickly. It replaces the annealing stages on the full clouds (the coarse
// solve anneals instead). The same idea — a multiscale hierarchy of the clouds, coarse
// solutions refined level by level — is Schmitzer 2019, SIAM J. Sci. Comput., "Stabilized
// sparse scaling algorithms for entropy regularized transport problems" (Sec. 4, (mem));
// here with a single coarse level.
//
// The extension is the entropic c-transform (Peyré & Cuturi 2019, Computational Optimal
// Transport, Sec. 4.4 (mem)): for a fine point x_i,
//   f_i = −ε log Σ_J b_J exp((g_J − |x_i − Y_J|^p) / ε)
// over the coarse points Y_J of B with their masses b_J and potentials g_J; g likewise from
// the coarse f. It is exact when the coarse clouds are the clouds themselves.
#pragma once

#include <Eigen/Core>
#include <atomic>

#include "base/row_workers.h"

namespace barrow {

/// A weighted cloud summarised on a grid: one point per non-empty cell, at the weighted
/// mean of the cell's points (their plain mean when they all have zero weight), carrying
/// their total mass.
struct CoarseCloud {
  Eigen::MatrixX2d x;
  Eigen::VectorXd w;
};

/// Summary on a `side` × `side` grid over the cloud's bounding box (side >= 1).
CoarseCloud coarsenOnGrid(const Eigen::MatrixX2d& x, const Eigen::VectorXd& w, int side);

/// The c-transform above: potentials on the points `x` from the coarse cloud `c` holding
/// potentials `q` (cost units), at ε and p. `stop` (optional) cuts the pass short: a caller
/// that passes it must check it before using the result. `near` (optional, cost units): an
/// estimate of the result per point (e.g. the coarse potential of the point's own cell); it
/// only stabilises the sums, so a row it leaves out of range is summed again exactly, but a
/// good one saves that second sum for every row.
Eigen::VectorXd extendPotential(const Eigen::MatrixX2d& x, const CoarseCloud& c, const Eigen::VectorXd& q,
                                double epsilon, int p, kernel::RowWorkers& workers,
                                const std::atomic<bool>* stop = nullptr, const Eigen::VectorXd* near = nullptr);

}  // namespace barrow
