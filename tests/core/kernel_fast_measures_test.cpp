// mmd and energy above the binning threshold (kernel/discrepancy.h): the details state the
// method and the bound, and the value stays within its stated accuracy of the value from the
// direct sums over all pairs.
#include <gtest/gtest.h>

#include <cmath>
#include <random>

#include "kernel/discrepancy.h"
#include "kernel/median_distance.h"
#include "measures/evaluate.h"
#include "measures/registry.h"

namespace barrow {
namespace {

Cloud square(const char* name, int n, unsigned seed, double sx, double sy) {
  std::mt19937 rng(seed);
  std::uniform_real_distribution<double> u(0.0, 1.0);
  Eigen::MatrixX2d p(n, 2);
  for (int i = 0; i < n; ++i) p.row(i) << sx + u(rng), sy + u(rng);
  return Cloud(name, p);
}

Result run(const char* id, const Cloud& a, const Cloud& b) {
  return evaluateMeasure(*MeasureRegistry::instance().find(id), a, b, EvalRequest{});
}

DiscrepancySums direct(const Cloud& a, const Cloud& b, const PairKernelSpec& k) {
  DiscrepancyOptions o;
  o.method = DiscrepancyOptions::Method::Direct;
  return discrepancySums(supportOf(a), supportOf(b), k, {}, o);
}

// 24 000 + 24 000 points: 1.15e9 pair evaluations, above the 1e9 threshold. Reference: the
// measure's definition (DEVELOPERS.md "Measure conventions") from direct sums [D].
TEST(KernelFastMeasuresTest, EnergyAboveThresholdIsBinnedAndWithinItsAccuracy) {
  const Cloud a = square("A", 24000, 1, 0, 0), b = square("B", 24000, 2, 0.5, 0.2);
  const Result r = run("energy", a, b);
  ASSERT_EQ(r.status, Status::Ok) << r.message;
  ASSERT_TRUE(r.details.contains("value_accuracy"));
  EXPECT_NE(r.details["kernel_sums"].get<std::string>().find("binned"), std::string::npos);
  const DiscrepancySums d = direct(a, b, {PairKernel::Distance, 0.0});
  const double e = 2 * d.ab - d.aaOffDiagonal - d.bbOffDiagonal;
  EXPECT_LE(std::abs(r.details["energy"].get<double>() - e), r.details["energy_error_bound"].get<double>());
  EXPECT_LE(std::abs(r.value - std::sqrt(e)), r.details["value_accuracy"].get<double>());
  EXPECT_LT(r.details["value_accuracy"].get<double>(), 1e-4);  // not vacuous: value ~0.62
}

TEST(KernelFastMeasuresTest, MmdAboveThresholdIsBinnedAndWithinItsAccuracy) {
  const Cloud a = square("A", 24000, 3, 0, 0), b = square("B", 24000, 4, 0.5, 0.2);
  const Result r = run("mmd", a, b);
  ASSERT_EQ(r.status, Status::Ok) << r.message;
  ASSERT_TRUE(r.details.contains("value_accuracy"));
  const double sigma = r.details["sigma"].get<double>();
  Eigen::MatrixX2d pool(48000, 2);
  pool << a.points, b.points;
  EXPECT_EQ(sigma, medianPairwiseDistance(pool, {}, {.cellGrid = false}).value);  // exact median either way
  const DiscrepancySums d = direct(a, b, {PairKernel::Gaussian, 1.0 / (2 * sigma * sigma)});
  const double mmd2 = d.aaDiagonal + d.aaOffDiagonal + d.bbDiagonal + d.bbOffDiagonal - 2 * d.ab;
  EXPECT_LE(std::abs(r.details["mmd2"].get<double>() - mmd2), r.details["mmd2_error_bound"].get<double>());
  EXPECT_LE(std::abs(r.value - std::sqrt(mmd2)), r.details["value_accuracy"].get<double>());
  EXPECT_LT(r.details["value_accuracy"].get<double>(), 1e-4);  // value ~0.56
}

// [D] energy is homogeneous of degree 1/2: at coordinates scaled by 2^-300 (evaluated at unit
// scale, measures/unit_scale.h) the value and its accuracy scale by 2^-150, the energy and its
// bound by 2^-300.
TEST(KernelFastMeasuresTest, EnergyAccuracyScalesWithTheCoordinateUnit) {
  const Cloud a = square("A", 24000, 1, 0, 0), b = square("B", 24000, 2, 0.5, 0.2);
  const double unit = std::ldexp(1.0, -300);
  const Cloud as("A", a.points * unit), bs("B", b.points * unit);
  const Result r = run("energy", a, b), rs = run("energy", as, bs);
  ASSERT_EQ(rs.status, Status::Ok) << rs.message;
  ASSERT_TRUE(rs.details.contains("value_accuracy"));
  EXPECT_DOUBLE_EQ(rs.details["value_accuracy"].get<double>(),
                   r.details["value_accuracy"].get<double>() * std::ldexp(1.0, -150));
  EXPECT_DOUBLE_EQ(rs.details["energy_error_bound"].get<double>(),
                   r.details["energy_error_bound"].get<double>() * unit);
  EXPECT_DOUBLE_EQ(rs.value, r.value * std::ldexp(1.0, -150));
}

// [D] sqrt(max(v, 0)) moves by at most sqrt(bound) when v moves by bound, and by about
// bound / (2 sqrt(v)) away from 0.
TEST(KernelFastMeasuresTest, SqrtAccuracyPropagatesHonestly) {
  EXPECT_DOUBLE_EQ(sqrtAccuracy(0.0, 1e-6), 1e-3);
  EXPECT_DOUBLE_EQ(sqrtAccuracy(-1e-7, 1e-6), std::sqrt(9e-7));
  EXPECT_NEAR(sqrtAccuracy(0.25, 1e-6), 1e-6, 1e-9);  // 1e-6 / (2 * 0.5)
  EXPECT_GE(sqrtAccuracy(0.25, 1e-6), 0.5 - std::sqrt(0.25 - 1e-6));
}

// At 10^4 + 10^4 (below the threshold) the sums stay direct: today's accuracy, no accuracy key.
TEST(KernelFastMeasuresTest, SmallCloudsKeepDirectSums) {
  const Cloud a = square("A", 3000, 5, 0, 0), b = square("B", 3000, 6, 0.5, 0.2);
  for (const char* id : {"mmd", "energy"}) {
    const Result r = run(id, a, b);
    ASSERT_EQ(r.status, Status::Ok) << r.message;
    EXPECT_FALSE(r.details.contains("value_accuracy")) << id;
    EXPECT_NE(r.details["kernel_sums"].get<std::string>().find("direct"), std::string::npos) << id;
  }
}

}  // namespace
}  // namespace barrow
