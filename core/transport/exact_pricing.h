// Pricing of all n·m pairs for the exact solver, with costs computed from coordinates
// (nothing of size n × m is stored), and the c-transform of a potential (Villani 2009,
// "Optimal Transport: Old and New", Def. 5.7): v^c(x) = min_j (c(x, y_j) − v_j).
// Both run per source over a SiteTree of the sinks, which skips whole boxes of sinks that
// cannot score low enough; the answers are those of a scan over every pair. With a thread
// team the sources are split into chunks across its threads; results come back in source
// order, so a solve makes the same pivots with or without one.
#pragma once

#include <Eigen/Core>
#include <utility>
#include <vector>

#include "base/row_workers.h"
#include "base/run_control.h"
#include "transport/exact_problem.h"
#include "transport/exact_site_tree.h"

namespace barrow {

/// What a pricing pass can learn on the way, per source: v^c(x_i) = min_j (c_ij − v_j) and
/// how many sinks score within `window` of it, exactly as cTransformSources gives them. When
/// the pass finds nothing violated these are the solve's final potentials, so the solver needs
/// no separate c-transform pass.
struct SourceMinima {
  double window = 0.0;
  Eigen::ArrayXd u;
  std::vector<int> ties;
};

/// Arcs with reduced cost c_ij − u_i − v_j < −tol, at most `perRow` per source (the most
/// negative ones). u, v are over the active points; `sinks` is a tree over pr's sinks (its
/// potentials are set to v here). Returns false when `control` asked to stop (polled every
/// 256 rows, reporting `progress`); `violated` then holds what was found. With `minima`
/// (window set by the caller) the same searches also fill its u and ties.
bool priceAllPairs(const ExactProblem& pr, SiteTree& sinks, const Eigen::ArrayXd& u, const Eigen::ArrayXd& v,
                   double tol, int perRow, std::vector<std::pair<int, int>>* violated, const RunControl* control,
                   double progress, kernel::RowWorkers* team = nullptr, SourceMinima* minima = nullptr);

/// u_i = v^c(x_i) for every active source, and per source the number of sinks whose
/// c_ij − v_j lies within zeroTol of that minimum (the basis arcs plus any ties).
void cTransformSources(const ExactProblem& pr, SiteTree& sinks, const Eigen::ArrayXd& v, double zeroTol,
                       Eigen::ArrayXd* u, std::vector<int>* ties, kernel::RowWorkers* team = nullptr);

/// v^c at one point (x, y) over the sites (sx, sy) with potentials v, by a full scan.
/// Pre: at least one site.
double cTransformAt(double x, double y, const Eigen::Ref<const Eigen::ArrayXd>& sx,
                    const Eigen::Ref<const Eigen::ArrayXd>& sy, const Eigen::Ref<const Eigen::ArrayXd>& v,
                    const GroundCost& cost);

}  // namespace barrow
