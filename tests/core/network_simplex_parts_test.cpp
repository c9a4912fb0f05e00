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

// [CP] Brute force again, now with potentials shaped like optimal ones, where the tree's
// affine-envelope bound is what prunes: v nearly affine (clouds apart, W1 slope of length
// about 1, W2 slope 2t), sites far from the queries, a large common offset of all
// coordinates, collinear sites and exact ties along a W1 transport ray ([D] with
// v_j = e·y_j, every site on the ray q + s·e scores exactly −e·q).
TEST(NetworkSimplexPartsTest, SiteTreeEnvelopeBoundMatchesAFullScan) {
  std::mt19937_64 rng(5);
  std::uniform_real_distribution<double> u(-1.0, 1.0);
  for (double p : {1.0, 2.0}) {
    const GroundCost cost(p);
    for (double offset : {0.0, 1e4}) {
      for (int layout = 0; layout < 3; ++layout) {  // cloud apart, collinear sites, a ray of ties
        const int m = 400;
        Eigen::ArrayXd x(m), y(m), v(m);
        const double ex = 0.8, ey = 0.6;  // unit direction from the queries to the sites
        for (int j = 0; j < m; ++j) {
          const double s = 3.0 + u(rng), w = layout == 1 ? 0.0 : u(rng);
          x(j) = offset + (layout == 2 && j % 4 == 0 ? 0.1 * (j % 40) * ex : s * ex - w * ey);
          y(j) = offset + (layout == 2 && j % 4 == 0 ? 0.1 * (j % 40) * ey : s * ey + w * ex);
          const double rx = x(j) - offset, ry = y(j) - offset;
          const double slope = p == 1.0 ? 1.0 : 6.0;  // W1: |∇v| ≈ 1; W2: ∇v = 2t, |t| ≈ 3
          v(j) = slope * (ex * rx + ey * ry) + (layout == 2 && j % 4 == 0 ? 0.0 : 1e-3 * u(rng)) + 7.0;
        }
        SiteTree tree(x, y, cost);
        tree.setPotentials(v);
        for (int t = 0; t < 100; ++t) {
          const double qx = offset + (t % 10 == 0 ? 0.0 : 0.5 * u(rng)), qy = offset + (t % 10 == 0 ? 0.0 : 0.5 * u(rng));
          std::vector<std::pair<double, int>> all;
          for (int j = 0; j < m; ++j) all.push_back({cost(qx, qy, x(j), y(j)) - v(j), j});
          std::sort(all.begin(), all.end());
          const double window = p == 1.0 ? 1e-9 : 0.02;
          int ties = 0;
          EXPECT_EQ(tree.minScore(qx, qy), all[0].first);
          EXPECT_EQ(tree.minScore(qx, qy, window, &ties), all[0].first);
          EXPECT_EQ(ties, std::count_if(all.begin(), all.end(), [&](const auto& e) { return e.first <= all[0].first + window; }));
          for (double above : {0.0, 1e-3, 0.05}) {
            const double limit = all[0].first + above;
            std::vector<std::pair<double, int>> hits;
            tree.below(qx, qy, limit, 12, &hits);
            const auto expected = std::min<std::ptrdiff_t>(
                12, std::count_if(all.begin(), all.end(), [&](const auto& e) { return e.first < limit; }));
            ASSERT_EQ(std::ptrdiff_t(hits.size()), expected) << "p " << p << " layout " << layout << " offset " << offset;
            for (std::size_t k = 0; k < hits.size(); ++k) EXPECT_EQ(hits[k].first, all[k].first);
          }
        }
      }
    }
  }
}

// [D] Where the envelope is exact, a tie sits right at the bound and must still be found.
// W1: sites on one line along e with v_j = e·y_j; from a query on that line behind them,
// every site scores exactly −e·q, so all are ties. W2: sites on a grid of step 1/8 with
// v_j = g·y_j; the score is |y_j − (q + g/2)|² − g·q − |g|²/4, and with q + g/2 on a site
// (all in binary fractions, so every score is exact) that site and its four neighbours are
// the only sites within h² of the minimum.
TEST(NetworkSimplexPartsTest, SiteTreeEnvelopeBoundFindsTiesAtTheBound) {
  {
    const GroundCost cost(1.0);
    const double ex = 0.6, ey = 0.8;
    const int m = 64;
    Eigen::ArrayXd x(m), y(m), v(m);
    for (int j = 0; j < m; ++j) x(j) = (2.0 + 0.125 * j) * ex, y(j) = (2.0 + 0.125 * j) * ey, v(j) = ex * x(j) + ey * y(j);
    SiteTree tree(x, y, cost);
    tree.setPotentials(v);
    int ties = 0;
    const double best = tree.minScore(-ex, -ey, 1e-9, &ties);
    EXPECT_NEAR(best, 1.0, 1e-14);
    EXPECT_EQ(ties, m);
  }
  {
    const GroundCost cost(2.0);
    const double gx = 0.75, gy = -1.5, h = 0.125;
    Eigen::ArrayXd x(400), y(400), v(400);
    for (int j = 0; j < 400; ++j) x(j) = 3.0 + h * (j % 20), y(j) = h * (j / 20), v(j) = gx * x(j) + gy * y(j);
    SiteTree tree(x, y, cost);
    tree.setPotentials(v);
    for (int j : {21, 147, 230, 378}) {
      const double qx = x(j) - 0.5 * gx, qy = y(j) - 0.5 * gy;
      const double expected = -(gx * qx + gy * qy) - 0.25 * (gx * gx + gy * gy);
      int ties = 0;
      EXPECT_EQ(tree.minScore(qx, qy, h * h, &ties), expected);
      EXPECT_EQ(ties, 5) << "site " << j;
      std::vector<std::pair<double, int>> hits;
      tree.below(qx, qy, expected + h * h + 1e-12, 8, &hits);
      EXPECT_EQ(hits.size(), 5u) << "site " << j;
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
