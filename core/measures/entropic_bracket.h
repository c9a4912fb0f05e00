// A certified bracket [low, high] on OT_ε(A, B) for clouds too large for the full Sinkhorn
// solve in the time a user waits (issue 13; `entropic` and `sinkhorn` above their exact_limit).
//
// Rule [D]:
//   QA, QB = each cloud quantised to k representatives at its cells' weighted means
//   (spatial/cloud_quantiser.h); OT_ε(QA, QB) solved by Sinkhorn (sinkhorn_solver.h).
//   high = (rounded-coupling bound on OT_ε(QA, QB), transport/entropic_bounds.h) + lift, where
//     the coupling of A and B that spreads the quantised plan π_rs over the points of cell r
//     and cell s in proportion to their weights has the same KL term (its density against
//     a⊗b is π_rs / (qa_r qb_s) on the whole block) and costs at most ⟨C_Q, π⟩ + lift, with
//     lift = eA² + eB² exactly for p = 2 (cross terms vanish about the cell means), e = Σ a_i
//     |x_i − q(x_i)|^p; for p = 1 at most eA + eB (triangle inequality), and block by block at
//     most sqrt(d² + V_r + V_s) − d (Jensen), priced on the rounded quantised plan.
//   low = the dual objective on all points (weak duality, entropic_bounds.h) at f, the potential
//     carried from the quantised solve to every point of A by a c-transform (sinkhorn_coarse.h),
//     and the c-transform of f on all of B. Near the optimum the dual's gap is second order in
//     the potentials' error, so one pass over the pairs gives a tight low.
// Cost: the quantised solve (k² per iteration) and one pass over the n·m pairs.
#pragma once

#include <Eigen/Core>
#include <nlohmann/json.hpp>
#include <string>

#include "base/row_workers.h"
#include "base/run_control.h"
#include "cloud/cloud.h"
#include "transport/sinkhorn_solver.h"

namespace barrow {

/// Default settings: clouds above exactLimit points of positive weight are bracketed, each
/// quantised to `representatives` points.
inline constexpr int kEntropicDefaultExactLimit = 30000;
inline constexpr int kEntropicDefaultRepresentatives = 8192;

struct EntropicBracket {
  bool usable = false;     // low/high certified
  bool cancelled = false;
  std::string message;     // why not usable
  double low = 0.0, high = 0.0;
  double quantisedValue = 0.0;              // OT_ε(QA, QB) as the quantised solve reports it
  double quantisedHigh = 0.0;               // its rounded-coupling bound
  double lift = 0.0;                        // added to it for high
  double errorA = 0.0, errorB = 0.0;        // e as above, per cloud
  long long representativesA = 0, representativesB = 0;
  SinkhornResult quantised;                 // the quantised solve (potentials dropped)
  double seconds = 0.0;
};

/// OT_ε(A, B) bracketed as above; `self` solves OT_ε(A, A) (b ignored) by the symmetric
/// update. Pre: a, b validated; options checked; representatives >= 1.
EntropicBracket bracketEntropic(const Cloud& a, const Cloud& b, bool self, const SinkhornOptions& options,
                                Eigen::Index representatives, const RunControl* control,
                                kernel::RowWorkers& workers);

/// bracketEntropic through a small store of the last few usable brackets, so that `entropic`
/// and `sinkhorn` on the same clouds and settings quantise and solve OT_ε(A, B) once. Two
/// requests are the same when the points, the weights, `self`, every option and the number of
/// representatives are equal (compared in full, not by a hash).
EntropicBracket bracketEntropicShared(const Cloud& a, const Cloud& b, bool self, const SinkhornOptions& options,
                                      Eigen::Index representatives, const RunControl* control,
                                      kernel::RowWorkers& workers);

/// Forgets every kept bracket (tests and benchmarks that time the work itself).
void clearEntropicBrackets();

/// The bracket's rule and diagnostics under `prefix` (e.g. "" or "ab_").
void addBracketDetails(nlohmann::json& d, const std::string& prefix, const EntropicBracket& e);

}  // namespace barrow
