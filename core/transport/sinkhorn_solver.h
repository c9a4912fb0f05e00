// Entropic optimal transport between two weighted 2-D point sets by log-domain Sinkhorn with
// ε-scaling, the kernel evaluated on the fly from the coordinates.
//
// Problem (convention (i) of REFERENCES.md, "Sinkhorn"):
//   OT_ε(a, b) = min_P ⟨P, C⟩ + ε KL(P ‖ a⊗b),  C_ij = |x_i − y_j|^p,  p ∈ {1, 2},
// solved through its dual (Cuturi 2013, NIPS; Peyré & Cuturi 2019, Computational Optimal
// Transport, Sec. 4.4 (log-domain), Remark 4.22 (dual)):
//   max_{f,g} ⟨a,f⟩ + ⟨b,g⟩ − ε ⟨a⊗b, exp((f⊕g − C)/ε) − 1⟩,
// with the optimal plan P_ij = a_i b_j exp((f_i + g_j − C_ij)/ε).
// The symmetric problem OT_ε(a, a) uses the averaged update f ← ½(f + T(f)) of Feydy et al.
// 2019, AISTATS, "Interpolating between OT and MMD using Sinkhorn divergences" (Sec. 3).
// ε-scaling anneals ε from the data's extent^p down to the target (Schmitzer 2019, SIAM J.
// Sci. Comput. 41 (mem); Feydy et al. 2019); at the target the updates are over-relaxed with
// an adaptive factor (sinkhorn_relaxation.h), 5-30x fewer iterations than plain updates in
// our measurements at ε/D^p = 1e-3 .. 1e-4.
//
// A cold solve on large clouds (both at least coarseFrom points, grid cells no wider than
// 2 ε^(1/p)) starts coarse to fine
// instead (sinkhorn_coarse.h): the annealing runs on grid summaries of the clouds, their
// potentials are carried to every point by a c-transform, and the full clouds are iterated
// at the target ε only, over-relaxed from the start with the factor the coarse solve ended
// with. Measured at 10^4 + 10^4 points, ε = (D/20)²: 97 → 18 full-cloud iterations for A–B,
// 42 → 9 for a self term, the value unchanged to 1e-13 relative (bench_entropic_pair,
// tests/bench/RESULTS-entropic.md).
//
// Small ε (the estimated share of pairs within θ ε of the optimum at most kMaxKeptShare,
// sinkhorn_truncated.h; never at the default ε = (D/20)^p): the iteration runs on a truncated
// kernel instead, from a coarse start at the first ε where the grid is fine enough, with
// ε-scaling; the final marginals and value are checked on all pairs, and the result carries
// a bound on the plan mass the truncation left out. Measured at 10^4 + 10^4, ε = 1e-4: 28x
// less CPU than the dense iteration, value unchanged to 1e-16 (RESULTS-entropic.md).
//
// Units: ε and the potentials f, g are in cost units (length^p). Weights a, b are normalised
// here (they need not sum to 1). Convergence is measured by the L1 error of the row
// marginals of the current plan (its columns are nearly exact after each full iteration).
// The value (a dual objective) is far more accurate than that error: its gap is second order
// near the solution. When ε is well below the spacing of the points the plan is close to a
// permutation, and the marginal error can fall as slowly as 1/k (Sinkhorn's worst case): the
// solver then stops at maxIterations with status MaxIterations and says so.
#pragma once

#include <Eigen/Core>
#include <string>

#include "base/row_workers.h"
#include "base/run_control.h"

