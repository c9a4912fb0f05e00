#include "transport/exact_candidates.h"

#include <algorithm>
#include <iterator>

#include "spatial/kd_tree.h"

namespace barrow {

// Counting sort on the source, then the few sinks of each source sorted in place.
void sortUnique(std::vector<std::pair<int, int>>& arcs) {
  if (arcs.empty()) return;
  int sources = 0;
  for (const auto& a : arcs) sources = std::max(sources, a.first + 1);
  std::vector<int> start(std::size_t(sources) + 1, 0);
  for (const auto& a : arcs) ++start[std::size_t(a.first) + 1];
  for (std::size_t s = 1; s < start.size(); ++s) start[s] += start[s - 1];
  std::vector<std::pair<int, int>> sorted(arcs.size());
  std::vector<int> fill(start.begin(), start.end() - 1);
  for (const auto& a : arcs) sorted[std::size_t(fill[std::size_t(a.first)]++)] = a;
  arcs.clear();
  for (int s = 0; s < sources; ++s) {
    const auto first = sorted.begin() + start[std::size_t(s)], last = sorted.begin() + start[std::size_t(s) + 1];
    std::sort(first, last);
    std::unique_copy(first, last, std::back_inserter(arcs));
  }
}

std::vector<std::pair<int, int>> nearestNeighbourArcs(const ExactProblem& pr, int k) {
  std::vector<std::pair<int, int>> arcs;
  if (k <= 0) return arcs;
  arcs.reserve(std::size_t(k) * std::size_t(pr.n() + pr.m()));
  auto side = [&](const Eigen::ArrayXd& qx, const Eigen::ArrayXd& qy, const Eigen::ArrayXd& tx,
                  const Eigen::ArrayXd& ty, bool queryIsA) {
    Eigen::MatrixX2d pts(tx.size(), 2);
    pts.col(0) = tx.matrix();
    pts.col(1) = ty.matrix();
    const KdTree tree(pts);
    for (Eigen::Index q = 0; q < qx.size(); ++q)
      for (const auto& [d, t] : tree.knn(Eigen::Vector2d(qx(q), qy(q)), k)) {
        (void)d;
        arcs.emplace_back(queryIsA ? int(q) : int(t), queryIsA ? int(t) : int(q));
      }
  };
  side(pr.ax, pr.ay, pr.bx, pr.by, true);
  side(pr.bx, pr.by, pr.ax, pr.ay, false);
  sortUnique(arcs);
  return arcs;
}

}  // namespace barrow
