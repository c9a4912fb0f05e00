// What the exact solver keeps between calls for a warm start (EvalContext::warm): the
// optimal basis of the last solve, valid for any clouds with the same sizes and weights
// (moving points changes costs only, so the old basis stays primal feasible and the
// simplex just re-optimises), plus the arcs column generation had to add.
#pragma once

#include <array>
#include <cstdint>
#include <memory>
#include <utility>
#include <vector>

#include "base/warm_state.h"
#include "transport/exact_initial_basis.h"
#include "transport/exact_problem.h"

namespace barrow {

struct ExactWarmState : WarmState {
  double p = 0.0;                          // cost exponent of the solve
  std::vector<std::int64_t> massA, massB;  // integer masses per input row (0: zero weight)
  std::vector<std::array<int, 2>> basisArcs;  // (row of A, row of B) of each basic arc
  std::vector<std::int64_t> basisFlows;
  std::vector<int> roots;                  // component roots: row of A, or n + row of B
  std::vector<std::array<int, 2>> addedArcs;  // arcs found by pricing in the last solve
};

/// Integer masses per input row (0 for rows left out), of A (`sideA`) or of B.
std::vector<std::int64_t> massesPerRow(const ExactProblem& pr, bool sideA, Eigen::Index rows);

/// The stored basis in pr's active indices (roots: sources 0..n-1, sinks n..), plus the
/// stored extra arcs appended to `arcs`. False, and nothing usable, when the state belongs
/// to other sizes, weights or cost.
bool unpackWarmState(const ExactWarmState& ws, const ExactProblem& pr, Eigen::Index n, Eigen::Index m,
                     std::vector<FlowArc>* basis, std::vector<int>* roots, std::vector<std::pair<int, int>>* arcs);

/// A state holding `basis`, `roots` and `added` (pr's active indices) under input rows.
std::shared_ptr<ExactWarmState> packWarmState(const ExactProblem& pr, Eigen::Index n, Eigen::Index m,
                                              const std::vector<FlowArc>& basis, const std::vector<int>& roots,
                                              const std::vector<std::pair<int, int>>& added);

}  // namespace barrow
