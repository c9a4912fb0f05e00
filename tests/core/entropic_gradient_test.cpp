// Analytic gradients with respect to A's points (Measure::gradientA) of the entropic, Sinkhorn
// and sliced measures, each against central finite differences of its own value [D].
// Theory: envelope theorem on the dual for OT_ε (∂/∂x_i = Σ_j P_ij ∇_x c(x_i, y_j)); for S_ε
// the self term adds −Σ_k P^aa_ik ∇_1 c(x_i, x_k) (Feydy et al. 2019, AISTATS); for sliced W the
// 1-D monotone couplings, unique for points in general position.
#include <gtest/gtest.h>

#include <ostream>
#include <random>

#include "measures/entropic_measure.h"
#include "measures/evaluate.h"
#include "measures/sinkhorn_measure.h"
#include "measures/sliced_measure.h"

namespace barrow {
namespace {

struct GradientCase {
  const char* name;
  std::shared_ptr<Measure> measure;
  std::vector<std::pair<std::string, std::string>> settings;
  double tolerance;  // on |analytic − central difference|
};

void PrintTo(const GradientCase& c, std::ostream* os) { *os << c.name; }

Cloud cloud(int n, unsigned seed, double shiftX) {
  std::mt19937 rng(seed);
  std::normal_distribution<double> g(0.0, 0.5);
  std::uniform_real_distribution<double> w(0.2, 1.0);
  Eigen::MatrixX2d p(n, 2);
  Eigen::VectorXd wt(n);
  for (int i = 0; i < n; ++i) {
    p.row(i) << shiftX + g(rng), g(rng);
    wt(i) = w(rng);
  }
  return Cloud("c", p, wt);
}

class MeasureGradientTest : public ::testing::TestWithParam<GradientCase> {};

TEST_P(MeasureGradientTest, MatchesCentralFiniteDifferences) {
  const GradientCase& c = GetParam();
  const Cloud a = cloud(8, 5, 0.0), b = cloud(6, 6, 0.4);
  EvalRequest req;
  for (const auto& [k, v] : c.settings) req.params.set(k, v);
  EvalRequest withPlan = req;
  withPlan.wantPlan = true;
  const Result r = evaluateMeasure(*c.measure, a, b, withPlan);
  ASSERT_EQ(r.status, Status::Ok) << r.message;
  EvalContext ctx;
  ctx.params = resolveParams(*c.measure, req.params, nullptr);
  const auto grad = c.measure->gradientA(a, b, ctx, r);
  ASSERT_TRUE(grad.has_value());
  const double h = 1e-5;  // truncation ~h², rounding ~1e-16/h: both well under the tolerance
  for (int i = 0; i < a.size(); ++i)
    for (int k = 0; k < 2; ++k) {
      Cloud up = a, down = a;
      up.points(i, k) += h;
      down.points(i, k) -= h;
      const double fd =
          (evaluateMeasure(*c.measure, up, b, req).value - evaluateMeasure(*c.measure, down, b, req).value) / (2 * h);
      EXPECT_NEAR((*grad)(i, k), fd, c.tolerance) << "point " << i << " coordinate " << k;
    }
}

std::vector<GradientCase> cases() {
  auto entropic = std::make_shared<EntropicMeasure>();
  auto sinkhorn = std::make_shared<SinkhornMeasure>();
  auto sliced = std::make_shared<SlicedMeasure>();
  return {
      {"EntropicSquared", entropic, {{"entropic.epsilon", "0.05"}, {"entropic.p", "2"}, {"entropic.tolerance", "1e-14"}}, 1e-8},
      {"EntropicDistance", entropic, {{"entropic.epsilon", "0.05"}, {"entropic.p", "1"}, {"entropic.tolerance", "1e-14"}}, 1e-8},
      {"SinkhornSquared", sinkhorn, {{"sinkhorn.epsilon", "0.05"}, {"sinkhorn.p", "2"}, {"sinkhorn.tolerance", "1e-14"}}, 1e-8},
      {"SinkhornDistance", sinkhorn, {{"sinkhorn.epsilon", "0.05"}, {"sinkhorn.p", "1"}, {"sinkhorn.tolerance", "1e-14"}}, 1e-8},
      {"SlicedTwo", sliced, {{"sliced.directions", "7"}, {"sliced.p", "2"}}, 1e-7},
      {"SlicedOne", sliced, {{"sliced.directions", "7"}, {"sliced.p", "1"}}, 1e-7},
  };
}

INSTANTIATE_TEST_SUITE_P(Measures, MeasureGradientTest, ::testing::ValuesIn(cases()),
                         [](const ::testing::TestParamInfo<GradientCase>& info) { return info.param.name; });

}  // namespace
}  // namespace barrow
