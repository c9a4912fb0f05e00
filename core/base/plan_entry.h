// One nonzero of a transport plan, the vocabulary shared by the solvers, the measures and the
// families (the interpolate family moves mass along the W2 plan).
#pragma once

namespace barrow {

/// Mass moved from A's point i to B's point j (indices into the clouds as given; masses under
/// the normalised weights, summing to 1).
struct PlanEntry {
  int i = 0;
  int j = 0;
  double mass = 0.0;
};

}  // namespace barrow
