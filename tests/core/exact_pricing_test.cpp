// Pricing of all pairs for the exact solver: the site-tree search returns what a scan over
// every pair returns (brute force, common practice), and a thread team changes nothing about
// the answer or its order (so a solve makes the same pivots on any number of cores).
#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>

#include "support/test_support.h"
#include "transport/exact_ot.h"
#include "transport/exact_pricing.h"

namespace barrow {
namespace {

struct Priced {
  ExactProblem pr;
  Eigen::ArrayXd u, v;
  double tol = 1e-12;
  explicit Priced(int n, double p) : pr(makeExactProblem(test::gaussianCloud(n, 1), test::gaussianCloud(n + 7, 2, 0.3), p)) {
    // Potentials of no particular solve: u_i = 0.5 + noise, v_j = noise, so many pairs are violated.
    u = Eigen::ArrayXd::Random(pr.n()) * 0.2 + 0.5;
    v = Eigen::ArrayXd::Random(pr.m()) * 0.2;
  }
  std::vector<std::pair<int, int>> price(kernel::RowWorkers* team, int perRow, SourceMinima* minima = nullptr) {
    SiteTree sinks(pr.bx, pr.by, pr.cost);
    std::vector<std::pair<int, int>> found;
    EXPECT_TRUE(priceAllPairs(pr, sinks, u, v, tol, perRow, &found, nullptr, 0.0, team, minima));
    return found;
  }
  // v^c and ties as the separate pass gives them.
  void cTransform(double window, Eigen::ArrayXd* cu, std::vector<int>* ties) {
    SiteTree sinks(pr.bx, pr.by, pr.cost);
    cTransformSources(pr, sinks, v, window, cu, ties);
  }
};

TEST(ExactPricingTest, SameArcsInTheSameOrderWithAThreadTeam) {
  for (double p : {1.0, 2.0}) {
    Priced t(1500, p);
    kernel::RowWorkers team(2);
    const auto alone = t.price(nullptr, 8), shared = t.price(&team, 8);
    ASSERT_FALSE(alone.empty());
    EXPECT_EQ(alone, shared);
  }
}

TEST(ExactPricingTest, EveryViolatedPairIsFoundAsByAFullScan) {
  Priced t(400, 1.0);
  kernel::RowWorkers team(2);
  auto found = t.price(&team, 1 << 20);  // no cap per row: all violations
  std::sort(found.begin(), found.end());
  std::vector<std::pair<int, int>> scan;
  for (int i = 0; i < t.pr.n(); ++i)
    for (int j = 0; j < t.pr.m(); ++j)
      if (t.pr.c(i, j) - t.u(i) - t.v(j) < -t.tol) scan.emplace_back(i, j);
  EXPECT_EQ(found, scan);
}

TEST(ExactPricingTest, CTransformIsTheSameWithAThreadTeam) {
  Priced t(1500, 2.0);
  SiteTree sinks(t.pr.bx, t.pr.by, t.pr.cost);
  Eigen::ArrayXd alone, shared;
  std::vector<int> tiesAlone, tiesShared;
  kernel::RowWorkers team(2);
  cTransformSources(t.pr, sinks, t.v, 1e-12, &alone, &tiesAlone);
  cTransformSources(t.pr, sinks, t.v, 1e-12, &shared, &tiesShared, &team);
  EXPECT_TRUE((alone == shared).all());
  EXPECT_EQ(tiesAlone, tiesShared);
  // Against the definition v^c(x_i) = min_j (c_ij − v_j) (Villani 2009, Def. 5.7).
  for (int i = 0; i < t.pr.n(); i += 97) {
    double best = INFINITY;
    for (int j = 0; j < t.pr.m(); ++j) best = std::min(best, t.pr.c(i, j) - t.v(j));
    EXPECT_DOUBLE_EQ(alone(i), best);
  }
}

// A pricing pass that also reports v^c and its ties must report what the separate c-transform
// pass does (that pass is the reference: its search is checked against the definition above),
// and must price the same arcs as a plain pass. Random potentials give rows with many
// violations (the count falls back to a search of its own); the potentials of an optimal solve
// give the final pass of a solve, where nothing is violated. Common practice.
TEST(ExactPricingTest, MinimaFromPricingMatchTheCTransformPass) {
  for (double p : {1.0, 2.0}) {
    Priced t(700, p);
    for (bool optimal : {false, true}) {
      if (optimal) {
        const Cloud a = test::gaussianCloud(700, 1), b = test::gaussianCloud(707, 2, 0.3);
        ExactOtOptions o;
        o.p = p;
        const ExactOtResult r = solveExactOt(a, b, o);
        ASSERT_EQ(r.status, ExactOtStatus::Optimal);
        t.u = r.u.array();
        t.v = r.v.array();
      }
      for (double window : {0.0, 4e-12, 0.02}) {
        SourceMinima minima;
        minima.window = window;
        kernel::RowWorkers team(2);
        const auto withMinima = t.price(&team, 8, &minima), plain = t.price(nullptr, 8);
        EXPECT_EQ(withMinima, plain);
        EXPECT_EQ(plain.empty(), optimal);
        Eigen::ArrayXd cu;
        std::vector<int> ties;
        t.cTransform(window, &cu, &ties);
        EXPECT_TRUE((minima.u == cu).all()) << "p " << p << " optimal " << optimal << " window " << window;
        EXPECT_EQ(minima.ties, ties) << "p " << p << " optimal " << optimal << " window " << window;
      }
    }
  }
}

}  // namespace
}  // namespace barrow
