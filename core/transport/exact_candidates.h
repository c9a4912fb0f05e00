// Candidate arcs for the exact solver's first restricted problem: each point's k nearest
// points on the other side. Optimal plans move mass mostly between near points, so the
// restricted problem on these arcs is close to the full one; pricing every pair afterwards
// (column generation) adds whatever it misses, so the final answer does not depend on k.
#pragma once

#include <utility>
#include <vector>

#include "transport/exact_problem.h"

namespace barrow {

/// Pairs (i, j) of active points: j among the k nearest of i in B, or i among the k nearest
/// of j in A. Sorted and without repeats. k <= 0 gives none.
std::vector<std::pair<int, int>> nearestNeighbourArcs(const ExactProblem& pr, int k);

/// Sorts and removes repeats.
void sortUnique(std::vector<std::pair<int, int>>& arcs);

}  // namespace barrow
