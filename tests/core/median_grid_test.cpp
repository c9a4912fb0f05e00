// The cell-grid rank search for the median pairwise distance (kernel/median_grid.h) against
// NumPy/SciPy and against the streamed selection over all pairs (kernel/median_distance.h).
#include <gtest/gtest.h>

#include <atomic>
#include <random>
#include <sstream>

#include "kernel/median_distance.h"
#include "kernel/median_grid.h"
#include "support/test_support.h"

namespace barrow {
namespace {

Eigen::MatrixX2d uniformSquare(int n, unsigned seed, double side = 1.0) {
  std::mt19937 rng(seed);
  std::uniform_real_distribution<double> u(0.0, side);
  Eigen::MatrixX2d p(n, 2);
  for (int i = 0; i < n; ++i) p.row(i) << u(rng), u(rng);
  return p;
}

Eigen::MatrixX2d clusters(int n, unsigned seed) {  // three Gaussian blobs of unequal spread
  std::mt19937 rng(seed);
  std::normal_distribution<double> g(0.0, 1.0);
  const double cx[3] = {0, 4, -1}, cy[3] = {0, 1, 6}, sd[3] = {0.3, 0.05, 1.0};
  Eigen::MatrixX2d p(n, 2);
  for (int i = 0; i < n; ++i) p.row(i) << cx[i % 3] + sd[i % 3] * g(rng), cy[i % 3] + sd[i % 3] * g(rng);
  return p;
}

Eigen::MatrixX2d lattice(int n) {  // integer lattice 9 x 4: every distance repeats, points coincide
  Eigen::MatrixX2d p(n, 2);
  for (int i = 0; i < n; ++i) p.row(i) << i % 9, (i / 9) % 4;
  return p;
}

MedianDistance streamed(const Eigen::MatrixX2d& p) {
  MedianDistanceOptions o;
  o.directLimit = 0;
  o.cellGrid = false;
  return medianPairwiseDistance(p, {}, o);
}

std::string pyMatrix(const Eigen::MatrixX2d& p) {
  std::ostringstream s;
  s.precision(17);
  s << "np.array([";
  for (Eigen::Index i = 0; i < p.rows(); ++i) s << p(i, 0) << "," << p(i, 1) << ",";
  s << "]).reshape(-1, 2)";
  return s.str();
}

// Reference: numpy.median(scipy.spatial.distance.pdist(P)) [CP] (the median heuristic's
// definition, DEVELOPERS.md "Measure conventions"): 3000 points, 4498500 pairs (even count:
// the mean of the two middle values); 3001 points, odd count.
TEST(MedianGridTest, MatchesNumpyMedianOfPdistAt3000Points) {
  if (!test::pythonHas("numpy, scipy")) GTEST_SKIP() << "python3-numpy/scipy missing";
  const std::vector<Eigen::MatrixX2d> sets = {uniformSquare(3000, 5), clusters(3001, 6)};
  std::ostringstream py;
  py << "import numpy as np\nfrom scipy.spatial.distance import pdist\n";
  for (const auto& p : sets) py << "print(repr(float(np.median(pdist(" << pyMatrix(p) << ")))))\n";
  std::istringstream out(test::runPython(py.str()));
  for (const auto& p : sets) {
    double ref = -1;
    out >> ref;
    const auto g = medianByCellGrid(p, {}, {});
    ASSERT_TRUE(g.has_value()) << p.rows();
    EXPECT_NEAR(g->value, ref, 2e-16 * ref) << p.rows() << " " << g->method;
  }
}

// [D] both are exact selections of the same squared distances, so the values agree to the bit.
TEST(MedianGridTest, EqualsStreamedSelectionOnVariedGeometries) {
  Eigen::MatrixX2d line(4000, 2);  // collinear: the grid degenerates to one row
  for (int i = 0; i < 4000; ++i) line.row(i) << 0.37 * i, 0.0;
  Eigen::MatrixX2d farPair = clusters(3000, 9);  // two tight clusters far apart
  for (int i = 0; i < 3000; ++i)
    if (i % 2) farPair.row(i) = Eigen::RowVector2d(100.0, 50.0) + 0.01 * farPair.row(i);
    else farPair.row(i) *= 0.01;
  Eigen::MatrixX2d offset = uniformSquare(3000, 10, 1e-3);  // far from the origin: differences cancel
  offset.array() += 1e8;
  const std::vector<Eigen::MatrixX2d> sets = {uniformSquare(5000, 1), uniformSquare(5001, 2, 1e-3), clusters(4000, 3),
                                              lattice(4500), line, farPair, offset};
  for (const auto& p : sets) {
    const MedianDistance ref = streamed(p);
    for (std::size_t limit : {std::size_t(1) << 22, std::size_t(1000), std::size_t(16)}) {
      MedianDistanceOptions o;
      o.candidateLimit = limit;
      const auto g = medianByCellGrid(p, {}, o);
      ASSERT_TRUE(g.has_value()) << p.rows() << " limit " << limit;
      EXPECT_EQ(g->value, ref.value) << p.rows() << " limit " << limit << " " << g->method;
    }
  }
}

TEST(MedianGridTest, AllPointsCoincidingGiveZero) {
  const Eigen::MatrixX2d p = Eigen::MatrixX2d::Constant(3000, 2, 1.5);
  const auto g = medianByCellGrid(p, {}, {});
  ASSERT_TRUE(g.has_value());
  EXPECT_EQ(g->value, 0.0);
}

TEST(MedianGridTest, OneAndTwoThreadsAgree) {
  const Eigen::MatrixX2d p = clusters(20000, 11);
  MedianDistanceOptions one, two;
  one.threads = 1;
  two.threads = 2;
  EXPECT_EQ(medianByCellGrid(p, {}, one)->value, medianByCellGrid(p, {}, two)->value);
}

TEST(MedianGridTest, StopsWhenCancelled) {
  std::atomic<bool> cancel{true};
  RunControl control;
  control.cancel = &cancel;
  const auto g = medianByCellGrid(uniformSquare(20000, 4), WorkSlice{&control}, {});
  ASSERT_TRUE(g.has_value());
  EXPECT_FALSE(g->complete);
}

TEST(MedianGridTest, LargeUniformPoolUsesTheGridAndFewPasses) {
  const Eigen::MatrixX2d p = uniformSquare(60000, 12);
  const MedianDistance m = medianPairwiseDistance(p, {});
  EXPECT_NE(m.method.find("cell-grid"), std::string::npos) << m.method;
  EXPECT_LE(m.passes, 3);
}

}  // namespace
}  // namespace barrow
