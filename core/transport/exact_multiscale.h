// Coarse-to-fine start for the exact solver (the multiscale idea of Mérigot 2011, "A
// multiscale approach to optimal transport", Comput. Graph. Forum 30(5) (mem), and
// Schmitzer 2016, "A sparse multiscale algorithm for dense optimal transport", J. Math.
// Imaging Vis. 56 (mem)): solve a problem on groups of nearby points first, then start the
// full problem from what the coarse optimum says. Only the start changes; the final
// pricing of all pairs still certifies the exact optimum.
//
// Groups come from median splits of each cloud along its wider axis (a k-d partition), so
// they stay balanced when the clouds are clustered. A group becomes one point at its
// mass-weighted mean carrying its total integer mass, so both coarse totals stay equal.
#pragma once

#include <utility>
#include <vector>

#include "base/row_workers.h"
#include "transport/exact_initial_basis.h"
#include "transport/exact_problem.h"

namespace barrow {

struct CoarseProblem {
  ExactProblem problem;            // one point per group
  std::vector<int> groupA, groupB; // group of each active point of the fine problem
};

/// Groups of at most `groupSize` points (>= 2) per side.
CoarseProblem coarsen(const ExactProblem& fine, int groupSize);

/// Starting arcs and basis for the fine problem from the coarse optimum (plan pairs of
/// coarse indices, potentials U on coarse sources, V on coarse sinks). `arcs` comes in with
/// extra arcs (e.g. nearest neighbours) and leaves sorted and unique, with added:
/// - every pair of points whose groups the coarse plan joins;
/// - per fine source, the `guided` sinks of lowest c_ij − v_j, where v_j = U^c(y_j) is the
///   c-transform of the coarse source potentials at the fine sinks (arcs the coarse duals
///   say are nearly tight; for W1 these reach across gaps that nearest neighbours miss).
/// The basis ships greedily along these arcs in order of reduced cost c_ij − u_i − v_j
/// (u = v^c), so it follows the coarse optimum; mass left over is matched by the north-west
/// rule. With a thread team the searches per point are split across its threads; the
/// result is the same as without one.
void refineStart(const ExactProblem& fine, const CoarseProblem& coarse,
                 const std::vector<std::pair<int, int>>& coarsePlan, const Eigen::ArrayXd& coarseU, int guided,
                 std::vector<std::pair<int, int>>* arcs, std::vector<FlowArc>* basis,
                 kernel::RowWorkers* team = nullptr);

}  // namespace barrow
