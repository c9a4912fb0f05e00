// The radix order behind the 1-D transport solver (transport/value_order.h) against
// std::stable_sort [CP: a sort is checked against the standard library's on hostile inputs],
// and the solver built on it against a plain walk over std::stable_sort's order [D].
#include <gtest/gtest.h>

#include <algorithm>
#include <cfloat>
#include <cmath>
#include <limits>
#include <numeric>
#include <random>

#include "transport/ot_1d.h"
#include "transport/value_order.h"

namespace barrow {
namespace {

// The documented result: indices stably sorted by value (−0 and +0 equal).
std::vector<int> stableOrder(const std::vector<double>& v) {
  std::vector<int> o(v.size());
  std::iota(o.begin(), o.end(), 0);
  std::stable_sort(o.begin(), o.end(), [&](int i, int j) { return v[std::size_t(i)] < v[std::size_t(j)]; });
  return o;
}

void expectSameOrder(const std::vector<double>& v, const char* what) {
  std::vector<int> order;
  ValueOrderScratch scratch;
  orderByValue(v.data(), int(v.size()), order, scratch);
  const std::vector<int> expected = stableOrder(v);
  ASSERT_EQ(order.size(), expected.size()) << what;
  std::size_t firstDiff = 0;
  while (firstDiff < order.size() && order[firstDiff] == expected[firstDiff]) ++firstDiff;
  EXPECT_EQ(firstDiff, order.size()) << what << ", n = " << v.size() << ": first difference at position "
                                     << firstDiff;
}

// Sizes on both sides of the small-input cut-off and large enough for every radix pass.
const int kSizes[] = {0, 1, 2, 7, 95, 96, 97, 1000, 20000, 100000};

TEST(ValueOrderTest, RandomNormalValues) {
  std::mt19937_64 rng(1);
  std::normal_distribution<double> g(0.0, 3.0);
  for (int n : kSizes) {
    std::vector<double> v(static_cast<std::size_t>(n));
    for (double& x : v) x = g(rng);
    expectSameOrder(v, "normal");
  }
}

TEST(ValueOrderTest, HeavyDuplicatesKeepIndexOrder) {
  std::mt19937_64 rng(2);
  std::uniform_int_distribution<int> pick(-5, 5);
  for (int n : kSizes) {
    std::vector<double> v(static_cast<std::size_t>(n));
    for (double& x : v) x = 0.25 * pick(rng);
    expectSameOrder(v, "eleven distinct values");
    std::fill(v.begin(), v.end(), 42.0);
    expectSameOrder(v, "all equal");
  }
}

// −0 and +0 are equal values: they must keep their index order, whichever sign comes first.
TEST(ValueOrderTest, NegativeZeroEqualsZero) {
  std::mt19937_64 rng(3);
  std::uniform_int_distribution<int> pick(0, 3);
  for (int n : kSizes) {
    std::vector<double> v(static_cast<std::size_t>(n));
    for (double& x : v) {
      const int k = pick(rng);
      x = k == 0 ? -0.0 : k == 1 ? 0.0 : k == 2 ? -1e-320 : 1e-320;  // zeros and subnormals
    }
    expectSameOrder(v, "signed zeros and subnormals");
  }
}

// Values beyond the float range, at its edge, infinities and subnormals: all collapse onto a few
// float keys, so the order comes from the second, exact look.
TEST(ValueOrderTest, HugeTinyAndInfiniteValues) {
  const double inf = std::numeric_limits<double>::infinity();
  const double special[] = {DBL_MAX,  -DBL_MAX, 1e308,  -1e308, inf,     -inf,     double(FLT_MAX),
                            -double(FLT_MAX), std::nextafter(double(FLT_MAX), inf), 3.5e38, -3.5e38,
                            1e-300,   -1e-300,  DBL_MIN, -DBL_MIN, 5e-324,  -5e-324,  1e-40,  -1e-40,
                            1.0,      -1.0,     0.0,    -0.0};
  std::mt19937_64 rng(4);
  std::uniform_int_distribution<std::size_t> pick(0, std::size(special) - 1);
  std::normal_distribution<double> g(0.0, 1.0);
  for (int n : kSizes) {
    std::vector<double> v(static_cast<std::size_t>(n));
    for (double& x : v) x = special[pick(rng)] * (1.0 + 1e-12 * g(rng));  // near, not at, the specials
    expectSameOrder(v, "huge, tiny and infinite");
    for (double& x : v) x = special[pick(rng)];
    expectSameOrder(v, "exact specials");
  }
}

// Neighbouring doubles share one float: a narrow range is one long run for the exact look.
TEST(ValueOrderTest, ValuesCloserThanFloatResolution) {
  std::mt19937_64 rng(5);
  std::uniform_int_distribution<int> step(0, 1 << 20);
  for (int n : kSizes) {
    std::vector<double> v(static_cast<std::size_t>(n));
    for (double& x : v) x = 1.0 + step(rng) * DBL_EPSILON;
    expectSameOrder(v, "within 2^-32 of 1");
  }
}

TEST(ValueOrderTest, SortedReversedAndSawtoothInputs) {
  for (int n : kSizes) {
    std::vector<double> v(static_cast<std::size_t>(n));
    for (int i = 0; i < n; ++i) v[std::size_t(i)] = i - n / 2;
    expectSameOrder(v, "increasing");
    std::reverse(v.begin(), v.end());
    expectSameOrder(v, "decreasing");
    for (int i = 0; i < n; ++i) v[std::size_t(i)] = (i % 37) * 1e6 - (i % 5) * 1e-6;
    expectSameOrder(v, "sawtooth");
  }
}

// A far outlier bunches everything else into a sliver of [min, max]: the linear key would
// tie them all, so the float key takes over; a milder outlier keeps the linear key with
// longer ties. Both must still give the exact order.
TEST(ValueOrderTest, FarAndNearOutliers) {
  std::mt19937_64 rng(8);
  std::normal_distribution<double> g(0.0, 1.0);
  for (int n : kSizes) {
    for (double outlier : {1e12, -1e9, 300.0}) {
      std::vector<double> v(static_cast<std::size_t>(n));
      for (double& x : v) x = 1e-3 * g(rng);
      for (std::size_t k = 0; k < v.size(); k += 997) v[k] = outlier;
      expectSameOrder(v, "outliers");
    }
  }
}

// Scratch buffers reused across calls of different sizes leave no trace in the result.
TEST(ValueOrderTest, ReusedScratchGivesTheSameOrder) {
  std::mt19937_64 rng(6);
  std::normal_distribution<double> g(0.0, 1.0);
  ValueOrderScratch scratch;
  std::vector<int> order;
  for (int n : {50000, 300, 120000, 1000}) {
    std::vector<double> v(static_cast<std::size_t>(n));
    for (double& x : v) x = g(rng);
    orderByValue(v.data(), n, order, scratch);
    EXPECT_EQ(order, stableOrder(v)) << n;
  }
}

// [D] the quantile walk of ot_1d.h written out directly over std::stable_sort's order (the
// same sums in the same order): the solver must give the same cost bit for bit, weighted or
// not, equal sizes or not, p = 1, 2 and 1.5, with ties across and within the two sets.
double referenceWalk(const std::vector<double>& x, const std::vector<double>& a, const std::vector<double>& y,
                     const std::vector<double>& b, double p) {
  auto cdfOf = [](const std::vector<double>& w, const std::vector<int>& o) {
    std::vector<double> c(o.size());
    double total = 0.0;
    for (std::size_t k = 0; k < o.size(); ++k) c[k] = (total += w[std::size_t(o[k])]);
    for (double& v : c) v /= total;
    c.back() = 1.0;
    return c;
  };
  const std::vector<int> ox = stableOrder(x), oy = stableOrder(y);
  const std::vector<double> cx = cdfOf(a, ox), cy = cdfOf(b, oy);
  double cost = 0.0, t = 0.0;
  std::size_t i = 0, j = 0;
  while (i < x.size() && j < y.size()) {
    const double next = std::min(cx[i], cy[j]);
    if (next - t > 0) {
      const double d = std::abs(x[std::size_t(ox[i])] - y[std::size_t(oy[j])]);
      cost += (next - t) * (p == 1.0 ? d : p == 2.0 ? d * d : std::pow(d, p));
      t = next;
    }
    if (cx[i] <= next) ++i;
    if (cy[j] <= next) ++j;
  }
  return cost;
}

TEST(ValueOrderTest, OneDimensionalSolverEqualsTheReferenceWalkBitForBit) {
  std::mt19937_64 rng(7);
  std::normal_distribution<double> g(0.0, 1.0);
  std::uniform_real_distribution<double> u(0.0, 1.0);
  std::uniform_int_distribution<int> tie(0, 40);
  Ot1dSolver solver;
  for (const auto& [n, m] : {std::pair{5, 3}, {200, 200}, {3000, 1700}, {50000, 50000}, {20000, 80000}}) {
    for (bool weighted : {false, true}) {
      for (bool ties : {false, true}) {
        std::vector<double> x(static_cast<std::size_t>(n)), a(x.size()), y(static_cast<std::size_t>(m)), b(y.size());
        for (int i = 0; i < n; ++i) {
          x[std::size_t(i)] = ties ? 0.5 * tie(rng) : g(rng);
          a[std::size_t(i)] = weighted ? u(rng) : 1.0;
        }
        for (int j = 0; j < m; ++j) {
          y[std::size_t(j)] = ties ? 0.5 * tie(rng) + 1.0 : g(rng) + 0.7;
          b[std::size_t(j)] = weighted ? u(rng) : 1.0;
        }
        if (weighted) a[0] = 0.0;  // a zero-weight point takes no part
        for (double p : {1.0, 2.0, 1.5}) {
          const double got = solver.solve(x.data(), a.data(), n, y.data(), b.data(), m, p);
          const double want = referenceWalk(x, a, y, b, p);
          EXPECT_EQ(got, want) << "n " << n << " m " << m << " weighted " << weighted << " ties " << ties
                               << " p " << p;
          // The coupling walk (the gradient's) gives the same cost too.
          std::vector<PlanEntry> coupling;
          EXPECT_EQ(solver.solve(x.data(), a.data(), n, y.data(), b.data(), m, p, &coupling), want);
        }
      }
    }
  }
}

}  // namespace
}  // namespace barrow
