// Continuity findings for one measure along a sweep: jumps, flat stretches, a Lipschitz
// estimate, monotone growth away from the best θ, and one plain sentence.
#pragma once

#include <string>
#include <utility>
#include <vector>

#include "sweep/sweep_result.h"

namespace barrow {

struct Jump {
  double theta = 0.0;  // location (midpoint of the bracketing interval after refinement)
  double size = 0.0;   // D(right) - D(left); +inf when D jumps to +∞, -inf when it comes from +∞
  double width = 0.0;  // θ width of the bracketing interval
};

struct Finding {
  std::string id;
  bool continuous = true;    // no jump and no unresolved suspect
  std::vector<Jump> jumps;   // confirmed (see judgeSteps in step_rule.h)
  std::vector<Jump> unresolved;  // jump-like, but refinement did not reach the resolution
  double resolution = 0.0;   // θ width jumps were confirmed at; 0 = no refinement
  bool infiniteEverywhere = false;  // +∞ at every θ that did not fail
  std::vector<std::pair<double, double>> flat;  // [θ_start, θ_end] stretches with no gradient
  double lipschitz = 0.0;  // max |ΔD/Δθ| between neighbours, jumps and unresolved suspects excluded
  bool monotone = true;  // D grows (weakly) with distance from its best θ on both sides
  std::string summary;   // plain words, e.g. "js is constant at 0.693 for θ > 0.13: no gradient there"
};

}  // namespace barrow
