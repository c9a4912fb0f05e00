#include "spatial/nn_batch.h"

#include <algorithm>
#include <cmath>
#include <numeric>
#include <tuple>
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

namespace {

// Repeated points collapsed to one. The k-d tree's search cannot prune boxes at distance 0
// once it has found a point at distance 0, so a query onto many coincident points visits all
// of them (20 000 equal points took seconds); with each location once it stays fast.
struct DistinctRows {
  Eigen::MatrixX2d points;           // one row per distinct location, ordered by first row
  std::vector<Eigen::Index> first;   // smallest original row at each location
  std::vector<Eigen::Index> of;      // distinct location of each original row
};

DistinctRows distinctRows(const Eigen::MatrixX2d& p) {
  const Eigen::Index n = p.rows();
  std::vector<Eigen::Index> order(static_cast<std::size_t>(n));
  std::iota(order.begin(), order.end(), Eigen::Index(0));
  std::sort(order.begin(), order.end(), [&](Eigen::Index i, Eigen::Index j) {
    return std::tie(p(i, 0), p(i, 1), i) < std::tie(p(j, 0), p(j, 1), j);
  });
  // Group equal locations; each group's first row is its smallest (the sort breaks ties by row).
  std::vector<Eigen::Index> groupOf(static_cast<std::size_t>(n)), firstOfGroup;
  for (std::size_t t = 0; t < order.size(); ++t) {
    const Eigen::Index i = order[t];
    if (t == 0 || p(i, 0) != p(order[t - 1], 0) || p(i, 1) != p(order[t - 1], 1)) firstOfGroup.push_back(i);
    groupOf[std::size_t(i)] = Eigen::Index(firstOfGroup.size() - 1);
  }
  // Number the locations by first row, so that ties between them still go to the smaller row.
  std::vector<Eigen::Index> rank(firstOfGroup.size());
  std::iota(rank.begin(), rank.end(), Eigen::Index(0));
  std::sort(rank.begin(), rank.end(), [&](Eigen::Index g, Eigen::Index h) {
    return firstOfGroup[std::size_t(g)] < firstOfGroup[std::size_t(h)];
  });
  std::vector<Eigen::Index> position(rank.size());
  DistinctRows d;
  d.points.resize(Eigen::Index(rank.size()), 2);
  for (std::size_t k = 0; k < rank.size(); ++k) {
    position[std::size_t(rank[k])] = Eigen::Index(k);
    d.first.push_back(firstOfGroup[std::size_t(rank[k])]);
    d.points.row(Eigen::Index(k)) = p.row(d.first.back());
  }
  d.of.resize(static_cast<std::size_t>(n));
  for (Eigen::Index i = 0; i < n; ++i) d.of[std::size_t(i)] = position[std::size_t(groupOf[std::size_t(i)])];
  return d;
}

// Queries answered per distinct location, spread back to every row.
NearestBatch nearestFor(const KdTree& tree, const DistinctRows& targets, const DistinctRows& queries,
                        const WorkSlice& slice) {
  const NearestBatch once = nearestAll(tree, queries.points, slice);
  NearestBatch out;
  out.complete = once.complete;
  if (!once.complete) return out;
  for (const Eigen::Index k : queries.of) {
    out.distance.push_back(once.distance[std::size_t(k)]);
    out.index.push_back(targets.first[std::size_t(once.index[std::size_t(k)])]);
  }
  return out;
}

}  // namespace

MutualNearest mutualNearest(const Eigen::MatrixX2d& aIn, const Eigen::MatrixX2d& bIn, const WorkSlice& slice) {
  // The tree compares squared distances, which overflow for coordinates beyond ~1e154 and
  // underflow to 0 below ~1e-154 (A = (0,0), B = (1e-300,0) gave distance 0). When every
  // coordinate is that small or large, both sets are divided by one power of two that brings
  // the largest near 1 — exact, and it keeps every comparison — and the distances are
  // multiplied back at the end. Ordinary data (largest within 2^±60) is left as it is.
  const double largest = std::max(aIn.cwiseAbs().maxCoeff(), bIn.cwiseAbs().maxCoeff());
  const bool extreme = largest > 0 && std::isfinite(largest) && (largest < 0x1p-60 || largest > 0x1p60);
  const double unit = extreme ? std::ldexp(1.0, std::ilogb(largest)) : 1.0;
  const Eigen::MatrixX2d a = aIn / unit, b = bIn / unit;
  MutualNearest out;
  std::optional<DistinctRows> da, db;
  std::optional<KdTree> treeA, treeB;
  const bool big = a.rows() + b.rows() > 20000;
  runBlocks(
      2,
      [&](int t) {
        if (t == 0) treeA.emplace((da = distinctRows(a))->points);
        else treeB.emplace((db = distinctRows(b))->points);
      },
      WorkSlice{}, big ? 2 : 1);
  const double na = double(da->points.rows()), nb = double(db->points.rows());
  out.ab = nearestFor(*treeB, *db, *da, slice.sub(0.0, na / (na + nb)));
  out.ba = out.ab.complete ? nearestFor(*treeA, *da, *db, slice.sub(na / (na + nb), 1.0)) : NearestBatch{{}, {}, false};
  out.complete = out.ab.complete && out.ba.complete;
  for (double& d : out.ab.distance) d *= unit;
  for (double& d : out.ba.distance) d *= unit;
  return out;
}

}  // namespace barrow
