#include "transport/exact_warm_state.h"

namespace barrow {
namespace {

std::vector<int> activeIndex(const std::vector<int>& rows, Eigen::Index size) {
  std::vector<int> out(std::size_t(size), -1);
  for (std::size_t k = 0; k < rows.size(); ++k) out[std::size_t(rows[k])] = int(k);
  return out;
}

}  // namespace

std::vector<std::int64_t> massesPerRow(const ExactProblem& pr, bool sideA, Eigen::Index rows) {
  const auto& mass = sideA ? pr.massA : pr.massB;
  const auto& row = sideA ? pr.rowA : pr.rowB;
  std::vector<std::int64_t> out(std::size_t(rows), 0);
  for (std::size_t k = 0; k < row.size(); ++k) out[std::size_t(row[k])] = mass[k];
  return out;
}

bool unpackWarmState(const ExactWarmState& ws, const ExactProblem& pr, Eigen::Index n, Eigen::Index m,
                     std::vector<FlowArc>* basis, std::vector<int>* roots, std::vector<std::pair<int, int>>* arcs) {
  if (ws.p != pr.cost.p() || ws.basisArcs.size() != ws.basisFlows.size() || ws.massA != massesPerRow(pr, true, n) ||
      ws.massB != massesPerRow(pr, false, m))
    return false;
  const auto toA = activeIndex(pr.rowA, n), toB = activeIndex(pr.rowB, m);
  auto fits = [&](int i, int j) {
    return i >= 0 && i < n && j >= 0 && j < m && toA[std::size_t(i)] >= 0 && toB[std::size_t(j)] >= 0;
  };
  for (std::size_t k = 0; k < ws.basisArcs.size(); ++k) {
    const auto [i, j] = ws.basisArcs[k];
    if (!fits(i, j)) return false;
    basis->push_back({toA[std::size_t(i)], toB[std::size_t(j)], ws.basisFlows[k]});
  }
  for (int r : ws.roots) {
    const int node = r < 0 ? -1 : r < n ? toA[std::size_t(r)] : r - n < m ? toB[std::size_t(r - n)] : -1;
    if (node < 0) return false;
    roots->push_back(r < n ? node : pr.n() + node);
  }
  for (const auto& [i, j] : ws.addedArcs)
    if (fits(i, j)) arcs->emplace_back(toA[std::size_t(i)], toB[std::size_t(j)]);
  return true;
}

std::shared_ptr<ExactWarmState> packWarmState(const ExactProblem& pr, Eigen::Index n, Eigen::Index m,
                                              const std::vector<FlowArc>& basis, const std::vector<int>& roots,
                                              const std::vector<std::pair<int, int>>& added) {
  auto ws = std::make_shared<ExactWarmState>();
  ws->p = pr.cost.p();
  ws->massA = massesPerRow(pr, true, n);
  ws->massB = massesPerRow(pr, false, m);
  for (const auto& f : basis) {
    ws->basisArcs.push_back({pr.rowA[std::size_t(f.i)], pr.rowB[std::size_t(f.j)]});
    ws->basisFlows.push_back(f.flow);
  }
  for (int node : roots)
    ws->roots.push_back(node < pr.n() ? pr.rowA[std::size_t(node)] : int(n) + pr.rowB[std::size_t(node - pr.n())]);
  for (const auto& [i, j] : added) ws->addedArcs.push_back({pr.rowA[std::size_t(i)], pr.rowB[std::size_t(j)]});
  return ws;
}

}  // namespace barrow
