// What a critic is compared with: the exact W1 (network simplex of the w1 measure) and its
// Kantorovich–Rubinstein potential φ (transport/kr_potential.h) at the data points.
#pragma once

#include <Eigen/Core>
#include <string>

#include "cloud/cloud.h"
#include "base/run_control.h"
#include "base/status.h"

namespace barrow::critic {

struct ExactReference {
  Status status = Status::InvalidInput;
  std::string message;
  double w1 = 0.0;
  Eigen::VectorXd v;        // w1's dual potentials on B (what φ is built from)
  Eigen::VectorXd phiA;     // φ(x_i)
  Eigen::VectorXd phiB;     // φ(y_j)
  bool usable() const { return status == Status::Ok; }
};

/// Solves W1 exactly. Pre: both clouds validated.
ExactReference exactReference(const Cloud& a, const Cloud& b, const RunControl* control);

}  // namespace barrow::critic
