// Energy distance between the weighted empirical measures (V-statistics, diagonal included):
//   E = 2 sum_{i,j} a_i b_j |x_i - y_j| - sum_{i,k} a_i a_k |x_i - x_k| - sum_{j,l} b_j b_l |y_j - y_l|
//   value = sqrt(max(E, 0))   (E in length, the value in length^0.5; E >= 0 in exact arithmetic)
// Székely & Rizzo 2013, JSPI 143:1249-1272 (mem). In 1-D the value equals
// scipy.stats.energy_distance (which returns sqrt(E)). E = 2 MMD^2 for the distance-induced
// kernel (Sejdinovic, Sriperumbudur, Gretton, Fukumizu 2013, Ann. Stat. 41:2263-2291).
// Points of zero weight are left out. Cost: exact O((n + m)^2) pair sums (kernel/pair_sum.h).
#pragma once

#include "measures/measure.h"
#include "measures/units.h"

namespace barrow {

class EnergyMeasure : public Measure {
 public:
  std::string id() const override { return "energy"; }
  std::string displayName() const override { return "Energy distance"; }
  std::string formula() const override {
    return "sqrt(2 E|X-Y| - E|X-X'| - E|Y-Y'|), expectations over the weighted clouds (V-statistics)";
  }
  std::string unit(const ParamSet&) const override { return lengthPower(0.5); }
  std::string unitRule() const override {
    return "length^0.5 (the square root of a length): E is a combination of mean distances, in length, "
           "and the value is sqrt(E); doubling every coordinate multiplies it by sqrt(2)";
  }
  bool cheap() const override { return false; }
  Result evaluate(const Cloud& a, const Cloud& b, const EvalContext& ctx) const override;
  /// Closed form: dE/dx_i = 2 a_i [ sum_j b_j u(x_i - y_j) - sum_k a_k u(x_i - x_k) ],
  /// u(v) = v/|v| and u(0) = 0 (coincident points: the minimal-norm subgradient);
  /// d value / d x_i = dE/dx_i / (2 value). nullopt when the value is 0.
  std::optional<Eigen::MatrixX2d> gradientA(const Cloud& a, const Cloud& b, const EvalContext& ctx,
                                            const Result& r) const override;
};

}  // namespace barrow
