// Hausdorff distance: max of the directed distances h(A,B) = max_i min_j |x_i - y_j| and
// h(B,A) (coordinate units). Ignores weights and multiplicity; points of zero weight are left
// out (they are not part of the measure's support). Huttenlocher, Klanderman, Rucklidge 1993,
// IEEE TPAMI 15(9) (mem). Nearest neighbours by k-d tree, queries threaded.
#pragma once

#include "measures/measure.h"
#include "measures/units.h"

namespace barrow {

class HausdorffMeasure : public Measure {
 public:
  std::string id() const override { return "hausdorff"; }
  std::string displayName() const override { return "Hausdorff distance"; }
  std::string formula() const override { return "max(max_i min_j |x_i-y_j|, max_j min_i |x_i-y_j|)"; }
  std::string unit(const ParamSet&) const override { return kUnitLength; }
  std::string unitRule() const override { return "length: a distance between two points"; }
  Result evaluate(const Cloud& a, const Cloud& b, const EvalContext& ctx) const override;
  /// Almost everywhere: only the A point of the attaining pair moves the value, with gradient
  /// (x - y)/|x - y|. nullopt when the value is 0.
  std::optional<Eigen::MatrixX2d> gradientA(const Cloud& a, const Cloud& b, const EvalContext& ctx,
                                            const Result& r) const override;
};

}  // namespace barrow
