// Certified brackets for w1 and w2 on large clouds (measures/wasserstein_bracket.h): at sizes
// where the exact solve is cheap, the bracket forced on (`<id>.exact_limit=0`) must contain the
// exact value, and so must each of its lower bounds and its upper bound separately. Widths are
// printed. Also the parts: the k-d quantiser and the offset-nearest search against brute force.
// Sources: W_p is a metric (Villani 2009, Def. 6.1 and Thm 6.9 (mem)); Kantorovich duality
// (Villani 2003, Thm 1.3 and Thm 1.14 (mem)); Gelbrich 1990 (mem) for the Gaussian lower bound.
#include <gtest/gtest.h>

#include <cmath>
#include <cstdio>
#include <random>
#include <string>

#include "measures/evaluate.h"
#include "measures/measure_json.h"
#include "measures/registry.h"
#include "spatial/cloud_quantiser.h"
#include "spatial/offset_nearest.h"

namespace barrow {
namespace {

enum class Shape { Uniform, Clustered };

Cloud makeCloud(Shape shape, int n, bool weighted, double shift, std::uint64_t seed) {
  std::mt19937_64 rng(seed);
  std::uniform_real_distribution<double> u(0.0, 1.0);
  std::normal_distribution<double> z(0.0, 0.06);
  Eigen::MatrixX2d p(n, 2);
  Eigen::VectorXd w = Eigen::VectorXd::Ones(n);
  for (int i = 0; i < n; ++i) {
    if (shape == Shape::Uniform) {
      p.row(i) << u(rng) + shift, u(rng);
    } else {
      const int c = int(4 * u(rng));
      p.row(i) << 0.15 + 0.7 * (c % 2) + z(rng) + shift, 0.2 + 0.6 * (c / 2) + z(rng);
    }
    if (weighted) w(i) = 0.1 + 2.0 * u(rng) * u(rng);
  }
  return Cloud("", p, w);
}

Result run(const char* id, const Cloud& a, const Cloud& b, bool bracket, int representatives) {
  const Measure* m = MeasureRegistry::instance().find(id);
  EXPECT_NE(m, nullptr) << id;
  if (!m) return Result::invalid("missing");
  EvalRequest req;
  req.params.set(std::string(id) + ".exact_limit", bracket ? "0" : "2000000000");
  req.params.set(std::string(id) + ".representatives", std::to_string(representatives));
  return evaluateMeasure(*m, a, b, req);
}

struct Case {
  const char* label;
  Cloud a, b;
};

// [D] low <= W_p <= high, and each lower bound on its own below W_p, on uniform, clustered and
// weighted clouds of 2 000 to 8 000 points, two representative counts; widths printed.
TEST(WassersteinBracketTest, BracketContainsTheExactValue) {
  const Case cases[] = {
      {"uniform 2000+2000, shifted", makeCloud(Shape::Uniform, 2000, false, 0.3, 1),
       makeCloud(Shape::Uniform, 2000, false, 0.0, 2)},
      {"clustered 4000 vs uniform 3000, weighted", makeCloud(Shape::Clustered, 4000, true, 0.0, 3),
       makeCloud(Shape::Uniform, 3000, true, 0.1, 4)},
      {"clustered 8000 vs clustered 6000, weighted", makeCloud(Shape::Clustered, 8000, true, 0.05, 5),
       makeCloud(Shape::Clustered, 6000, false, -0.02, 6)},
  };
  for (const auto& c : cases) {
    for (const char* id : {"w1", "w2"}) {
      const Result exact = run(id, c.a, c.b, false, 1);
      ASSERT_EQ(exact.status, Status::Ok) << c.label << " " << id << ": " << exact.message;
      const double slack = 1e-9 * exact.value;  // the exact solve's own certificate level
      for (int k : {300, 1500}) {
        const Result r = run(id, c.a, c.b, true, k);
        ASSERT_EQ(r.status, Status::Bracketed) << c.label << " " << id << ": " << r.message;
        EXPECT_LE(r.low, exact.value + slack) << c.label << " " << id << " k=" << k;
        EXPECT_GE(r.high, exact.value - slack) << c.label << " " << id << " k=" << k;
        EXPECT_LE(r.low, r.value);
        EXPECT_LE(r.value, r.high);
        EXPECT_DOUBLE_EQ(r.value, 0.5 * (r.low + r.high));
        EXPECT_DOUBLE_EQ(r.details.at("value_accuracy").get<double>(), 0.5 * (r.high - r.low));
        for (const auto& [name, bound] : r.details.at("low_candidates").items())
          EXPECT_LE(bound.get<double>(), exact.value + slack) << c.label << " " << id << " bound " << name;
        EXPECT_LE(r.details.at("representatives_a").get<int>(), k);
        std::printf("[bracket] %-44s %s k=%4d exact=%.9f low=%.9f high=%.9f width=%.3g (%.3g%%) low by %s\n",
                    c.label, id, k, exact.value, r.low, r.high, r.high - r.low,
                    100.0 * (r.high - r.low) / exact.value, r.details.at("low_rule").get<std::string>().c_str());
      }
    }
  }
}

// [D] With as many representatives as positions, every cell holds one position: the quantised
// clouds are the clouds themselves, so bracket mode returns the exact value with status ok.
// Repeated points (9 000 rows on 60 positions against 4 000 rows on 45) are merged the same way.
TEST(WassersteinBracketTest, OneRepresentativePerPositionIsExact) {
  const Cloud a = makeCloud(Shape::Uniform, 400, true, 0.2, 11), b = makeCloud(Shape::Clustered, 300, false, 0.0, 12);
  Eigen::MatrixX2d ra(9000, 2), rb(4000, 2);
  for (int i = 0; i < 9000; ++i) ra.row(i) = a.points.row(i % 60);
  for (int i = 0; i < 4000; ++i) rb.row(i) = b.points.row(i % 45);
  const Cloud repeatedA("RA", ra), repeatedB("RB", rb);
  struct Pair {
    const Cloud *x, *y;
    int k;
  };
  for (const char* id : {"w1", "w2"}) {
    for (const Pair& c : {Pair{&a, &b, 400}, Pair{&repeatedA, &repeatedB, 60}}) {
      const Result exact = run(id, *c.x, *c.y, false, 1);
      const Result r = run(id, *c.x, *c.y, true, c.k);
      ASSERT_EQ(r.status, Status::Ok) << r.message;
      EXPECT_TRUE(r.details.contains("merged_positions"));
      EXPECT_NEAR(r.value, exact.value, 1e-9 * exact.value) << id;
    }
  }
}

// The default threshold: small clouds stay exact (status ok, no bounds).
TEST(WassersteinBracketTest, BelowTheLimitNothingChanges) {
  const Cloud a = makeCloud(Shape::Uniform, 500, false, 0.2, 21), b = makeCloud(Shape::Uniform, 500, false, 0.0, 22);
  for (const char* id : {"w1", "w2"}) {
    const Measure* m = MeasureRegistry::instance().find(id);
    ASSERT_NE(m, nullptr);
    const Result r = evaluateMeasure(*m, a, b, EvalRequest{});
    EXPECT_EQ(r.status, Status::Ok) << r.message;
    EXPECT_TRUE(std::isnan(r.low) && std::isnan(r.high));
    EXPECT_FALSE(r.details.contains("low_rule"));
  }
}

// DEVELOPERS.md, Command-line contract: a bracketed row carries "status":"bracketed" with
// numeric "low" and "high" and the value between them; other rows carry neither.
TEST(WassersteinBracketTest, JsonRowOfABracketedValue) {
  const Cloud a = makeCloud(Shape::Clustered, 1500, true, 0.0, 31), b = makeCloud(Shape::Uniform, 1200, false, 0.1, 32);
  const Measure* m = MeasureRegistry::instance().find("w1");
  ASSERT_NE(m, nullptr);
  EvalRequest req;
  req.params.set("w1.exact_limit", "0");
  req.params.set("w1.representatives", "200");
  const Result r = evaluateMeasure(*m, a, b, req);
  const nlohmann::json row = measureRowJson(*m, r, req.params);
  EXPECT_EQ(row.at("status"), "bracketed");
  ASSERT_TRUE(row.at("low").is_number() && row.at("high").is_number() && row.at("value").is_number());
  EXPECT_LE(row.at("low").get<double>(), row.at("value").get<double>());
  EXPECT_LE(row.at("value").get<double>(), row.at("high").get<double>());
  EXPECT_LT(row.at("low").get<double>(), row.at("high").get<double>());
  EXPECT_EQ(row.at("details").at("value_is"), "midpoint of [low, high]");
  EXPECT_FALSE(row.contains("message"));
  const Result exact = evaluateMeasure(*m, a, b, EvalRequest{});
  const nlohmann::json plain = measureRowJson(*m, exact, EvalRequest{}.params);
  EXPECT_EQ(plain.at("status"), "ok");
  EXPECT_FALSE(plain.contains("low"));
  EXPECT_FALSE(plain.contains("high"));
  EXPECT_STREQ(statusName(Status::Bracketed), "bracketed");
  EXPECT_TRUE(usable(Status::Bracketed));
}

// [D] The quantiser: at most k cells, masses summing to 1, each representative the weighted
// mean of its cell, and the stated costs equal to the sums over points.
TEST(CloudQuantiserTest, RepresentativesAreCellMeansCarryingCellMass) {
  const Cloud c = makeCloud(Shape::Clustered, 3000, true, 0.0, 41);
  const Quantisation q = quantiseCloud(c, 250);
  const Eigen::Index k = q.representatives.size();
  ASSERT_GT(k, 200);
  ASSERT_LE(k, 250);
  const Eigen::VectorXd w = c.normalizedWeights();
  Eigen::MatrixX2d sum = Eigen::MatrixX2d::Zero(k, 2);
  Eigen::VectorXd mass = Eigen::VectorXd::Zero(k);
  double cost1 = 0.0, cost2 = 0.0;
  for (Eigen::Index i = 0; i < c.size(); ++i) {
    const Eigen::Index r = q.cellOf[std::size_t(i)];
    ASSERT_GE(r, 0);
    mass(r) += w(i);
    sum.row(r) += w(i) * c.points.row(i);
    const double d = (c.points.row(i) - q.representatives.points.row(r)).norm();
    cost1 += w(i) * d;
    cost2 += w(i) * d * d;
  }
  EXPECT_NEAR(mass.sum(), 1.0, 1e-12);
  for (Eigen::Index r = 0; r < k; ++r) {
    EXPECT_NEAR(q.representatives.weights(r), mass(r), 1e-15);
    EXPECT_NEAR((sum.row(r) / mass(r) - q.representatives.points.row(r)).norm(), 0.0, 1e-12);
  }
  EXPECT_NEAR(q.cost1, cost1, 1e-12);
  EXPECT_NEAR(q.cost2, cost2, 1e-12);
  EXPECT_NEAR(q.errorBound(2), std::sqrt(cost2), 1e-12);
}

// Coincident points cannot be cut: fewer representatives, zero error.
TEST(CloudQuantiserTest, CoincidentPointsGiveOneRepresentative) {
  const Cloud c("", Eigen::MatrixX2d::Constant(50, 2, 0.25));
  const Quantisation q = quantiseCloud(c, 10);
  EXPECT_EQ(q.representatives.size(), 1);
  EXPECT_EQ(q.cost1, 0.0);
}

// [CP] brute force min_s (|z − p_s|^p − c_s): exact with no slack, within the slack otherwise.
TEST(OffsetNearestTest, AgreesWithBruteForce) {
  std::mt19937_64 rng(51);
  std::uniform_real_distribution<double> u(-1.0, 1.0);
  const int n = 700;
  Eigen::MatrixX2d sites(n, 2);
  Eigen::VectorXd off(n);
  for (int s = 0; s < n; ++s) {
    sites.row(s) << u(rng), u(rng);
    off(s) = 0.6 * sites(s, 0) + 0.1 * u(rng);  // near-ties along rays, as W1 potentials have
  }
  for (int p : {1, 2}) {
    const OffsetNearest f(sites, off, p);
    int hint = -1;
    for (int q = 0; q < 500; ++q) {
      const double x = 1.5 * u(rng), y = 1.5 * u(rng);
      double best = INFINITY;
      for (int s = 0; s < n; ++s) {
        const double d2 = (x - sites(s, 0)) * (x - sites(s, 0)) + (y - sites(s, 1)) * (y - sites(s, 1));
        best = std::min(best, (p == 2 ? d2 : std::sqrt(d2)) - off(s));
      }
      EXPECT_EQ(f(x, y), best) << "p=" << p;
      const double loose = f(x, y, 0.05, &hint);
      EXPECT_GE(loose, best);
      EXPECT_LE(loose, best + 0.05);
    }
  }
}

}  // namespace
}  // namespace barrow
