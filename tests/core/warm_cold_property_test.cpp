// Warm starts are only a faster route to the same numbers: for every family, every registered
// measure and thread counts 1, 2 and 4, a sweep with warm starts equals one without, to the
// measure's stated accuracy. Exact and closed-form measures: 1e-12 relative (their values are
// unique optima or formulas; only rounding may differ). Entropic measures: the marginal
// tolerance bounds the dual gap by about tolerance × (largest cost) [D: weak duality of the
// entropic dual, the columns exact after each half step]; we allow 10× that. [CP]
#include <gtest/gtest.h>

#include <cmath>
#include <random>

#include "io/cloud_file.h"
#include "measures/registry.h"
#include "support/test_support.h"
#include "families/family_spec.h"
#include "sweep/sweep_engine.h"

namespace barrow {
namespace {

// Largest |x − y|^p over the clouds' bounding box: an upper bound on every cost.
double costBound(const Cloud& a, const Cloud& b, int p) {
  Eigen::MatrixX2d all(a.size() + b.size(), 2);
  all << a.points, b.points;
  const double diag = (all.colwise().maxCoeff() - all.colwise().minCoeff()).norm();
  return std::pow(diag, p);
}

double allowedGap(const std::string& id, double cold, double bound) {
  if (id == "entropic" || id == "sinkhorn") return 10 * 1e-6 * bound;  // tolerance 1e-6 (the default)
  return 1e-12 * std::max(1.0, std::abs(cold));
}

struct Case {
  Family family;
  double from, to;
};

const Case kCases[] = {{Family::Shift, -1.0, 1.0}, {Family::Rotate, -90.0, 90.0}, {Family::Scale, 0.5, 1.5},
                       {Family::Interpolate, 0.0, 1.0}, {Family::Mix, 0.0, 1.0}};

SweepResult sweep(const Cloud& a, const Cloud& b, const Case& c, bool warm, int threads) {
  SweepRequest req;
  req.settings.family = c.family;
  req.settings.from = c.from;
  req.settings.to = c.to;
  req.settings.steps = 9;
  req.refineJumps = false;  // the refined θ would differ with the values; compare on one grid
  req.warmStart = warm;
  req.threads = threads;
  return runSweep(a, b, req);
}

void expectSame(const SweepResult& cold, const SweepResult& other, const Cloud& a, const Cloud& b,
                const std::string& what) {
  ASSERT_EQ(cold.theta, other.theta) << what;
  ASSERT_EQ(cold.series.size(), other.series.size()) << what;
  const double bound = costBound(a, b, 2);  // p = 2 is the entropic default
  for (std::size_t j = 0; j < cold.series.size(); ++j)
    for (std::size_t k = 0; k < cold.theta.size(); ++k) {
      const double x = cold.series[j].value[k], y = other.series[j].value[k];
      if (std::isnan(x) || std::isinf(x)) {
        EXPECT_EQ(std::isnan(x), std::isnan(y)) << what << " " << cold.series[j].id << " θ=" << cold.theta[k];
        EXPECT_EQ(std::isinf(x), std::isinf(y)) << what << " " << cold.series[j].id << " θ=" << cold.theta[k];
        continue;
      }
      EXPECT_NEAR(y, x, allowedGap(cold.series[j].id, x, bound))
          << what << " " << cold.series[j].id << " at θ=" << cold.theta[k];
    }
}

void checkPair(const Cloud& a, const Cloud& b, const std::string& name) {
  for (const Case& c : kCases) {
    const SweepResult cold = sweep(a, b, c, false, 1);
    ASSERT_TRUE(cold.message.empty()) << name << " " << familyName(c.family) << ": " << cold.message;
    EXPECT_EQ(cold.series.size(), MeasureRegistry::instance().defaults().size());
    for (int threads : {1, 2, 4})
      expectSame(cold, sweep(a, b, c, true, threads), a, b, name + " " + familyName(c.family) + " warm, threads " + std::to_string(threads));
    expectSame(cold, sweep(a, b, c, false, 2), a, b, name + " " + familyName(c.family) + " cold, threads 2");
  }
}

Cloud subsample(const Cloud& c, int every) {
  std::vector<Eigen::Index> keep;
  for (Eigen::Index i = 0; i < c.size(); i += every) keep.push_back(i);
  Eigen::MatrixX2d p(Eigen::Index(keep.size()), 2);
  Eigen::VectorXd w(Eigen::Index(keep.size()));
  for (std::size_t k = 0; k < keep.size(); ++k) p.row(Eigen::Index(k)) = c.points.row(keep[k]), w(Eigen::Index(k)) = c.weights(keep[k]);
  return Cloud(c.name, p, w);
}

TEST(WarmColdPropertyTest, RandomWeightedCloudsGiveTheSameNumbersWarmOrColdOnAnyThreadCount) {
  for (unsigned seed : {11u, 12u}) {
    const Cloud a = test::gaussianCloud(24 + int(seed), seed, 0.0, 1.0, true);
    const Cloud b = test::gaussianCloud(19 + int(seed), seed + 100, 0.7, 0.6, true);
    checkPair(a, b, "random seed " + std::to_string(seed));
  }
}

TEST(WarmColdPropertyTest, SamplesGiveTheSameNumbersWarmOrColdOnAnyThreadCount) {
  for (const std::string s : {"sensor_drift", "dropped_mode", "depots_and_shops"}) {
    auto la = readCloudFile(test::samplesDir() + "/" + s + "/a.csv");
    auto lb = readCloudFile(test::samplesDir() + "/" + s + "/b.csv");
    ASSERT_TRUE(la.value && lb.value) << s;
    // Every 8th point keeps the run short on two cores; the weights stay as given.
    const int every = la.value->size() > 50 ? 8 : 1;
    checkPair(subsample(*la.value, every), subsample(*lb.value, every), s);
  }
}

}  // namespace
}  // namespace barrow
