// Exact optimal transport between two weighted clouds in the plane, ground cost ‖x − y‖^p:
//   min_π Σ π_ij ‖x_i − y_j‖^p  s.t.  Σ_j π_ij = a_i,  Σ_i π_ij = b_j,  π >= 0,
// with a, b the normalised weights; the value reported is W_p = (optimal cost)^(1/p).
//
// Method: network simplex (see network_simplex.h) with column generation. The restricted
// problem holds each point's k nearest points on the other side plus a starting basis;
// after each restricted optimum, every one of the n·m pairs is priced from coordinates
// (exact_pricing.h; a tree of the sinks skips boxes that cannot violate) and the violated
// arcs are added, until none is left. The answer is therefore exact for the full problem
// (the final pricing is the certificate), while memory stays O(n + m + arcs added).
// Large problems start coarse-to-fine (exact_multiscale.h): groups of about four points are
// solved first and their optimum seeds the start. A warm start reuses the previous basis.
// Dual potentials: u_i + v_j <= c_ij for every pair (u is the c-transform of v), equality
// up to the tolerance on the support.
//
// Measured choices (tests/bench/RESULTS-exact-ot.md): greedy beats the north-west start,
// the coarse-to-fine start beats both by 1.6-2x, and column generation is what lets the
// solver skip the n·m arcs a plain network simplex must hold.
//
// Units: cost, u and v in (coordinate units)^p; value in coordinate units; plan masses under
// the normalised weights (summing to 1).
#pragma once

#include <Eigen/Core>
#include <memory>
#include <optional>
#include <string>
#include <vector>

#include "base/plan_entry.h"
#include "base/run_control.h"
#include "base/warm_state.h"
#include "cloud/cloud.h"

namespace barrow {

enum class ExactOtStatus {
  Optimal,         // certificate holds: feasible plan, feasible duals, zero gap
  InvalidInput,    // clouds or options rejected; see message
  Cancelled,       // RunControl asked to stop; no result
  IterationLimit,  // pivot budget spent; plan feasible but maybe not optimal
};

enum class InitialBasis {
  Greedy,     // least cost first over the candidate arcs (measured faster; the default)
  NorthWest,  // north-west corner along the principal axis
};

struct ExactOtOptions {
  double p = 1.0;                 // ground cost ‖x − y‖^p, p >= 1
  double tolerance = 1e-12;       // an arc may enter when its reduced cost < −tolerance·S,
                                  // S = (bounding-box diagonal)^p; in (0, 1e-3]
  long long maxPivots = 2000000000;  // iteration limit over all levels and rounds, >= 0
  int neighbours = 6;             // candidate arcs per point (k nearest), >= 0
  int warmNeighbours = 0;         // the same for warm starts, which begin from the old
                                  // basis and the arcs pricing added last time (measured:
                                  // extra neighbours only slow them down)
  int arcsPerRow = 8;             // violated arcs added per source and pricing round, >= 1
  InitialBasis initial = InitialBasis::Greedy;  // start of the coarsest (or only) level
  bool multiscale = true;         // start large problems from a solve on grouped points
  int groupSize = 4;              // points per group on each coarser level, >= 2
  int guidedArcs = 8;             // arcs per point chosen by the coarse potentials, >= 0
  int coarsestSize = 256;         // no coarser level once a side has at most this many
                                  // points, >= 1
};

struct ExactOtResult {
  ExactOtStatus status = ExactOtStatus::InvalidInput;
  std::string message = "solve was not called";
  double cost = NAN;              // Σ π_ij c_ij
  double value = NAN;             // cost^(1/p)
  std::vector<PlanEntry> plan;    // nonzeros of π (at most n + m − 1), rows of A and B as given
  Eigen::VectorXd u, v;           // potentials per input row of A and of B
  long long pivots = 0;
  long long degeneratePivots = 0;
  int rounds = 0;                 // pricing passes over all pairs (all levels)
  int arcs = 0;                   // arcs the restricted problems held at the end
  double seconds = 0.0;
  double marginalError = NAN;     // max |row or column sum of π − weight|
  double dualGap = NAN;           // cost − (Σ a_i u_i + Σ b_j v_j): 0 up to rounding
  bool warmStarted = false;
  std::optional<bool> planUnique; // false: some arc off the basis has zero reduced cost
};

/// The options the w1/w2 measures use for an exact solve (not their bracket's) for cost
/// exponent p: the defaults above, except that for
/// p = 1 the coarse-to-fine start guides 24 arcs per point and pricing adds up to 16 per
/// row. Under |x − y| the potentials tie along whole rays, so the few nearest neighbours and
/// 8 guided arcs miss much of the optimal support; the wider candidate sets took a quarter
/// fewer instructions on 10^4 shifted clouds and 4000-point clusters (3 % fewer on uniform
/// clouds with random weights, 16 % more on uniform weights at 4000; tests/bench/
/// RESULTS-exact-ot.md). Under |x − y|² they changed nothing worth the arcs.
ExactOtOptions exactOtOptionsFor(double p);

/// Pre: none (bad clouds or options give InvalidInput). `warm` may be null; when it holds
/// an ExactWarmState for clouds of the same sizes and weights the solve starts from it, and
/// after an optimal solve it is replaced by this solve's state.
ExactOtResult solveExactOt(const Cloud& a, const Cloud& b, const ExactOtOptions& options = {},
                           const RunControl* control = nullptr, std::shared_ptr<WarmState>* warm = nullptr);

}  // namespace barrow