namespace barrow {

struct SinkhornOptions {
  double epsilon = 0.01;        // target regularisation ε in cost units, > 0
  int p = 2;                    // ground cost |x − y|^p, 1 or 2
  int maxIterations = 10000;    // full iterations in all (annealing included), >= 1
  double tolerance = 1e-6;      // L1 marginal error to stop at, > 0 (masses sum to 1)
  bool epsilonScaling = true;   // anneal from extent^p down to ε (skipped on a warm start)
  double scalingFactor = 0.5;   // ε_{k+1} = max(ε, factor · ε_k), in (0, 1)
  int stageIterations = 10;     // at most this many iterations at each annealing ε
  double stageTolerance = 1e-2; // an annealing stage also ends below this marginal error
  bool overRelaxation = true;   // adaptive ω at the target ε (sinkhorn_relaxation.h)
  /// Coarse-to-fine start (sinkhorn_coarse.h) on grids of coarseGrid × coarseGrid cells for
  /// a cold solve whose smaller cloud has at least coarseFrom points; 0 = never. It takes
  /// the place of the annealing stages on the full clouds.
  int coarseGrid = 32;
  int coarseFrom = 2000;
  /// Truncated kernels (sinkhorn_truncated.h) where ε is small against the clouds' extent
  /// (kept share of the pairs at most kMaxKeptShare) and both clouds have truncateFrom points.
  bool truncation = true;
  int truncateFrom = 1000;
  // Every field changes the result: each is part of the key of the shared stores
  // (sameSinkhornOptions, sinkhorn_solver.cpp), so a new field goes there too.
};

/// True when every field of the two option sets is equal (all of them change a solve).
bool sameSinkhornOptions(const SinkhornOptions& x, const SinkhornOptions& y);

enum class SinkhornStatus { Converged, MaxIterations, Cancelled, InvalidInput };

struct SinkhornResult {
  SinkhornStatus status = SinkhornStatus::InvalidInput;
  std::string message = "solve was not called";
  double value = 0.0;          // OT_ε: the dual objective at the final potentials
  Eigen::VectorXd f, g;        // potentials in cost units (symmetric problem: g = f)
  int iterations = 0;          // full iterations, annealing stages included
  int stages = 0;              // distinct ε values used
  double marginalError = 0.0;  // L1 error of the row marginals of the final plan
  bool warmStarted = false;
  int coarseIterations = 0;    // iterations of the coarse solve (coarse start), not in `iterations`
  int coarsePoints = 0;        // points of the coarse clouds together (0: no coarse start)
  double omega = 1.0;          // over-relaxation factor in use at the end (1: plain updates)
  // Truncated kernel (sinkhorn_truncated.h): whether used, most pairs kept at once, times the
  // kept set was rebuilt, the bound on the full plan's mass on dropped pairs at the end, and
  // whether one dense pass checked the final marginals and value on all pairs.
  bool truncated = false;
  long long keptPairs = 0;
  int truncations = 0;
  double neglectedBound = 0.0;
  bool fullCheck = false;

  bool usable() const {
    return status == SinkhornStatus::Converged || status == SinkhornStatus::MaxIterations;
  }
};

/// Potentials to start from (from a previous solve on clouds of the same sizes).
struct SinkhornStart {
  const Eigen::VectorXd* f = nullptr;
  const Eigen::VectorXd* g = nullptr;
};

/// OT_ε between (x, a) and (y, b). `workers` may be null (a team is made for the call);
/// `start` may be null or hold potentials of the right sizes (then ε-scaling is skipped).
/// Identical inputs (same points and normalised weights) are solved by the symmetric update.
/// Polls `control` once per iteration. Never throws on bad input: status InvalidInput.
SinkhornResult solveSinkhorn(const Eigen::MatrixX2d& x, const Eigen::VectorXd& a,
                             const Eigen::MatrixX2d& y, const Eigen::VectorXd& b,
                             const SinkhornOptions& options, const RunControl* control = nullptr,
                             const SinkhornStart* start = nullptr, kernel::RowWorkers* workers = nullptr);

/// OT_ε(a, a) by symmetric updates; result.g is left empty (it equals f).
SinkhornResult solveSinkhornSymmetric(const Eigen::MatrixX2d& x, const Eigen::VectorXd& a,
                                      const SinkhornOptions& options, const RunControl* control = nullptr,
                                      const Eigen::VectorXd* startF = nullptr,
                                      kernel::RowWorkers* workers = nullptr);

/// Reason the options are unusable, if any.
std::string checkSinkhornOptions(const SinkhornOptions& options);

}  // namespace barrow
