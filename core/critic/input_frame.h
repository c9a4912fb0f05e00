// The coordinates the critic trains in: z = (x − c)/s, with c the midpoint of the two clouds'
// weighted centroids and s their pooled root-mean-square distance from c. The network g is
// trained on z, and the critic reported in the user's coordinates is f(x) = s·g((x − c)/s).
// Why: a network with fixed initialisation and step sizes trains well only on inputs of
// order one; with the frame, moving or rescaling both clouds moves or rescales the critic
// exactly (translation invariance, and the value scales like a length), as W1 does.
// ∇f(x) = ∇g(z), so f and g have the same Lipschitz constant and the same layer-norm bound.
#pragma once

#include <Eigen/Core>

#include "cloud/cloud.h"
#include "critic/mlp.h"

namespace barrow::critic {

struct InputFrame {
  Eigen::Vector2d centre = Eigen::Vector2d::Zero();
  double scale = 1.0;  // > 0

  /// The frame of two validated clouds (scale 1 when every point coincides with c).
  static InputFrame of(const Cloud& a, const Cloud& b);
  /// The cloud in frame coordinates (same weights).
  Cloud toUnit(const Cloud& c) const;
  /// The network f(x) = s·g((x − c)/s) as a plain MLP on x: the first layer takes 1/s and the
  /// shift, the last layer takes the factor s; the product of spectral norms is unchanged.
  MlpParams fold(const MlpParams& g) const;
};

}  // namespace barrow::critic
