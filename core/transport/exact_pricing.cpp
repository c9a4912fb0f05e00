#include "transport/exact_pricing.h"

#include <algorithm>
#include <atomic>
#include <functional>
#include <thread>

namespace barrow {

double cTransformAt(double x, double y, const Eigen::Ref<const Eigen::ArrayXd>& sx,
                    const Eigen::Ref<const Eigen::ArrayXd>& sy, const Eigen::Ref<const Eigen::ArrayXd>& v,
                    const GroundCost& cost) {
  const auto d2 = (sx - x).square() + (sy - y).square();
  switch (cost.kind()) {
    case CostKind::Distance: return (d2.sqrt() - v).minCoeff();
    case CostKind::Squared: return (d2 - v).minCoeff();
    case CostKind::Power: break;
  }
  return (d2.pow(0.5 * cost.p()) - v).minCoeff();
}

namespace {

constexpr int kGrain = 128;  // sources per chunk handed to a thread

// Runs body(begin, end) over [0, n) in chunks of kGrain (begins at multiples of it), on the
// team when there is one, else in order on this thread.
void overSources(int n, kernel::RowWorkers* team, const std::function<void(int, int)>& body) {
  if (team) {
    team->run(n, kGrain, body);
    return;
  }
  for (int b = 0; b < n; b += kGrain) body(b, std::min(n, b + kGrain));
}

// One source of a pricing pass that also finds v^c(x_i) and its ties. The search collects the
// lowest scores below u_i + window + tol: v^c(x_i) <= u_i (a basis arc of row i is tight), so
// that covers the minimum and its window, and when the list did not fill up it holds every
// such site, so the ties are counted from it; otherwise (many violations or many ties) a
// search of its own counts them. Violated arcs are the list's first ones below u_i − tol.
void priceAndMinimise(const SiteTree& tree, double x, double y, double ui, double tol, int perRow,
                      SourceMinima* minima, int i, std::vector<std::pair<double, int>>* hits,
                      std::vector<std::pair<int, int>>* found) {
  constexpr int kTieProbe = 8;
  const int probe = std::max(perRow, kTieProbe);
  const double window = minima->window, limit = ui + window + tol;
  tree.below(x, y, limit, probe, hits);
  if (!hits->empty() && int(hits->size()) < probe && hits->front().first + window < limit) {
    const double best = hits->front().first;
    minima->u(i) = best;
    minima->ties[std::size_t(i)] =
        int(std::count_if(hits->begin(), hits->end(), [&](const auto& h) { return h.first <= best + window; }));
  } else {
    minima->u(i) = tree.minScore(x, y, window, &minima->ties[std::size_t(i)]);
  }
  int added = 0;
  for (const auto& [score, j] : *hits) {
    if (!(score < ui - tol) || added == perRow) break;
    found->emplace_back(i, j);
    ++added;
  }
}

}  // namespace

bool priceAllPairs(const ExactProblem& pr, SiteTree& sinks, const Eigen::ArrayXd& u, const Eigen::ArrayXd& v,
                   double tol, int perRow, std::vector<std::pair<int, int>>* violated, const RunControl* control,
                   double progress, kernel::RowWorkers* team, SourceMinima* minima) {
  sinks.setPotentials(v);
  const SiteTree& tree = sinks;
  if (minima) {
    minima->u.resize(pr.n());
    minima->ties.assign(std::size_t(pr.n()), 0);
  }
  // Only the calling thread may touch `control` (its callbacks need not be thread-safe).
  const std::thread::id caller = std::this_thread::get_id();
  std::atomic<bool> stop{false};
  std::vector<std::vector<std::pair<int, int>>> found(std::size_t((pr.n() + kGrain - 1) / kGrain));
  overSources(pr.n(), team, [&](int begin, int end) {
    if (stop || (control && std::this_thread::get_id() == caller && control->shouldStop(progress))) {
      stop = true;
      return;
    }
    std::vector<std::pair<double, int>> hits;
    auto& mine = found[std::size_t(begin / kGrain)];
    for (int i = begin; i < end; ++i) {
      if (minima) {
        priceAndMinimise(tree, pr.ax(i), pr.ay(i), u(i), tol, perRow, minima, i, &hits, &mine);
        continue;
      }
      tree.below(pr.ax(i), pr.ay(i), u(i) - tol, perRow, &hits);
      for (const auto& [score, j] : hits) mine.emplace_back(i, j);
    }
  });
  // Chunks in source order: the same arcs in the same order as a single-threaded scan.
  for (const auto& part : found) violated->insert(violated->end(), part.begin(), part.end());
  return !stop;
}

void cTransformSources(const ExactProblem& pr, SiteTree& sinks, const Eigen::ArrayXd& v, double zeroTol,
                       Eigen::ArrayXd* u, std::vector<int>* ties, kernel::RowWorkers* team) {
  sinks.setPotentials(v);
  const SiteTree& tree = sinks;
  u->resize(pr.n());
  ties->assign(std::size_t(pr.n()), 0);
  overSources(pr.n(), team, [&](int begin, int end) {
    for (int i = begin; i < end; ++i) (*u)(i) = tree.minScore(pr.ax(i), pr.ay(i), zeroTol, &(*ties)[std::size_t(i)]);
  });
}

}  // namespace barrow
