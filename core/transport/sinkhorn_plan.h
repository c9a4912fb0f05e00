// What Sinkhorn potentials give besides the value: the entropic transport plan
// P_ij = a_i b_j exp((f_i + g_j − C_ij)/ε) and the gradient of OT_ε with respect to the
// source points, Σ_j P_ij ∇_x c(x_i, y_j) (envelope theorem on the dual; Feydy et al. 2019,
// AISTATS, Sec. 3; Peyré & Cuturi 2019, Prop. 9.2 (mem)). Both are evaluated on the fly.
// Pre: f, g solve (or nearly solve) the problem for (x, a, y, b, ε, p); weights normalised.
#pragma once

#include <Eigen/Core>
#include <vector>

#include "base/plan_entry.h"
#include "base/row_workers.h"

namespace barrow {

struct EntropicPlan {
  std::vector<PlanEntry> entries;  // sorted by (i, j); masses sum to keptMass
  double keptMass = 0.0;           // 1 minus what was left out
  bool truncated = false;          // some row had more entries above the threshold than kept
};

/// The plan's entries with mass > `threshold`, at most max(1, maxEntries / n) per row (the
/// largest), so the list stays bounded however dense the entropic plan is.
EntropicPlan entropicPlan(const Eigen::MatrixX2d& x, const Eigen::VectorXd& a, const Eigen::MatrixX2d& y,
                          const Eigen::VectorXd& b, const Eigen::VectorXd& f, const Eigen::VectorXd& g,
                          double epsilon, int p, int maxEntries = 200000, double threshold = 1e-12,
                          kernel::RowWorkers* workers = nullptr);

/// Row i: Σ_j P_ij ∇_x c(x_i, y_j) with ∇_x|x−y|² = 2(x−y) and ∇_x|x−y| = (x−y)/|x−y| (0 at
/// x = y, a subgradient). This is ∂OT_ε/∂x_i at the optimum.
Eigen::MatrixX2d entropicGradient(const Eigen::MatrixX2d& x, const Eigen::VectorXd& a,
                                  const Eigen::MatrixX2d& y, const Eigen::VectorXd& b,
                                  const Eigen::VectorXd& f, const Eigen::VectorXd& g, double epsilon,
                                  int p, kernel::RowWorkers* workers = nullptr);

}  // namespace barrow
