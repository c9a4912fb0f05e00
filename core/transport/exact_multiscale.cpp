#include "transport/exact_multiscale.h"

#include <algorithm>
#include <functional>
#include <numeric>

#include "transport/exact_candidates.h"
#include "transport/exact_site_tree.h"

namespace barrow {
namespace {

// Median splits along the wider axis until a part has at most `groupSize` points; returns
// the group of each point and the number of groups.
int splitGroups(const Eigen::ArrayXd& x, const Eigen::ArrayXd& y, int groupSize, std::vector<int>* group) {
  std::vector<int> idx(std::size_t(x.size()));
  std::iota(idx.begin(), idx.end(), 0);
  group->assign(idx.size(), 0);
  int groups = 0;
  std::vector<std::pair<int, int>> todo{{0, int(idx.size())}};
  while (!todo.empty()) {
    const auto [begin, end] = todo.back();
    todo.pop_back();
    if (end - begin <= groupSize) {
      for (int t = begin; t < end; ++t) (*group)[std::size_t(idx[std::size_t(t)])] = groups;
      ++groups;
      continue;
    }
    double x0 = INFINITY, x1 = -INFINITY, y0 = INFINITY, y1 = -INFINITY;
    for (int t = begin; t < end; ++t) {
      const int i = idx[std::size_t(t)];
      x0 = std::min(x0, x(i)), x1 = std::max(x1, x(i)), y0 = std::min(y0, y(i)), y1 = std::max(y1, y(i));
    }
    const Eigen::ArrayXd& axis = x1 - x0 >= y1 - y0 ? x : y;
    const int mid = begin + (end - begin) / 2;
    std::nth_element(idx.begin() + begin, idx.begin() + mid, idx.begin() + end,
                     [&](int p, int q) { return axis(p) < axis(q); });
    todo.emplace_back(begin, mid);
    todo.emplace_back(mid, end);
  }
  return groups;
}

void gather(const Eigen::ArrayXd& x, const Eigen::ArrayXd& y, const std::vector<std::int64_t>& mass,
            const std::vector<int>& group, int groups, Eigen::ArrayXd* gx, Eigen::ArrayXd* gy,
            std::vector<std::int64_t>* gmass) {
  gx->setZero(groups);
  gy->setZero(groups);
  gmass->assign(std::size_t(groups), 0);
  std::vector<double> w(std::size_t(groups), 0.0);
  for (std::size_t i = 0; i < group.size(); ++i) {
    const int g = group[i];
    const double wi = double(mass[i]);
    (*gx)(g) += wi * x(Eigen::Index(i));
    (*gy)(g) += wi * y(Eigen::Index(i));
    w[std::size_t(g)] += wi;
    (*gmass)[std::size_t(g)] += mass[i];
  }
  for (int g = 0; g < groups; ++g) {
    (*gx)(g) /= w[std::size_t(g)];
    (*gy)(g) /= w[std::size_t(g)];
  }
}

// Members of each group, as compressed rows.
void members(const std::vector<int>& group, int groups, std::vector<int>* start, std::vector<int>* list) {
  start->assign(std::size_t(groups) + 1, 0);
  for (int g : group) ++(*start)[std::size_t(g) + 1];
  std::partial_sum(start->begin(), start->end(), start->begin());
  list->resize(group.size());
  std::vector<int> fill(start->begin(), start->end() - 1);
  for (std::size_t i = 0; i < group.size(); ++i) (*list)[std::size_t(fill[std::size_t(group[i])]++)] = int(i);
}

constexpr int kChunk = 128;  // points per chunk handed to a thread

// body(begin, end) over [0, n) in chunks of kChunk (begins at multiples of it).
void overChunks(int n, kernel::RowWorkers* team, const std::function<void(int, int)>& body) {
  if (team) {
    team->run(n, kChunk, body);
    return;
  }
  for (int b = 0; b < n; b += kChunk) body(b, std::min(n, b + kChunk));
}

}  // namespace

CoarseProblem coarsen(const ExactProblem& fine, int groupSize) {
  CoarseProblem c;
  c.problem.cost = fine.cost;
  c.problem.total = fine.total;
  const int ga = splitGroups(fine.ax, fine.ay, groupSize, &c.groupA);
  const int gb = splitGroups(fine.bx, fine.by, groupSize, &c.groupB);
  gather(fine.ax, fine.ay, fine.massA, c.groupA, ga, &c.problem.ax, &c.problem.ay, &c.problem.massA);
  gather(fine.bx, fine.by, fine.massB, c.groupB, gb, &c.problem.bx, &c.problem.by, &c.problem.massB);
  c.problem.rowA.resize(std::size_t(ga));
  c.problem.rowB.resize(std::size_t(gb));
  std::iota(c.problem.rowA.begin(), c.problem.rowA.end(), 0);
  std::iota(c.problem.rowB.begin(), c.problem.rowB.end(), 0);
  return c;
}

void refineStart(const ExactProblem& fine, const CoarseProblem& coarse,
                 const std::vector<std::pair<int, int>>& coarsePlan, const Eigen::ArrayXd& coarseU, int guided,
                 std::vector<std::pair<int, int>>* arcs, std::vector<FlowArc>* basis, kernel::RowWorkers* team) {
  std::vector<int> startA, listA, startB, listB;
  members(coarse.groupA, coarse.problem.n(), &startA, &listA);
  members(coarse.groupB, coarse.problem.m(), &startB, &listB);
  for (const auto& [g, h] : coarsePlan)
    for (int s = startA[std::size_t(g)]; s < startA[std::size_t(g) + 1]; ++s)
      for (int t = startB[std::size_t(h)]; t < startB[std::size_t(h) + 1]; ++t)
        arcs->emplace_back(listA[std::size_t(s)], listB[std::size_t(t)]);

  // Fine potentials from the coarse ones: v = U^c at the fine sinks, u = v^c at the fine
  // sources; the lowest scores of each source are its guided arcs.
  // Each point's search is independent of the others', so chunks of points may run on any
  // thread; the guided arcs are sorted below, so their order of arrival does not matter.
  SiteTree coarseSources(coarse.problem.ax, coarse.problem.ay, fine.cost);
  coarseSources.setPotentials(coarseU);
  Eigen::ArrayXd v(fine.m()), u(fine.n());
  overChunks(fine.m(), team, [&](int begin, int end) {
    for (int j = begin; j < end; ++j) v(j) = coarseSources.minScore(fine.bx(j), fine.by(j));
  });
  SiteTree sinks(fine.bx, fine.by, fine.cost);
  sinks.setPotentials(v);
  std::vector<std::vector<std::pair<int, int>>> found(std::size_t((fine.n() + kChunk - 1) / kChunk));
  overChunks(fine.n(), team, [&](int begin, int end) {
    std::vector<std::pair<double, int>> lowest;
    auto& mine = found[std::size_t(begin / kChunk)];
    for (int i = begin; i < end; ++i) {
      if (guided > 0) {
        sinks.below(fine.ax(i), fine.ay(i), INFINITY, guided, &lowest);
        u(i) = lowest.front().first;
        for (const auto& [score, j] : lowest) mine.emplace_back(i, j);
      } else {
        u(i) = sinks.minScore(fine.ax(i), fine.ay(i));
      }
    }
  });
  for (const auto& part : found) arcs->insert(arcs->end(), part.begin(), part.end());
  sortUnique(*arcs);
  std::vector<double> reduced(arcs->size());
  for (std::size_t k = 0; k < arcs->size(); ++k) {
    const auto [i, j] = (*arcs)[k];
    reduced[k] = fine.c(i, j) - u(i) - v(j);
  }
  *basis = greedyBasis(fine, *arcs, std::move(reduced));
}

}  // namespace barrow
