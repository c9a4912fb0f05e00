// What the exact solver keeps between calls for a warm start (EvalContext::warm): the
// optimal basis of the last solve, valid for any clouds with the same sizes and weights
// (moving points changes costs only, so the old basis stays primal feasible and the
// simplex just re-optimises), plus the arcs column generation had to add.
#pragma once

#include <array>
#include <cstdint>
#include <vector>

#include "measures/measure.h"

namespace barrow {

struct ExactWarmState : WarmState {
  double p = 0.0;                          // cost exponent of the solve
  std::vector<std::int64_t> massA, massB;  // integer masses per input row (0: zero weight)
  std::vector<std::array<int, 2>> basisArcs;  // (row of A, row of B) of each basic arc
  std::vector<std::int64_t> basisFlows;
  std::vector<int> roots;                  // component roots: row of A, or n + row of B
  std::vector<std::array<int, 2>> addedArcs;  // arcs found by pricing in the last solve
};

}  // namespace barrow
