// Chamfer distance between weighted clouds (normalised weights a, b):
//   C = sum_i a_i min_j |x_i - y_j| + sum_j b_j min_i |x_i - y_j|      (coordinate units)
// chamfer.squared = true uses squared distances (squared coordinate units). Of the many
// variants in use (REFERENCES.md 11b) this is "weighted mean, unsquared, both directions
// added"; with equal weights it is the mean nearest-neighbour distance A->B plus B->A.
// [CP]; Barrow, Tenenbaum, Bolles, Wolf 1977 (chamfer matching); Fan, Su, Guibas 2017 (mem).
// Points of zero weight are left out on both sides: they are neither queried nor matched.
// Nearest neighbours by k-d tree (spatial/kd_tree.h), queries threaded (spatial/nn_batch.h).
#pragma once

#include "measures/measure.h"
#include "measures/units.h"

namespace barrow {

class ChamferMeasure : public Measure {
 public:
  std::string id() const override { return "chamfer"; }
  std::string displayName() const override { return "Chamfer distance"; }
  std::string formula() const override {
    return "sum_i a_i min_j |x_i-y_j| + sum_j b_j min_i |x_i-y_j| (squared distances if chamfer.squared)";
  }
  std::vector<ParamSpec> params() const override;
  /// "length", or "length^2" with chamfer.squared = true.
  std::string unit(const ParamSet& resolved) const override;
  std::string unitRule() const override {
    return "length: a weighted mean of distances (length^2 with chamfer.squared = true: of squared distances)";
  }
  Result evaluate(const Cloud& a, const Cloud& b, const EvalContext& ctx) const override;
  /// Almost everywhere (nearest neighbours unique and, unsquared, at positive distance), through
  /// the nearest-neighbour assignment: x_i gets a_i g(x_i - y_nn(i)) plus b_j g(x_i - y_j) for
  /// every y_j whose nearest A point is x_i; g(v) = v/|v| (0 at v = 0) or 2v when squared.
  std::optional<Eigen::MatrixX2d> gradientA(const Cloud& a, const Cloud& b, const EvalContext& ctx,
                                            const Result& r) const override;
};

}  // namespace barrow
