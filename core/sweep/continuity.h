// Turns a sweep into continuity findings per measure (see findings.h):
//  * jumps: the StepRule flags suspect intervals (a step far steeper than its neighbours');
//    the sweep bisects them down to the resolution h (its θ tolerance). A suspect is reported
//    as a jump only when judgeSteps (step_rule.h) confirms it: width <= h, a change above the
//    noise floor and the solver's accuracy, and above `safety` × (the largest neighbouring
//    slope) × h — a change no slope seen around it can explain. A change to or from +∞ is a
//    jump once resolved. A suspect the refinement could not bring down to h (budget spent, or
//    no refinement at all) is listed as *unresolved*, never as a jump, and the summary says so.
//    Assumption: the slope of D does not grow more than `safety`-fold within a few widths h;
//    a continuous change steeper than that below the resolution looks like a jump.
//  * flat stretches: at least `minFlatPoints` consecutive θ, spanning as many typical (median)
//    θ spacings, where |dD/dθ| is below `flatSlope` × (range of D)/(range of θ), or D is +∞,
//    while D is not at its minimum — no useful gradient;
//  * a Lipschitz estimate: max |ΔD/Δθ| over neighbouring finite samples, jump intervals excluded;
//  * monotone: D does not decrease (beyond `monotoneSlack` × range) moving away from its best θ.
// Thresholds are [CP]; they are relative to each measure's own range, so measures of any scale
// are judged alike.
#pragma once

#include <vector>

#include "sweep/findings.h"
#include "sweep/step_rule.h"
#include "sweep/sweep_result.h"

namespace barrow {

struct ContinuityOptions {
  StepRule stepRule;            // must match the sweep's (the default does)
  double jumpSafety = 4.0;      // see JumpTest::safety
  double flatSlope = 1e-3;      // "negligible" slope, relative to range(D)/range(θ)
  double nearMinimum = 1e-2;    // D within this share of its range above the minimum is "at the minimum"
  double monotoneSlack = 1e-3;  // tolerated decrease away from the best θ, share of the range
  double constantShare = 1e-6;  // D varying by less than this share of |D| counts as constant
  int minFlatPoints = 3;        // shorter runs (in points and in spacings) are not stretches
};

std::vector<Finding> findContinuity(const SweepResult& r);
std::vector<Finding> findContinuity(const SweepResult& r, const ContinuityOptions& options);

/// The findings of one series (θ from the result it belongs to); `resolution` is the θ width
/// refinement bisected suspects down to (0: no refinement).
Finding findContinuity(const std::vector<double>& theta, const SweepSeries& s, double resolution,
                       const ContinuityOptions& options);

}  // namespace barrow
