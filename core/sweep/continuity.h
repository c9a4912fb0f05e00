// Turns a sweep into continuity findings per measure (see findings.h):
//  * jumps: intervals the StepRule still finds jump-like after refinement (the step did not
//    shrink when bisected down to the θ tolerance); a change to or from +∞ is a jump. Without
//    refinement (e.g. a CSV written with refinement off) the same rule is applied to the grid
//    alone, which cannot tell a jump from a change steeper than the grid, and the summary says so;
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
  double flatSlope = 1e-3;      // "negligible" slope, relative to range(D)/range(θ)
  double nearMinimum = 1e-2;    // D within this share of its range above the minimum is "at the minimum"
  double monotoneSlack = 1e-3;  // tolerated decrease away from the best θ, share of the range
  double constantShare = 1e-6;  // D varying by less than this share of |D| counts as constant
  int minFlatPoints = 3;        // shorter runs (in points and in spacings) are not stretches
};

std::vector<Finding> findContinuity(const SweepResult& r);
std::vector<Finding> findContinuity(const SweepResult& r, const ContinuityOptions& options);

/// The findings of one series (θ from the result it belongs to).
Finding findContinuity(const std::vector<double>& theta, const SweepSeries& s, bool refined,
                       const ContinuityOptions& options);

}  // namespace barrow
