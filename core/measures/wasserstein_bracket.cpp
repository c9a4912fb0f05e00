#include "measures/wasserstein_bracket.h"

#include <algorithm>
#include <chrono>
#include <cmath>

#include "kernel/gaussian_fit.h"
#include "kernel/support_points.h"
#include "spatial/cloud_quantiser.h"

namespace barrow {

namespace {
double since(std::chrono::steady_clock::time_point t0) {
  return std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count();
}
}  // namespace

WassersteinBracket bracketWasserstein(const Cloud& a, const Cloud& b, int p, Eigen::Index representatives,
                                      const RunControl* control, std::shared_ptr<WarmState>* warm) {
  WassersteinBracket out;
  const auto t0 = std::chrono::steady_clock::now();
  const RunControl none;
  const RunControl& c = control ? *control : none;
  const RunControl partA = c.sub(0.0, 0.02), partB = c.sub(0.02, 0.04), solve = c.sub(0.04, 1.0);
  const Quantisation qa = quantiseCloud(a, representatives, &partA);
  const Quantisation qb = qa.cancelled ? Quantisation{} : quantiseCloud(b, representatives, &partB);
  if (qa.cancelled || qb.cancelled) {
    out.cancelled = true;
    return out;
  }
  out.representativesOfA = qa.representatives;
  out.representativesOfB = qb.representatives;
  out.errorA = qa.errorBound(p);
  out.errorB = qb.errorBound(p);
  out.quantiseSeconds = since(t0);

  const auto t1 = std::chrono::steady_clock::now();
  ExactOtOptions o;
  o.p = p;
  out.quantised = solveExactOt(out.representativesOfA, out.representativesOfB, o, &solve, warm);
  out.solveSeconds = since(t1);
  if (out.quantised.status == ExactOtStatus::Cancelled) out.cancelled = true;
  if (out.quantised.status != ExactOtStatus::Optimal) return out;

  const double w = out.quantised.value;
  out.triangleLow = std::max(0.0, w - out.errorA - out.errorB);
  out.meanLow = (a.mean() - b.mean()).norm();
  if (p == 2) {
    // Less 1e-6 of the larger spread: gaussian_fit.h drops near-zero eigenvalues, which may
    // raise the Gaussian distance by up to ~1e-7 of the larger standard deviation.
    const GaussianFit ga = fitGaussian(supportOf(a)), gb = fitGaussian(supportOf(b));
    const double spread = std::sqrt(std::max(ga.cov.trace(), gb.cov.trace()));
    out.gaussianLow = std::max(0.0, std::sqrt(std::max(0.0, gaussianW2Squared(ga, gb))) - 1e-6 * spread);
  }
  const double low = std::max({out.triangleLow, out.meanLow, out.gaussianLow});
  out.lowRule = low == out.triangleLow ? "triangle" : low == out.meanLow ? "means" : "gaussian";
  const double high = p == 1 ? w + out.errorA + out.errorB
                             : std::sqrt(w * w + out.errorA * out.errorA + out.errorB * out.errorB);
  out.low = std::max(0.0, low * (1.0 - kBracketRounding));
  out.high = high * (1.0 + kBracketRounding);
  return out;
}

}  // namespace barrow
