// Every measure, with default settings, gives the same value when both clouds are shifted by
// the same vector: all of them are defined from differences of positions, and every automatic
// setting (histogram grid, KDE bandwidth and integration grid, MMD median, entropic ε) derives
// from the data, not from the coordinate origin.
#include <gtest/gtest.h>

#include <array>
#include <cmath>
#include <string>
#include <vector>

#include "measures/evaluate.h"
#include "measures/registry.h"
#include "support/test_support.h"

namespace barrow {
namespace {

Cloud shifted(const Cloud& c, double dx, double dy) {
  Eigen::MatrixX2d p = c.points;
  p.col(0).array() += dx;
  p.col(1).array() += dy;
  return Cloud(c.name, p, c.weights);
}

// [D] Tolerance. Adding t to a coordinate rounds it to the spacing of doubles near |t|: at
// |t| = 1e6 that spacing is 2^-33 ≈ 1.2e-10, so each stored point moves by up to 5.8e-11 from
// the exactly shifted one (differences of two shifted coordinates are then exact, Sterbenz).
// The measures compared here are Lipschitz in the positions with constants of order 1 to
// 1/σ (σ ≈ 1 the clouds' spread: kernels, KDE bandwidths ≈ 0.3), so the exactly computed values
// may move by about 1e-9 at most; iterative solvers also stop at their tolerance (marginal
// error 1e-9 relative for Sinkhorn), after a possibly different number of iterations. Allowed:
// 1e-7·max(1, |value|), 100× that. Histogram values are piecewise constant in the positions and
// so identical unless a point lies within about 1e-9 bin widths of a bin edge (it does not here).
double tolerance(double v) { return 1e-7 * std::max(1.0, std::abs(v)); }

void expectShiftInvariant(const Cloud& a, const Cloud& b, const std::vector<std::string>& sets) {
  const std::vector<std::array<double, 2>> shifts = {{3.7, -1.2}, {-250000.5, 731000.25}, {1e6, -1e6}, {1e6, 1e6}};
  EvalRequest req;
  for (const auto& s : sets) ASSERT_FALSE(req.params.assign(s)) << s;
  // The critics train a network per call: their frame test is in critic_measure_test.cpp.
  for (const Measure* m : MeasureRegistry::instance().defaults()) {
    const Result base = evaluateMeasure(*m, a, b, req);
    if (base.status == Status::InvalidInput) continue;  // not defined for these settings (kNN for js)
    for (const auto& t : shifts) {
      const Result r = evaluateMeasure(*m, shifted(a, t[0], t[1]), shifted(b, t[0], t[1]), req);
      ASSERT_EQ(r.status, base.status) << m->id() << " shifted by (" << t[0] << ", " << t[1] << "): " << r.message;
      if (base.status == Status::Infinite) continue;
      EXPECT_NEAR(r.value, base.value, tolerance(base.value))
          << m->id() << " shifted by (" << t[0] << ", " << t[1] << ")" << (sets.empty() ? "" : " with " + sets[0]);
    }
  }
}

TEST(TranslationTest, EveryMeasureWithDefaultSettingsIgnoresAShiftOfBothClouds) {
  expectShiftInvariant(test::gaussianCloud(60, 3, 0.0, 1.0), test::gaussianCloud(45, 4, 0.7, 0.8), {});
}

TEST(TranslationTest, DensityEstimatorsIgnoreAShiftOfBothClouds) {
  // Equal weights so that kNN applies; the KDE's rules and grid, the kNN distances.
  const Cloud a = test::gaussianCloud(80, 5, 0.0, 1.0, false), b = test::gaussianCloud(70, 6, 0.5, 1.2, false);
  expectShiftInvariant(a, b, {"density.estimator=kde"});
  expectShiftInvariant(a, b, {"density.estimator=knn"});
  expectShiftInvariant(a, b, {"density.estimator=kde", "density.bandwidth=silverman"});
}

// [D] The case that showed the old rule's fault (grid corner at multiples of the bin from 0):
// shifting both clouds by (3.7, −1.2) must not turn a moderate JS into ln 2 or TV into 1.
TEST(TranslationTest, AutomaticHistogramGridMovesWithTheData) {
  const Cloud a = test::gaussianCloud(50, 7, 0.0, 1.0), b = test::gaussianCloud(50, 8, 0.3, 1.0);
  for (const char* id : {"js", "tv", "kl_ab", "hellinger"}) {
    const Measure& m = *MeasureRegistry::instance().find(id);
    const Result r0 = evaluateMeasure(m, a, b, {});
    const Result r1 = evaluateMeasure(m, shifted(a, 3.7, -1.2), shifted(b, 3.7, -1.2), {});
    EXPECT_EQ(r0.status, r1.status) << id;
    if (r0.status == Status::Ok) {
      EXPECT_EQ(r0.value, r1.value) << id;  // same bins, same sums
    }
    EXPECT_NEAR(r1.details["origin"][0].get<double>() - r0.details["origin"][0].get<double>(), 3.7, 1e-12);
  }
}

}  // namespace
}  // namespace barrow
