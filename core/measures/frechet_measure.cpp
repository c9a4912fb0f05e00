#include "measures/frechet_measure.h"

#include <cmath>

#include "kernel/gaussian_fit.h"
#include "measures/measure_outcome.h"
#include "measures/unit_scale.h"

namespace barrow {

namespace {

nlohmann::json momentsJson(const GaussianFit& g) {
  return {{"mean", {g.mean.x(), g.mean.y()}},
          {"cov", {g.cov(0, 0), g.cov(0, 1), g.cov(1, 1)}},
          {"rank", g.rank}};
}

std::string singularWarning(const GaussianFit& g, const char* name) {
  if (g.rank == 2) return "";
  return std::string("covariance of ") + name + " is singular (" +
         (g.rank == 0 ? "a single point" : "collinear points") + "): its fitted Gaussian is degenerate";
}

}  // namespace

Result FrechetMeasure::evaluate(const Cloud& a, const Cloud& b, const EvalContext& ctx) const {
  // All coordinates tiny or huge: evaluate at unit scale (measures/unit_scale.h); the value
  // is homogeneous of degree 1, fd2 of degree 2 (the fitted moments stay in that unit).
  if (auto r = evaluateAtUnitScale(*this, a, b, ctx, {{"fd2", 2}}))
    return *r;
  const GaussianFit ga = fitGaussian(supportOf(a)), gb = fitGaussian(supportOf(b));
  const double fd2 = gaussianW2Squared(ga, gb);
  Result r = Result::ok(std::sqrt(std::max(fd2, 0.0)));
  r.details["fd2"] = fd2;
  r.details["moments"] = "weighted mean and covariance, normalised weights, ddof = 0";
  r.details["a"] = momentsJson(ga);
  r.details["b"] = momentsJson(gb);
  std::string warning = singularWarning(ga, "A");
  if (const auto wb = singularWarning(gb, "B"); !wb.empty()) warning += (warning.empty() ? "" : "; ") + wb;
  if (!warning.empty()) {
    r.message = warning;
    r.details["warning"] = warning;
  }
  return finiteOrInvalid(std::move(r), id());
}

std::optional<Eigen::MatrixX2d> FrechetMeasure::gradientA(const Cloud& a, const Cloud& b, const EvalContext&,
                                                          const Result& r) const {
  if (r.status != Status::Ok || !(r.value > 0)) return std::nullopt;
  const SupportPoints sa = supportOf(a);
  const GaussianFit ga = fitGaussian(sa), gb = fitGaussian(supportOf(b));
  if (ga.rank < 2 || gb.rank < 2) return std::nullopt;  // T undefined: leave it to finite differences
  const Eigen::Matrix2d dCov = gaussianW2CovGradient(ga, gb);
  Eigen::MatrixX2d g(sa.size(), 2);
  for (Eigen::Index i = 0; i < sa.size(); ++i) {
    const Eigen::Vector2d xi = sa.points.row(i).transpose();
    g.row(i) = (2.0 * sa.weights(i) * ((ga.mean - gb.mean) + dCov * (xi - ga.mean))).transpose();
  }
  return toCloudRows(sa, a.size(), g / (2.0 * r.value));
}

}  // namespace barrow
