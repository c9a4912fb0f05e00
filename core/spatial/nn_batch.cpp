#include "spatial/nn_batch.h"

#include <algorithm>
#include <optional>

namespace barrow {

NearestBatch nearestAll(const KdTree& tree, const Eigen::MatrixX2d& queries, const WorkSlice& slice,
                        int threads) {
  constexpr Eigen::Index kBlock = 1024;
  const Eigen::Index n = queries.rows();
  NearestBatch out;
  out.distance.assign(std::size_t(n), 0.0);
  out.index.assign(std::size_t(n), -1);
  const int blocks = int((n + kBlock - 1) / kBlock);
  if (threads == 0 && n < 4 * kBlock) threads = 1;  // not worth starting threads
  out.complete = runBlocks(
      blocks,
      [&](int b) {
        const Eigen::Index end = std::min(n, (b + 1) * kBlock);
        for (Eigen::Index i = b * kBlock; i < end; ++i) {
          const auto [d, j] = tree.nearest(queries.row(i).transpose());
          out.distance[std::size_t(i)] = d;
          out.index[std::size_t(i)] = j;
        }
      },
      slice, threads);
  return out;
}

MutualNearest mutualNearest(const Eigen::MatrixX2d& a, const Eigen::MatrixX2d& b, const WorkSlice& slice) {
  MutualNearest out;
  std::optional<KdTree> treeA, treeB;
  const bool big = a.rows() + b.rows() > 20000;
  runBlocks(2, [&](int t) { t == 0 ? (void)treeA.emplace(a) : (void)treeB.emplace(b); }, WorkSlice{}, big ? 2 : 1);
  const double na = double(a.rows()), nb = double(b.rows());
  out.ab = nearestAll(*treeB, a, slice.sub(0.0, na / (na + nb)));
  out.ba = out.ab.complete ? nearestAll(*treeA, b, slice.sub(na / (na + nb), 1.0)) : NearestBatch{{}, {}, false};
  out.complete = out.ab.complete && out.ba.complete;
  return out;
}

}  // namespace barrow
