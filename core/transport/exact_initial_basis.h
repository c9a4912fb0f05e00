// Starting bases for the exact solver: flows that meet every mass exactly on a forest of
// arcs with positive flow (so any rooting is strongly feasible).
//
// - Greedy (least cost first, the "matrix minimum" rule of transportation textbooks, e.g.
//   Bazaraa, Jarvis & Sherali, "Linear Programming and Network Flows", ch. 10): walk the
//   candidate arcs by increasing cost and ship as much as both ends still have.
// - North-west corner rule (same textbook) on both clouds sorted along their joint principal
//   axis: the monotone coupling, optimal for collinear data and a fair start otherwise.
// Every shipment exhausts at least one end, which therefore gets no later arc: the arcs form
// a forest. Mass the greedy walk leaves over is matched by the north-west rule.
#pragma once

#include <cstdint>
#include <utility>
#include <vector>

#include "transport/exact_problem.h"

namespace barrow {

struct FlowArc {
  int i = 0;
  int j = 0;
  std::int64_t flow = 0;
};

/// Greedy over `arcs` by increasing `order` (one key per arc; empty: the arc costs).
std::vector<FlowArc> greedyBasis(const ExactProblem& pr, const std::vector<std::pair<int, int>>& arcs,
                                 std::vector<double> order = {});
std::vector<FlowArc> northWestBasis(const ExactProblem& pr);

}  // namespace barrow
