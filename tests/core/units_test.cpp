// Units of every measure (measures/units.h): declared, stated, and true to the definition.
#include <gtest/gtest.h>

#include <cmath>
#include <regex>
#include <string>
#include <vector>

#include "measures/evaluate.h"
#include "measures/registry.h"
#include "measures/units.h"
#include "support/test_support.h"

namespace barrow {
namespace {

Cloud scaled(const Cloud& c, double s) { return Cloud(c.name, c.points * s, c.weights); }

TEST(UnitsTest, EveryRegisteredMeasureDeclaresAUnitFromTheContractVocabularyWithItsRule) {
  const std::regex vocabulary("length(\\^[0-9.]+)?|nats|probability|dimensionless");
  for (const Measure* m : MeasureRegistry::instance().all()) {
    const std::string u = measureUnit(*m, ParamSet());
    EXPECT_TRUE(std::regex_match(u, vocabulary)) << m->id() << ": '" << u << "'";
    // The rule begins with the unit it derives (for the default settings or the general p).
    EXPECT_FALSE(m->unitRule().empty()) << m->id();
    const std::string head = u.substr(0, u.find('^'));
    EXPECT_EQ(m->unitRule().rfind(head, 0), 0u) << m->id() << ": " << m->unitRule();
  }
}

// [D] Units as definitions state them (DEVELOPERS.md, Measure conventions; REFERENCES.md "Units").
TEST(UnitsTest, UnitsFollowTheDefinitionsAndTheirParameters) {
  auto unitOf = [](const std::string& id, std::vector<std::string> sets = {}) {
    ParamSet p;
    for (const auto& s : sets) EXPECT_FALSE(p.assign(s)) << s;
    return measureUnit(*MeasureRegistry::instance().find(id), p);
  };
  EXPECT_EQ(unitOf("w1"), "length");
  EXPECT_EQ(unitOf("w2"), "length");
  EXPECT_EQ(unitOf("entropic"), "length^2");  // p = 2 by default
  EXPECT_EQ(unitOf("entropic", {"entropic.p=1"}), "length");
  EXPECT_EQ(unitOf("sinkhorn"), "length^2");
  EXPECT_EQ(unitOf("sinkhorn", {"sinkhorn.p=1"}), "length");
  EXPECT_EQ(unitOf("sliced"), "length");
  EXPECT_EQ(unitOf("sliced", {"sliced.p=1"}), "length");
  EXPECT_EQ(unitOf("mmd"), "dimensionless");
  EXPECT_EQ(unitOf("energy"), "length^0.5");
  EXPECT_EQ(unitOf("frechet"), "length");
  EXPECT_EQ(unitOf("chamfer"), "length");
  EXPECT_EQ(unitOf("chamfer", {"chamfer.squared=true"}), "length^2");
  EXPECT_EQ(unitOf("hausdorff"), "length");
  EXPECT_EQ(unitOf("kl_ab"), "nats");
  EXPECT_EQ(unitOf("kl_ba"), "nats");
  EXPECT_EQ(unitOf("js"), "nats");
  EXPECT_EQ(unitOf("tv"), "probability");
  EXPECT_EQ(unitOf("hellinger"), "dimensionless");
  // An invalid setting falls back to the defaults' unit rather than to nothing.
  EXPECT_EQ(unitOf("entropic", {"entropic.p=7"}), "length^2");
}

// [D] Dimensional analysis: multiplying every coordinate of both clouds by λ multiplies a value
// in length^k by λ^k and leaves nats, probabilities and pure numbers unchanged — provided every
// length-valued setting scales too, which the automatic ones do (ε = (D/20)^p, the median
// bandwidth, the histogram bin and origin, the KDE bandwidth rules; kNN has none). So the
// declared unit is checked against the computed numbers, for every measure and every setting
// that changes the unit. Tolerance 1e-7 relative: the clouds differ by the rounding of the
// product (1e-16 relative) and the iterative solvers stop at their tolerance, which scales.
TEST(UnitsTest, ScalingTheCoordinatesScalesEachValueByItsDeclaredPowerOfLength) {
  const Cloud a = test::gaussianCloud(40, 11, 0.0, 1.0, false);
  const Cloud b = test::gaussianCloud(30, 12, 0.8, 1.3, false);
  const double lambda = 2.5;
  const Cloud as = scaled(a, lambda), bs = scaled(b, lambda);
  const std::vector<std::vector<std::string>> variants = {
      {},
      {"entropic.p=1", "sinkhorn.p=1", "sliced.p=1", "chamfer.squared=true", "mmd.estimator=unbiased"},
      {"density.estimator=kde"},
      {"density.estimator=knn"},
  };
  int checked = 0;
  for (const auto& sets : variants) {
    EvalRequest req;
    for (const auto& s : sets) ASSERT_FALSE(req.params.assign(s)) << s;
    // The critics train a network per call: their scaling test is in critic_measure_test.cpp.
    for (const Measure* m : MeasureRegistry::instance().defaults()) {
      const Result r = evaluateMeasure(*m, a, b, req), rs = evaluateMeasure(*m, as, bs, req);
      if (r.status == Status::InvalidInput) continue;  // e.g. kNN for js: not a unit question
      ASSERT_EQ(rs.status, r.status) << m->id() << ": " << rs.message;
      if (r.status == Status::Infinite) continue;  // +inf KL on a histogram: inf at every scale
      ASSERT_EQ(r.status, Status::Ok) << m->id() << ": " << r.message;
      const double k = lengthExponent(measureUnit(*m, req.params)).value_or(0.0);  // no length: degree 0
      const double expected = r.value * std::pow(lambda, k);
      EXPECT_NEAR(rs.value, expected, 1e-7 * std::abs(expected) + 1e-13)
          << m->id() << " unit " << measureUnit(*m, req.params) << " with " << (sets.empty() ? "" : sets[0]);
      ++checked;
    }
  }
  EXPECT_GE(checked, int(MeasureRegistry::instance().defaults().size()) + 8);
}

}  // namespace
}  // namespace barrow

namespace barrow {
namespace {

// lengthExponent inverts lengthPower, and units without length have no exponent [D].
TEST(UnitsTest, LengthExponentInvertsLengthPower) {
  for (double k : {1.0, 2.0, 0.5, 1.5}) EXPECT_EQ(lengthExponent(lengthPower(k)), k) << k;
  EXPECT_FALSE(lengthExponent(kUnitNats));
  EXPECT_FALSE(lengthExponent(kUnitDimensionless));
  EXPECT_FALSE(lengthExponent("length^x"));
}

}  // namespace
}  // namespace barrow
