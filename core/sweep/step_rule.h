// Which steps of a sampled curve D(θ) look like jumps. Shared by the sweep's adaptive
// refinement (which bisects the intervals this rule flags) and by the continuity findings
// (which report the flagged intervals left after refinement), so the two always agree.
//
// An interval [θ_k, θ_k+1] between valid neighbours is jump-like when
//   * exactly one end is +∞ (a jump to or from infinity), or
//   * both ends are finite, its step |ΔD| exceeds `floor` × (range of the finite values), and
//     its secant slope |ΔD|/Δθ exceeds `factor` × the median secant slope of up to `window`
//     finite intervals on each side.
// A continuous curve stops being jump-like once bisection resolves its steep part (secant
// slopes converge to the derivative); a jump stays jump-like at every width, because its step
// does not shrink while the neighbouring slopes stay bounded. [CP] robust local outlier test
// (median of neighbours), no single source.
#pragma once

#include <cstddef>
#include <vector>

namespace barrow {

struct StepRule {
  double factor = 4.0;  // slope multiple over the neighbours' median, > 1
  int window = 3;       // neighbouring intervals on each side, >= 1
  double floor = 1e-3;  // smallest step counted, as a fraction of the curve's finite range
};

/// One interval between consecutive valid samples (NaN samples are skipped).
struct StepInterval {
  std::size_t left = 0;   // index into the θ/value arrays
  std::size_t right = 0;  // next valid index
  double step = 0.0;      // value[right] − value[left]; ±inf when one end is infinite
  bool jumpLike = false;
};

/// Pre: theta strictly increasing, theta.size() == value.size(). Values may be +inf (a
/// legitimate value) or NaN (failed; skipped). Returns the intervals in θ order.
std::vector<StepInterval> classifySteps(const std::vector<double>& theta,
                                        const std::vector<double>& value, const StepRule& rule);

/// The confirmation test a jump-like interval must pass, after refinement, to be reported as
/// a jump (see judgeSteps).
struct JumpTest {
  double resolution = 0.0;  // θ width an interval must be bisected down to; <= 0: none was
  double safety = 4.0;      // multiple of the local slope × width the step must exceed, > 1
  double accuracy = 0.0;    // absolute accuracy of the values (the solver's own), >= 0
};

enum class StepVerdict {
  Smooth,      // the change is explained by the local slope (or below the noise floor)
  Jump,        // confirmed: resolved to the resolution and far above the local slope
  Unresolved,  // jump-like, but not bisected down to the resolution (or no neighbours to judge)
};

struct JudgedStep {
  StepInterval interval;
  StepVerdict verdict = StepVerdict::Smooth;
};

/// Every interval of classifySteps with its verdict (Smooth for those it does not flag as
/// jump-like). A flagged finite step over an interval of width h is a Jump only when
///   h <= resolution                                  (refinement reached the resolution),
///   |ΔD| > max(floor, 2·accuracy)                      (above the noise floor), and
///   |ΔD| > safety · L · h,  L = the largest secant slope of up to `window` finite intervals
///                                 on each side (the local slope, from the well-resolved
///                                 steps next to it),
/// i.e. no slope seen around it could produce the change over h. A change to or from +∞ is a
/// Jump once h <= resolution. Anything wider is Unresolved. Assumption: D's slope does not grow
/// by more than `safety` within a few widths h of the interval, so a continuous curve steeper
/// than that on a scale below h is indistinguishable from a jump at this resolution. [CP]
std::vector<JudgedStep> judgeSteps(const std::vector<double>& theta, const std::vector<double>& value,
                                   const StepRule& rule, const JumpTest& test);

/// max − min of the finite values (0 when fewer than two).
double finiteRange(const std::vector<double>& value);

}  // namespace barrow
