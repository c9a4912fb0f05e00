// The pieces around the exact solver's simplex: integer masses, the site tree used for
// pricing, coarse groups, arc sorting, and progress reports.
#include <gtest/gtest.h>

#include <algorithm>
#include <numeric>
#include <random>

#include "transport/exact_candidates.h"
#include "transport/exact_multiscale.h"
#include "transport/exact_ot.h"
#include "transport/exact_problem.h"
#include "transport/exact_site_tree.h"

namespace barrow {
namespace {

// [D] The masses sum exactly to the total, uniform weights give equal masses when the total
// is a multiple of n, zero stays zero and a tiny positive weight does not vanish.
TEST(NetworkSimplexPartsTest, QuantizedMassesBalanceExactly) {
  const std::int64_t total = kMassTotal / 600 * 600;
  const auto uniform = quantizeMasses(Eigen::VectorXd::Ones(200), total);
  EXPECT_EQ(std::accumulate(uniform.begin(), uniform.end(), std::int64_t(0)), total);
  EXPECT_TRUE(std::all_of(uniform.begin(), uniform.end(), [&](std::int64_t q) { return q == total / 200; }));
  Eigen::VectorXd w(5);
  w << 3.0, 0.0, 1e-300, 2.5, 1.0 / 3.0;
  const auto q = quantizeMasses(w, kMassTotal);
  EXPECT_EQ(std::accumulate(q.begin(), q.end(), std::int64_t(0)), kMassTotal);
  EXPECT_EQ(q[1], 0);
  EXPECT_GE(q[2], 1);
  for (int i : {0, 3, 4}) EXPECT_NEAR(double(q[std::size_t(i)]) / double(kMassTotal), w(i) / w.sum(), 1e-15);
}

// [CP] Brute force over every site is the reference for the tree's pruned searches.
TEST(NetworkSimplexPartsTest, SiteTreeSearchesMatchAFullScan) {
  std::mt19937_64 rng(3);
  std::uniform_real_distribution<double> u(-1.0, 1.0);
  for (double p : {1.0, 2.0, 1.5}) {
    const GroundCost cost(p);
    const int m = 300;
    Eigen::ArrayXd x(m), y(m), v(m);
    for (int j = 0; j < m; ++j) {
      x(j) = j % 5 == 0 ? 0.25 : u(rng);  // repeated sites
      y(j) = j % 5 == 0 ? -0.5 : u(rng);
      v(j) = 0.3 * u(rng);
    }
    SiteTree tree(x, y, cost);
    tree.setPotentials(v);
    for (int t = 0; t < 200; ++t) {
      const double qx = 1.5 * u(rng), qy = 1.5 * u(rng);
      std::vector<std::pair<double, int>> all;
      for (int j = 0; j < m; ++j) all.push_back({cost(qx, qy, x(j), y(j)) - v(j), j});
      std::sort(all.begin(), all.end());
      int ties = 0;
      EXPECT_DOUBLE_EQ(tree.minScore(qx, qy, 0.05, &ties), all[0].first);
      EXPECT_EQ(ties, std::count_if(all.begin(), all.end(), [&](const auto& s) { return s.first <= all[0].first + 0.05; }));
      const double limit = all[0].first + 0.1;
      std::vector<std::pair<double, int>> hits;
      tree.below(qx, qy, limit, 6, &hits);
      const auto expected = std::min<std::ptrdiff_t>(
          6, std::count_if(all.begin(), all.end(), [&](const auto& s) { return s.first < limit; }));
      ASSERT_EQ(std::ptrdiff_t(hits.size()), expected);
      for (std::size_t k = 0; k < hits.size(); ++k) EXPECT_DOUBLE_EQ(hits[k].first, all[k].first);
    }
  }
}

// [D] Groups hold at most groupSize points, and their masses add up to the same total.
TEST(NetworkSimplexPartsTest, CoarseGroupsKeepTheTotalMass) {
  std::mt19937_64 rng(4);
  std::uniform_real_distribution<double> u(0.0, 1.0);
  Eigen::MatrixX2d pa(101, 2), pb(77, 2);
  for (int i = 0; i < 101; ++i) pa.row(i) << u(rng), 0.1 * u(rng);
  for (int j = 0; j < 77; ++j) pb.row(j) << u(rng), u(rng);
  const ExactProblem fine = makeExactProblem(Cloud("", pa), Cloud("", pb, Eigen::VectorXd::Random(77).array().abs()), 2.0);
  const CoarseProblem coarse = coarsen(fine, 4);
  for (const auto* side : {&coarse.problem.massA, &coarse.problem.massB})
    EXPECT_EQ(std::accumulate(side->begin(), side->end(), std::int64_t(0)), fine.total);
  std::vector<int> count(std::size_t(coarse.problem.n()), 0);
  for (int g : coarse.groupA) ++count[std::size_t(g)];
  EXPECT_LE(*std::max_element(count.begin(), count.end()), 4);
  EXPECT_GE(*std::min_element(count.begin(), count.end()), 1);
}

TEST(NetworkSimplexPartsTest, SortUniqueOrdersAndDeduplicates) {
  std::vector<std::pair<int, int>> arcs{{3, 1}, {0, 2}, {3, 0}, {0, 2}, {1, 5}, {3, 1}};
  sortUnique(arcs);
  EXPECT_EQ(arcs, (std::vector<std::pair<int, int>>{{0, 2}, {1, 5}, {3, 0}, {3, 1}}));
}

// Progress reports rise through the coarse levels and the fine one, within [0, 1].
TEST(NetworkSimplexPartsTest, ProgressRisesAcrossLevels) {
  std::mt19937_64 rng(5);
  std::uniform_real_distribution<double> u(0.0, 1.0);
  Eigen::MatrixX2d pa(3000, 2), pb(3000, 2);
  for (int i = 0; i < 3000; ++i) pa.row(i) << u(rng), u(rng), pb.row(i) << u(rng), u(rng);
  std::vector<double> seen;
  RunControl ctl;
  ctl.onProgress = [&](double f) {
    seen.push_back(f);
    return true;
  };
  ExactOtOptions o;
  o.coarsestSize = 64;
  ASSERT_EQ(solveExactOt(Cloud("", pa), Cloud("", pb), o, &ctl).status, ExactOtStatus::Optimal);
  ASSERT_GT(seen.size(), 2u);
  EXPECT_TRUE(std::is_sorted(seen.begin(), seen.end()));
  EXPECT_GE(seen.front(), 0.0);
  EXPECT_LE(seen.back(), 1.0);
}

TEST(NetworkSimplexPartsTest, OverflowingCostsAreRejected) {
  Eigen::MatrixX2d far(2, 2);
  far << -1e200, 0, 1e200, 0;
  ExactOtOptions o;
  o.p = 2;
  const auto r = solveExactOt(Cloud("", far), Cloud("", far), o);
  EXPECT_EQ(r.status, ExactOtStatus::InvalidInput);
  EXPECT_NE(r.message.find("overflow"), std::string::npos);
}

}  // namespace
}  // namespace barrow
