#include "measures/mmd_measure.h"

#include <cmath>

#include "kernel/discrepancy.h"
#include "kernel/median_distance.h"
#include "measures/measure_outcome.h"

namespace barrow {

namespace {

constexpr const char* kSigma = "mmd.sigma";
constexpr const char* kEstimator = "mmd.estimator";

struct Bandwidth {
  double sigma = 0.0;
  nlohmann::json details;
  std::string error;      // non-empty: unusable
  bool complete = true;
};

Eigen::MatrixX2d pooled(const SupportPoints& a, const SupportPoints& b) {
  Eigen::MatrixX2d p(a.size() + b.size(), 2);
  p << a.points, b.points;
  return p;
}

Bandwidth chooseBandwidth(const SupportPoints& a, const SupportPoints& b, const ParamSet& params,
                          const WorkSlice& slice) {
  Bandwidth bw;
  if (!params.isWord(kSigma, "median")) {
    bw.sigma = params.real(kSigma);
    bw.details = {{"sigma", bw.sigma}, {"sigma_rule", "given"}};
  } else {
    const MedianDistance med = medianPairwiseDistance(pooled(a, b), slice);
    bw.complete = med.complete;
    bw.sigma = med.value;
    bw.details = {{"sigma", bw.sigma},
                  {"sigma_rule",
                   "median heuristic: median Euclidean distance over all pairs of the pooled "
                   "positive-weight points of A and B (unweighted, i < j)"},
                  {"median_method", med.method}};
    if (med.complete && !(med.value > 0))
      bw.error = "mmd.sigma = median: the median pairwise distance of the pooled points is 0 (at least "
                 "half of the pairs coincide); set mmd.sigma to a number";
  }
  if (bw.error.empty() && !std::isfinite(bw.sigma))
    bw.error = "mmd.sigma = median: the median pairwise distance is not a finite number (coordinates too large)";
  if (bw.error.empty() && !std::isfinite(1.0 / (2.0 * bw.sigma * bw.sigma)))
    bw.error = "mmd.sigma is too small to form the kernel (1/(2 sigma^2) overflows)";
  return bw;
}

std::string unbiasedNeedsTwo(const SupportPoints& a, const SupportPoints& b) {
  for (const auto* s : {&a, &b})
    if (s->size() < 2)
      return std::string("mmd.estimator = unbiased needs at least two points of positive weight in each cloud (") +
             (s == &a ? "A" : "B") + " has one)";
  return "";
}

}  // namespace

std::string MmdMeasure::formula() const {
  return "sqrt(max(MMD^2, 0)), MMD^2 = E k(X,X') + E k(Y,Y') - 2 E k(X,Y), k = exp(-|x-y|^2/(2 sigma^2)); "
         "biased: V-statistic (all pairs); unbiased: within-cloud sums without i = j, weights "
         "renormalised by 1 - sum w^2";
}

std::vector<ParamSpec> MmdMeasure::params() const {
  const ParamSpec sigma{
      .key = kSigma,
      .kind = ParamKind::Real,
      .defaultValue = "median",
      .min = 0.0,
      .minExclusive = true,
      .choices = {"median"},
      .unit = "coordinate units",
      .help = "Gaussian kernel bandwidth sigma in exp(-|x-y|^2/(2 sigma^2)); 'median' = the median "
            "Euclidean distance over the pooled points of A and B of positive weight, unweighted, each "
            "unordered pair once, no pair of a point with itself (even count: mean of the two middle "
            "values, as numpy.median); fixed once per sweep"};
  const ParamSpec estimator{
      .key = kEstimator,
      .kind = ParamKind::Choice,
      .defaultValue = "biased",
      .choices = {"biased", "unbiased"},
      .help = "biased: V-statistic over all pairs; unbiased: drops the i = j terms within each cloud "
            "and divides by 1 - sum w_i^2 (the U-statistic for equal weights; may be < 0)"};
  return {sigma, estimator};
}

ParamSet MmdMeasure::freeze(const Cloud& a, const Cloud& b, const ParamSet& resolved) const {
  if (!resolved.isWord(kSigma, "median") || a.validate() || b.validate()) return resolved;
  const Bandwidth bw = chooseBandwidth(supportOf(a), supportOf(b), resolved, WorkSlice{});
  if (!bw.error.empty()) return resolved;  // evaluate() will report why
  ParamSet frozen = resolved;
  frozen.setNumber(kSigma, bw.sigma);
  return frozen;
}

Result MmdMeasure::evaluate(const Cloud& a, const Cloud& b, const EvalContext& ctx) const {
  const SupportPoints sa = supportOf(a), sb = supportOf(b);
  const bool unbiased = ctx.params.text(kEstimator) == "unbiased";
  if (unbiased)
    if (auto e = unbiasedNeedsTwo(sa, sb); !e.empty()) return Result::invalid(e);
  const WorkSlice all{ctx.control, 0.0, 1.0};
  const bool median = ctx.params.isWord(kSigma, "median");
  const Bandwidth bw = chooseBandwidth(sa, sb, ctx.params, all.sub(0.0, median ? 0.3 : 0.0));
  if (!bw.complete) return Result::cancelled(id() + ": cancelled");
  if (!bw.error.empty()) return Result::invalid(bw.error);

  const PairKernelSpec kernel{PairKernel::Gaussian, 1.0 / (2.0 * bw.sigma * bw.sigma)};
  const DiscrepancySums s = discrepancySums(sa, sb, kernel, all.sub(median ? 0.3 : 0.0, 1.0));
  if (!s.complete) return Result::cancelled(id() + ": cancelled");
  const double mmd2 = unbiased ? s.aaOffDiagonal / (1.0 - s.sumSquaresA) + s.bbOffDiagonal / (1.0 - s.sumSquaresB) -
                                     2.0 * s.ab
                               : s.aaDiagonal + s.aaOffDiagonal + s.bbDiagonal + s.bbOffDiagonal - 2.0 * s.ab;
  Result r = Result::ok(std::sqrt(std::max(mmd2, 0.0)));
  r.details = bw.details;
  r.details["kernel"] = "exp(-|x-y|^2/(2 sigma^2))";
  r.details["estimator"] = unbiased ? "unbiased (U-statistic, i = j dropped, weights renormalised)"
                                    : "biased (V-statistic, all pairs)";
  r.details["mmd2"] = mmd2;
  r.details["points_used"] = {{"a", sa.size()}, {"b", sb.size()}};
  r.details["kernel_sums"] = s.method;
  if (s.binned) {  // kernel/binned_pair_sum.h: the bound on each sum, through MMD^2 and the sqrt
    const double bound = (unbiased ? s.boundAA / (1.0 - s.sumSquaresA) + s.boundBB / (1.0 - s.sumSquaresB)
                                   : s.boundAA + s.boundBB) +
                         2.0 * s.boundAB;
    r.details["mmd2_error_bound"] = bound;
    r.details["value_accuracy"] = sqrtAccuracy(mmd2, bound);
  }
  if (mmd2 < 0) {
    r.details["clamped"] = true;
    r.message = "MMD^2 estimate is negative (" + std::to_string(mmd2) + "); reported value clamped to 0";
  }
  return finiteOrInvalid(std::move(r), id());
}

std::optional<Eigen::MatrixX2d> MmdMeasure::gradientA(const Cloud& a, const Cloud& b, const EvalContext& ctx,
                                                      const Result& r) const {
  if (r.status != Status::Ok || !r.details.contains("mmd2") || !r.details.contains("sigma")) return std::nullopt;
  const double mmd2 = r.details["mmd2"].get<double>();
  if (mmd2 < 0) return Eigen::MatrixX2d::Zero(a.size(), 2);
  if (!(mmd2 > 0)) return std::nullopt;
  const SupportPoints sa = supportOf(a), sb = supportOf(b);
  const double sigma = r.details["sigma"].get<double>();
  const bool unbiased = ctx.params.text(kEstimator) == "unbiased";
  const double selfScale = unbiased ? 1.0 / (1.0 - sa.weights.squaredNorm()) : 1.0;
  bool complete = true;
  const Eigen::MatrixX2d g2 = discrepancyGradient(sa, sb, {PairKernel::Gaussian, 1.0 / (2.0 * sigma * sigma)},
                                                  selfScale, WorkSlice{ctx.control}, &complete);
  if (!complete) return std::nullopt;
  return toCloudRows(sa, a.size(), g2 / (2.0 * std::sqrt(mmd2)));
}

}  // namespace barrow
