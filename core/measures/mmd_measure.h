// Maximum mean discrepancy with a Gaussian kernel between the weighted empirical measures.
//   k(x, y) = exp(-||x - y||^2 / (2 sigma^2))          (sigma in coordinate units)
//   MMD^2_V = sum_{i,k} a_i a_k k(x_i,x_k) + sum_{j,l} b_j b_l k(y_j,y_l) - 2 sum_{i,j} a_i b_j k(x_i,y_j)
//   MMD^2_U = the same with the i = k and j = l terms dropped and each within-cloud sum divided
//             by the off-diagonal weight 1 - sum_i a_i^2 (resp. 1 - sum_j b_j^2); for uniform
//             weights this is the usual U-statistic, 1/(n(n-1)) sum_{i != k}.
// Gretton, Borgwardt, Rasch, Schölkopf, Smola 2012, JMLR 13:723-773: V-statistic eq. (5),
// U-statistic eq. (3) (eq. nos. mem). The value is sqrt(max(MMD^2, 0)) (MMD^2_U can be < 0);
// the raw MMD^2 is in the details. Points of zero weight are left out.
// sigma = "median": the median pairwise Euclidean distance over the pooled positive-weight
// points of A and B (unweighted, each unordered pair once, diagonal excluded), computed exactly
// (kernel/median_distance.h); freeze() replaces it by its number so sweeps keep it fixed.
// Cost: exact O((n + m)^2) pair sums, blocked, vectorised and threaded (kernel/pair_sum.h).
#pragma once

#include "measures/measure.h"
#include "measures/units.h"

namespace barrow {

class MmdMeasure : public Measure {
 public:
  std::string id() const override { return "mmd"; }
  std::string displayName() const override { return "MMD (Gaussian kernel)"; }
  std::string formula() const override;
  std::vector<ParamSpec> params() const override;
  std::string unit(const ParamSet&) const override { return kUnitDimensionless; }
  std::string unitRule() const override {
    return "dimensionless: kernel values exp(-|x-y|^2/(2 sigma^2)) are pure numbers (sigma carries "
           "the length), so is MMD^2 and its square root; both estimators";
  }
  bool cheap() const override { return false; }
  Result evaluate(const Cloud& a, const Cloud& b, const EvalContext& ctx) const override;
  ParamSet freeze(const Cloud& a, const Cloud& b, const ParamSet& resolved) const override;
  /// Closed form: d MMD / d x_i = d MMD^2 / d x_i / (2 MMD), where
  /// d MMD^2 / d x_i = 2 a_i [ c sum_k a_k grad k(x_i,x_k) - sum_j b_j grad k(x_i,y_j) ],
  /// grad k(x, y) = -(x - y) k(x, y) / sigma^2, c = 1 (V) or 1/(1 - sum a^2) (U).
  /// Zero where MMD^2 < 0 (the clamp is flat there); nullopt where MMD^2 = 0 (not differentiable).
  std::optional<Eigen::MatrixX2d> gradientA(const Cloud& a, const Cloud& b, const EvalContext& ctx,
                                            const Result& r) const override;
};

}  // namespace barrow
