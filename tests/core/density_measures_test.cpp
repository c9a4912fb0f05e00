// The five density measures as the CLI, sweep and GUI see them: registration, the shared
// density.* group, bad input as a status, settings named in every result, freezing.
#include <gtest/gtest.h>

#include <cmath>
#include <random>

#include "measures/density_measures.h"
#include "measures/evaluate.h"
#include "measures/registry.h"

namespace barrow {
namespace {

const char* const kIds[] = {"kl_ab", "kl_ba", "js", "tv", "hellinger"};

Cloud blob(int n, double mx, unsigned seed) {
  std::mt19937 rng(seed);
  std::normal_distribution<double> g(0.0, 1.0);
  Eigen::MatrixX2d p(n, 2);
  for (int i = 0; i < n; ++i) p.row(i) << mx + g(rng), g(rng);
  return Cloud("", p);
}

Result run(const char* id, const Cloud& a, const Cloud& b, std::initializer_list<const char*> sets) {
  EvalRequest req;
  for (const char* s : sets) EXPECT_FALSE(req.params.assign(s)) << s;
  return evaluateMeasure(*MeasureRegistry::instance().find(id), a, b, req);
}

// DEVELOPERS.md, Measure conventions: the five ids, in its order, one shared parameter group density.*.
TEST(DensityMeasuresTest, AllFiveAreRegisteredWithOneSharedGroup) {
  const auto& reg = MeasureRegistry::instance();
  std::vector<std::string> order;
  for (const Measure* m : reg.all())
    if (std::string(m->id()).find("kl_") == 0 || m->id() == "js" || m->id() == "tv" || m->id() == "hellinger")
      order.push_back(m->id());
  EXPECT_EQ(order, std::vector<std::string>(std::begin(kIds), std::end(kIds)));
  std::vector<std::string> keys;
  for (const auto& p : densityParamSpecs()) keys.push_back(p.key);
  EXPECT_EQ(keys, (std::vector<std::string>{"density.estimator", "density.bin", "density.origin",
                                            "density.bandwidth", "density.k"}));
  for (const char* id : kIds) {
    const auto specs = reg.find(id)->params();
    ASSERT_EQ(specs.size(), keys.size()) << id;
    for (std::size_t i = 0; i < specs.size(); ++i) {
      EXPECT_EQ(specs[i].key, keys[i]);
      EXPECT_FALSE(checkParam(specs[i], specs[i].defaultValue)) << specs[i].key;  // defaults valid
    }
  }
}

TEST(DensityMeasuresTest, BadSettingsAndCloudsBecomeInvalidInputNamingTheCause) {
  const Cloud a = blob(40, 0, 1), b = blob(30, 1, 2);
  const struct {
    const char* set;
    const char* says;
  } cases[] = {{"density.bin=0", "density.bin"},
               {"density.bin=-1", "density.bin"},
               {"density.bandwidth=0.1,0", "density.bandwidth"},
               {"density.bandwidth=wide", "density.bandwidth"},
               {"density.k=0", "density.k"},
               {"density.k=2.5", "density.k"},
               {"density.origin=1,2,3", "density.origin"},
               {"density.estimator=histogram", "density.estimator"}};
  for (const auto& c : cases) {
    const Result r = run("js", a, b, {c.set});
    EXPECT_EQ(r.status, Status::InvalidInput) << c.set;
    EXPECT_NE(r.message.find(c.says), std::string::npos) << r.message;
  }
  Cloud nan = a;
  nan.points(5, 1) = NAN;
  EXPECT_EQ(run("kl_ab", nan, b, {}).status, Status::InvalidInput);
  EXPECT_EQ(run("kl_ab", a, Cloud("B", Eigen::MatrixX2d(0, 2)), {}).status, Status::InvalidInput);
}

// DEVELOPERS.md, Measure conventions: density measures name their estimator and its settings in every output.
TEST(DensityMeasuresTest, EveryResultNamesTheEstimatorAndItsSettings) {
  const Cloud a = blob(200, 0, 3), b = blob(150, 1, 4);
  for (const char* id : kIds) {
    const Result h = run(id, a, b, {"density.estimator=hist"});
    for (const char* key : {"bin", "bin_rule", "origin", "origin_rule", "bins_occupied"})
      EXPECT_TRUE(h.details.contains(key)) << id << " hist " << key;
    const Result k = run(id, a, b, {"density.estimator=kde"});
    EXPECT_EQ(k.status, Status::Ok) << id << " " << k.message;
    for (const char* key : {"bandwidth", "bandwidth_rule", "nodes_per_bandwidth", "error_estimate", "integration"})
      EXPECT_TRUE(k.details.contains(key)) << id << " kde " << key;
    // TV integrates by rows (its panels), the others on a node grid.
    for (const char* key : std::string(id) == "tv" ? std::vector<const char*>{"tv_panels", "tv_rows"}
                                                   : std::vector<const char*>{"grid_size", "grid_step"})
      EXPECT_TRUE(k.details.contains(key)) << id << " kde " << key;
    EXPECT_EQ(h.details["estimator"], "hist");
    EXPECT_EQ(k.details["estimator"], "kde");
  }
  for (const char* id : {"kl_ab", "kl_ba"}) {
    const Result n = run(id, a, b, {"density.estimator=knn"});
    EXPECT_EQ(n.details["estimator"], "knn");
    EXPECT_EQ(n.details["k"], 5);  // the documented default
    EXPECT_TRUE(n.details.contains("tie_rule"));
  }
}

// Histogram KL with an empty bin is +inf with status infinite (DEVELOPERS.md, Measure conventions: +∞ is a legitimate
// value); the others stay finite on the same input.
TEST(DensityMeasuresTest, InfiniteKlIsAStatusNotALargeNumber) {
  const Cloud a = blob(100, 0, 5), b = blob(100, 6, 6);
  const Result r = run("kl_ab", a, b, {"density.bin=0.5"});
  EXPECT_EQ(r.status, Status::Infinite);
  EXPECT_TRUE(std::isinf(r.value));
  EXPECT_TRUE(r.usable());
  EXPECT_FALSE(r.message.empty());
  EXPECT_EQ(run("js", a, b, {"density.bin=0.5"}).status, Status::Ok);
}

// freeze() replaces exactly the words (auto bin, auto origin, bandwidth rule) by numbers that
// pass the same specs, keeps user numbers as given, and reproduces the value.
TEST(DensityMeasuresTest, FreezeReplacesRuleWordsByValidNumbers) {
  const Cloud a = blob(120, 0, 7), b = blob(90, 0.5, 8);
  const Measure& m = *MeasureRegistry::instance().find("tv");
  ParamSet user;
  user.set("density.k", "3");
  std::string error;
  const ParamSet resolved = resolveParams(m, user, &error);
  ASSERT_TRUE(error.empty());
  const ParamSet frozen = m.freeze(a, b, resolved);
  for (const auto& spec : m.params()) {
    EXPECT_FALSE(checkParam(spec, frozen.text(spec.key))) << spec.key << "=" << frozen.text(spec.key);
    if (spec.key == "density.estimator" || spec.key == "density.k") {
      EXPECT_EQ(frozen.text(spec.key), resolved.text(spec.key));
    } else {
      EXPECT_TRUE(std::isfinite(frozen.pair(spec.key).first)) << spec.key << " still a word";
    }
  }
  for (const char* est : {"hist", "kde"}) {
    ParamSet u = frozen, r = resolved;
    u.set("density.estimator", est);
    r.set("density.estimator", est);
    EvalRequest q1, q2;
    q1.params = u;
    q2.params = r;
    EXPECT_EQ(evaluateMeasure(m, a, b, q1).value, evaluateMeasure(m, a, b, q2).value) << est;
  }
  ParamSet given = resolved;
  given.set("density.bin", "0.3");
  EXPECT_EQ(m.freeze(a, b, given).text("density.bin"), "0.3");
}

}  // namespace
}  // namespace barrow
