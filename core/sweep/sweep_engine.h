// Runs a θ sweep: evaluates the chosen measures on A_θ (see families/family_map.h) against
// the fixed B over a θ grid, on worker threads, with warm starts between neighbouring θ, data-
// dependent settings frozen at the reference θ, gradients dD/dθ, and adaptive refinement
// near suspected jumps.
//
// Gradients: analytic where the measure gives ∇_{x_i}D (Measure::gradientA, e.g. through
// the optimal plan by the envelope theorem): dD/dθ = Σ_i ⟨∇_{x_i}D, dx_i/dθ⟩ with the family's
// velocity (chain rule [D]). Otherwise, and always for `mix`, second-order finite differences
// on the sweep's own θ values (three-point formula for uneven spacing [D]). Where the exact
// plan is not unique ("plan_unique": false in the details) the analytic value is one of the
// one-sided derivatives and the point is marked oneSided.
//
// Refinement: intervals that the StepRule flags as jump-like in any series are bisected
// (every series is evaluated at the new θ) until they are no longer jump-like or narrower
// than the θ tolerance, within a point budget.
#pragma once

#include <vector>

#include "base/params.h"
#include "base/run_control.h"
#include "cloud/cloud.h"
#include "measures/measure.h"
#include "sweep/step_rule.h"
#include "sweep/sweep_result.h"
#include "sweep/sweep_settings.h"

namespace barrow {

struct SweepRequest {
  SweepSettings settings;
  ParamSet params;            // user settings, group.key = value, for every measure
  bool warmStart = true;      // pass solver state between neighbouring θ
  bool refineJumps = true;    // bisect around suspected jumps
  int threads = 0;            // threads in all, nested work included; 0 = the control's budget (all cores)
  bool analyticGradients = true;  // false: finite differences for every measure
  double thetaTolerance = 0.0;    // refinement stops at this θ width; 0 = 1e-5 × (to − from)
  int maxRefinePoints = 0;        // θ values refinement may insert; 0 = max(64, steps);
                                  // at most kMaxRefinePoints
  StepRule stepRule;              // what counts as jump-like (shared with the findings)
  /// Measures to sweep given as objects (custom or test measures); when non-empty they are
  /// used instead of settings.measures and the registry. Pointers must outlive the call.
  std::vector<const Measure*> measureObjects;
};

constexpr int kMaxRefinePoints = 100000;

/// The refinement budget a request gets (its own, or the default max(64, steps)).
int refineBudgetFor(const SweepRequest& req);

/// The k-th θ of the grid (k = 0 … steps − 1), from `from` to `to` in equal steps, snapped to
/// the shortest decimal within a few ulps.
double gridTheta(const SweepSettings& s, int k);

/// Never throws for bad input: an unusable request gives an empty θ list and the reason in
/// `message`; a measure that fails at some θ gets NaN there with its status and message.
/// Cancelling (RunControl) returns what was computed, cancelled = true, and NaN/Cancelled
/// for the rest.
SweepResult runSweep(const Cloud& a, const Cloud& b, const SweepRequest& req,
                     const RunControl* control = nullptr);

}  // namespace barrow
