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

/// max − min of the finite values (0 when fewer than two).
double finiteRange(const std::vector<double>& value);

}  // namespace barrow
