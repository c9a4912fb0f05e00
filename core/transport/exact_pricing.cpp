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

}  // namespace

bool priceAllPairs(const ExactProblem& pr, SiteTree& sinks, const Eigen::ArrayXd& u, const Eigen::ArrayXd& v,
                   double tol, int perRow, std::vector<std::pair<int, int>>* violated, const RunControl* control,
                   double progress, kernel::RowWorkers* team) {
  sinks.setPotentials(v);
  const SiteTree& tree = sinks;
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
