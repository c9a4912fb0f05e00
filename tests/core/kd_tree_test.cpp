// k-d tree queries against brute force and scipy.spatial.cKDTree.
#include <gtest/gtest.h>

#include <random>
#include <sstream>

#include "spatial/kd_tree.h"
#include "support/test_support.h"

namespace barrow {
namespace {

Eigen::MatrixX2d randomPoints(int n, unsigned seed, bool grid) {
  std::mt19937 rng(seed);
  std::uniform_real_distribution<double> u(-1, 1);
  Eigen::MatrixX2d p(n, 2);
  for (int i = 0; i < n; ++i) {
    if (grid) p.row(i) << std::floor(5 * u(rng)), std::floor(5 * u(rng));  // many ties/duplicates
    else p.row(i) << u(rng), 0.2 * u(rng);
  }
  return p;
}

// [CP] brute-force nearest neighbours as the reference.
TEST(KdTreeTest, NearestAndKnnMatchBruteForce) {
  for (bool grid : {false, true}) {
    const auto p = randomPoints(700, grid ? 3 : 4, grid);
    const KdTree tree(p);
    std::mt19937 rng(9);
    std::uniform_real_distribution<double> u(-1.2, 1.2);
    for (int t = 0; t < 200; ++t) {
      const Eigen::Vector2d q(u(rng), u(rng));
      const Eigen::Index exclude = t % 3 == 0 ? t : -1;
      std::vector<std::pair<double, Eigen::Index>> all;
      for (Eigen::Index i = 0; i < p.rows(); ++i)
        if (i != exclude) all.push_back({(p.row(i).transpose() - q).norm(), i});
      std::sort(all.begin(), all.end());
      const auto nn = tree.nearest(q, exclude);
      EXPECT_DOUBLE_EQ(nn.first, all[0].first);
      const auto k5 = tree.knn(q, 5, exclude);
      ASSERT_EQ(k5.size(), 5u);
      for (int k = 0; k < 5; ++k) EXPECT_DOUBLE_EQ(k5[std::size_t(k)].first, all[std::size_t(k)].first);
      EXPECT_DOUBLE_EQ(tree.kthDistance(q, 3, exclude), all[2].first);
    }
  }
}

TEST(KdTreeTest, SmallAndDegenerateTrees) {
  Eigen::MatrixX2d one(1, 2);
  one << 2, 3;
  const KdTree t1(one);
  EXPECT_DOUBLE_EQ(t1.nearest(Eigen::Vector2d(2, 4)).first, 1.0);
  EXPECT_EQ(t1.knn(Eigen::Vector2d(0, 0), 3).size(), 1u);
  EXPECT_TRUE(std::isinf(t1.kthDistance(Eigen::Vector2d(0, 0), 2)));
  Eigen::MatrixX2d same = Eigen::MatrixX2d::Ones(50, 2);  // all points coincide
  const KdTree t2(same);
  EXPECT_DOUBLE_EQ(t2.nearest(Eigen::Vector2d(1, 1), 0).first, 0.0);
  EXPECT_NE(t2.nearest(Eigen::Vector2d(1, 1), 0).second, 0);
  EXPECT_EQ(t2.knn(Eigen::Vector2d(1, 1), 5, 3).size(), 5u);
}

// Reference: scipy.spatial.cKDTree.query(k=4) distances.
TEST(KdTreeTest, MatchesScipyCKDTree) {
  if (!test::pythonHas("scipy")) GTEST_SKIP() << "python3-scipy missing";
  const auto p = randomPoints(300, 11, false);
  const KdTree tree(p);
  std::ostringstream s;
  s.precision(17);
  s << "import numpy as np\nfrom scipy.spatial import cKDTree\np = np.array([";
  for (Eigen::Index i = 0; i < p.rows(); ++i) s << "[" << p(i, 0) << "," << p(i, 1) << "],";
  s << "])\nd, _ = cKDTree(p).query([[0.1, 0.05], [-0.9, 0.3], [2, 2]], k=4)\n"
       "print(' '.join(repr(float(v)) for v in d.ravel()))\n";
  std::istringstream out(test::runPython(s.str()));
  const Eigen::Vector2d qs[3] = {{0.1, 0.05}, {-0.9, 0.3}, {2, 2}};
  for (const auto& q : qs) {
    const auto nn = tree.knn(q, 4);
    for (const auto& [d, i] : nn) {
      double ref = -1;
      out >> ref;
      EXPECT_NEAR(d, ref, 1e-15);
    }
  }
}

}  // namespace
}  // namespace barrow
