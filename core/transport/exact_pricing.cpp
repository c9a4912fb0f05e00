#include "transport/exact_pricing.h"

#include <algorithm>
#include <atomic>
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

// Sources below this many are priced on the calling thread alone (a thread start costs more).
constexpr int kMinSourcesPerThread = 256;

// Runs body(begin, end, onCaller) over [0, n) in contiguous chunks on up to all cores, the
// first chunk on the calling thread (the only one that may touch a RunControl: its
// callbacks need not be thread-safe).
template <class Body>
void overChunks(int n, Body&& body) {
  const int cores = int(std::max(1u, std::thread::hardware_concurrency()));
  const int chunks = std::max(1, std::min(cores, n / kMinSourcesPerThread));
  std::vector<std::thread> pool;
  const auto edge = [&](int c) { return int((long long)n * c / chunks); };
  for (int c = 1; c < chunks; ++c) pool.emplace_back([&, c] { body(c, edge(c), edge(c + 1), false); });
  body(0, 0, edge(1), true);
  for (auto& t : pool) t.join();
}

}  // namespace

bool priceAllPairs(const ExactProblem& pr, SiteTree& sinks, const Eigen::ArrayXd& u, const Eigen::ArrayXd& v,
                   double tol, int perRow, std::vector<std::pair<int, int>>* violated, const RunControl* control,
                   double progress) {
  sinks.setPotentials(v);
  const SiteTree& tree = sinks;
  std::atomic<bool> stop{false};
  std::vector<std::vector<std::pair<int, int>>> found(std::max(1u, std::thread::hardware_concurrency()));
  overChunks(pr.n(), [&](int chunk, int begin, int end, bool onCaller) {
    std::vector<std::pair<double, int>> hits;
    auto& mine = found[std::size_t(chunk)];
    for (int i = begin; i < end; ++i) {
      if ((i & 255) == 255) {
        if (onCaller && control && control->shouldStop(progress)) stop = true;
        if (stop) return;
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
                       Eigen::ArrayXd* u, std::vector<int>* ties) {
  sinks.setPotentials(v);
  const SiteTree& tree = sinks;
  u->resize(pr.n());
  ties->assign(std::size_t(pr.n()), 0);
  overChunks(pr.n(), [&](int, int begin, int end, bool) {
    for (int i = begin; i < end; ++i) (*u)(i) = tree.minScore(pr.ax(i), pr.ay(i), zeroTol, &(*ties)[std::size_t(i)]);
  });
}

}  // namespace barrow
