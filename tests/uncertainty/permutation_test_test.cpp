// The permutation two-sample test: valid under the null, at its floor under a clear shift, and
// in agreement with an independent implementation of the energy test.
#include <gtest/gtest.h>

#include <sstream>

#include "measures/registry.h"
#include "support/test_support.h"
#include "uncertainty/permutation_test.h"
#include "uncertainty_test_data.h"

namespace barrow {
namespace {

const Measure& measure(const std::string& id) { return *MeasureRegistry::instance().find(id); }

// Under the null the random-permutation p-value is uniform on {1..P+1}/(P+1) (Phipson & Smyth
// 2010, §2) [P]; 200 replicate pairs from one distribution, Kolmogorov–Smirnov against U(0,1)
// with scipy.stats.kstest at the loose level 0.001 (the grid of P = 49 adds at most 0.02 to the
// KS distance).
TEST(PermutationTestTest, PValuesAreUniformUnderTheNull) {
  if (!test::pythonHas("scipy")) GTEST_SKIP() << "scipy missing";
  PermuteRequest req;
  req.measures = {&measure("energy"), &measure("w1")};
  req.permutations = 49;
  std::vector<std::ostringstream> lists(2);
  for (int pair = 0; pair < 200; ++pair) {
    const Cloud a = test::diagonalGaussian(20, 100 + unsigned(pair), 0, 0, 1, 1);
    const Cloud b = test::diagonalGaussian(25, 5000 + unsigned(pair), 0, 0, 1, 1);
    req.seed = std::uint64_t(pair);
    const PermuteResult r = runPermutationTest(a, b, req);
    for (int k = 0; k < 2; ++k) lists[std::size_t(k)] << (pair ? "," : "") << r.rows[std::size_t(k)].pValue;
  }
  for (int k = 0; k < 2; ++k) {
    const std::string out = test::runPython("from scipy import stats\np=[" + lists[std::size_t(k)].str() +
                                            "]\nprint(stats.kstest(p,'uniform').pvalue)\n");
    EXPECT_GT(std::stod(out), 0.001) << req.measures[std::size_t(k)]->id() << ": " << lists[std::size_t(k)].str();
  }
}

// Clouds 10 standard deviations apart: every re-split mixes them and scores lower than the
// observed split, so p = 1/(1 + P), its smallest value (Phipson & Smyth 2010) [P].
TEST(PermutationTestTest, ClearShiftGivesTheSmallestPValue) {
  PermuteRequest req;
  req.measures = {&measure("w1"), &measure("energy"), &measure("frechet"), &measure("sliced")};
  req.params.set("mmd.sigma", "1");
  req.permutations = 99;
  const Cloud a = test::diagonalGaussian(15, 1, 0, 0, 1, 1);
  const Cloud b = test::diagonalGaussian(15, 2, 10, 0, 1, 1);
  const PermuteResult r = runPermutationTest(a, b, req);
  for (const auto& row : r.rows) {
    EXPECT_EQ(row.status, Status::Ok) << row.id;
    EXPECT_DOUBLE_EQ(row.pValue, 1.0 / 100.0) << row.id;
  }
}

// Székely & Rizzo (2004), "Testing for equal distributions in high dimension", InterStat:
// the e-statistic (nm/(n+m))·(2·mean|X−Y| − mean|X−X′| − mean|Y−Y′|), V-statistics, with the
// permutation test; written here in NumPy from the paper's definition. It is a monotone
// function of the energy distance for fixed sizes, so both tests estimate one exact p-value;
// two independent Monte Carlo estimates with P = 999 differ by at most 4·sqrt(2p(1−p)/1000)
// plus the (1 + ·)/(1 + P) offset, with overwhelming probability [D].
TEST(PermutationTestTest, EnergyTestAgreesWithIndependentEStatisticTest) {
  if (!test::pythonHas("numpy, scipy")) GTEST_SKIP() << "numpy/scipy missing";
  const Cloud a = test::diagonalGaussian(40, 11, 0, 0, 1, 1);
  const Cloud b = test::diagonalGaussian(50, 12, 0.45, 0, 1, 1);
  PermuteRequest req;
  req.measures = {&measure("energy")};
  req.permutations = 999;
  const PermuteResult r = runPermutationTest(a, b, req);
  const std::string py = test::runPython(
      "import numpy as np\nfrom scipy.spatial.distance import cdist\n"
      "X=" + test::pyPoints(a) + "\nY=" + test::pyPoints(b) + "\n"
      "Z=np.vstack([X,Y]); D=cdist(Z,Z); n=len(X); m=len(Y)\n"
      "def e(idx):\n"
      "  i=idx[:n]; j=idx[n:]\n"
      "  return n*m/(n+m)*(2*D[np.ix_(i,j)].mean()-D[np.ix_(i,i)].mean()-D[np.ix_(j,j)].mean())\n"
      "rng=np.random.default_rng(2004)\nobs=e(np.arange(n+m)); P=999\n"
      "c=sum(e(rng.permutation(n+m))>=obs for _ in range(P))\nprint((1+c)/(1+P))\n");
  const double ref = std::stod(py);
  const double p = r.rows[0].pValue;
  EXPECT_GT(ref, 0.005) << "the data should sit in the test's informative range";
  EXPECT_LT(ref, 0.5);
  EXPECT_NEAR(p, ref, 4.0 * std::sqrt(2.0 * ref * (1.0 - ref) / 1000.0) + 0.002) << "ours " << p << ", reference " << ref;
}

TEST(PermutationTestTest, SameSeedSameValuesAndThreadCountDoesNotMatter) {
  const Cloud a = test::gaussianCloud(30, 4), b = test::gaussianCloud(35, 5, 0.3);
  PermuteRequest req;
  req.measures = {&measure("w1"), &measure("mmd"), &measure("js")};
  req.permutations = 40;
  req.seed = 77;
  req.threads = 1;
  const PermuteResult one = runPermutationTest(a, b, req);
  req.threads = 2;
  const PermuteResult two = runPermutationTest(a, b, req);
  for (std::size_t k = 0; k < one.rows.size(); ++k) {
    EXPECT_EQ(one.rows[k].permuted, two.rows[k].permuted) << one.rows[k].id;
    EXPECT_EQ(one.rows[k].pValue, two.rows[k].pValue);
  }
  req.seed = 78;
  const PermuteResult other = runPermutationTest(a, b, req);
  EXPECT_NE(one.rows[0].permuted, other.rows[0].permuted);
}

TEST(PermutationTestTest, BadCountsAreRejected) {
  PermuteRequest req;
  req.measures = {&measure("w1")};
  for (int p : {0, -3, kMaxPermutations + 1}) {
    req.permutations = p;
    const auto e = checkPermuteRequest(req);
    ASSERT_TRUE(e.has_value()) << p;
    EXPECT_NE(e->find(std::to_string(p)), std::string::npos) << *e;
  }
  req.permutations = kMaxPermutations;
  EXPECT_FALSE(checkPermuteRequest(req).has_value());
}

}  // namespace
}  // namespace barrow
