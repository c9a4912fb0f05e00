#include "transport/exact_candidates.h"

#include <algorithm>

#include "spatial/kd_tree.h"

namespace barrow {

void sortUnique(std::vector<std::pair<int, int>>& arcs) {
  std::sort(arcs.begin(), arcs.end());
  arcs.erase(std::unique(arcs.begin(), arcs.end()), arcs.end());
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
