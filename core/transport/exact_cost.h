// Ground cost of the exact transport problem, c(x, y) = ‖x − y‖^p (Euclidean norm, p >= 1),
// always computed from coordinates: the solver never stores an n × m cost matrix.
#pragma once

#include <cmath>
#include <string>

namespace barrow {

enum class CostKind { Distance, Squared, Power };  // p = 1, p = 2, any other p >= 1

class GroundCost {
 public:
  /// Pre: p >= 1 and finite (the solver checks this before building one).
  explicit GroundCost(double p)
      : p_(p), kind_(p == 1.0 ? CostKind::Distance : p == 2.0 ? CostKind::Squared : CostKind::Power) {}

  double p() const { return p_; }
  CostKind kind() const { return kind_; }

  /// c for a squared distance d2 = ‖x − y‖².
  double fromSquared(double d2) const {
    switch (kind_) {
      case CostKind::Distance: return std::sqrt(d2);
      case CostKind::Squared: return d2;
      case CostKind::Power: break;
    }
    return std::pow(d2, 0.5 * p_);
  }
  double operator()(double x0, double y0, double x1, double y1) const {
    const double dx = x0 - x1, dy = y0 - y1;
    return fromSquared(dx * dx + dy * dy);
  }
  /// (cost)^(1/p): the Wasserstein distance from the optimal cost.
  double root(double cost) const {
    if (!(cost > 0)) return 0.0;
    switch (kind_) {
      case CostKind::Distance: return cost;
      case CostKind::Squared: return std::sqrt(cost);
      case CostKind::Power: break;
    }
    return std::pow(cost, 1.0 / p_);
  }
  /// How details and CSV files name the cost: "|x-y|", "|x-y|^2", "|x-y|^3.5".
  std::string label() const;

 private:
  double p_;
  CostKind kind_;
};

}  // namespace barrow
