// Parameter families θ ↦ A_θ: the ways a sweep moves cloud A while B stays fixed.
//
//   shift        x_i + θ·u, u the unit direction; θ is the distance moved (cloud units)
//   rotate       c + R(θ)(x_i − c) about a pivot c (default: A's weighted centroid); θ in degrees
//   scale        c + θ·(x_i − c) about c (default: A's weighted centroid); θ is the factor
//   interpolate  displacement interpolation towards B along the exact W2 plan: every plan
//                entry (i, j, m) becomes the point (1−t)x_i + t·y_j of mass m; θ = t ∈ [0, 1]
//                (McCann 1997; Villani 2003 §5.1, Santambrogio 2015 §5.4 (mem)). A_θ has one
//                point per plan entry.
//   mix          the mass mixture (1−θ)A + θB: the union of both point sets, A's weights
//                scaled by (1−θ) and B's by θ; θ ∈ [0, 1]. Points do not move (no velocity).
#pragma once

#include <Eigen/Core>
#include <optional>
#include <string>
#include <vector>

#include "base/plan_entry.h"
#include "cloud/cloud.h"
#include "families/family_spec.h"

namespace barrow {

class FamilyMap {
 public:
  /// Prepares the family of `s` (only family, direction and center are read). For
  /// `interpolate` this solves the exact W2 problem between a and b once.
  FamilyMap(const Cloud& a, const Cloud& b, const FamilySettings& s);

  /// Why the family cannot be used (bad clouds, zero direction, the W2 plan
  /// failed or w2 is not available); nullopt when it is ready.
  std::optional<std::string> error() const { return error_; }

  /// A_θ. When error() is set this is A unchanged.
  Cloud at(double theta) const;
  /// d x_i(θ)/dθ for every point of A_θ, in the same order (n × 2, cloud units per unit of
  /// θ). Empty for `mix`, whose points do not move, and when error() is set.
  Eigen::MatrixX2d velocity(double theta) const;

  Family family() const { return family_; }
  /// The pivot of rotate/scale (A's weighted centroid unless the settings name one).
  Eigen::Vector2d center() const { return center_; }
  /// The W2 plan behind `interpolate` (empty for the other families).
  const std::vector<PlanEntry>& plan() const { return plan_; }

 private:
  Family family_ = Family::Shift;
  Cloud a_;
  Cloud b_;
  Eigen::Vector2d direction_{1.0, 0.0};  // unit
  Eigen::Vector2d center_{0.0, 0.0};
  std::vector<PlanEntry> plan_;
  Eigen::MatrixX2d from_, to_;  // interpolate: endpoints x_i and y_j of each plan entry
  Eigen::VectorXd mass_;        // interpolate: mass of each plan entry
  std::optional<std::string> error_;
};

}  // namespace barrow
