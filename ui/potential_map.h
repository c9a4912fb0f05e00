// The W1 Kantorovich potential sampled on a grid, for the Field's heat map.
// φ(z) = min_j (‖z − y_j‖ − v_j) is 1-Lipschitz and Σ a_i φ(x_i) − Σ b_j φ(y_j) = W1
// (Kantorovich & Rubinstein 1958; Villani 2003, Thm 1.14), where v is the dual potential on B
// of the exact W1 solution. The grid evaluation itself is the engine's (kr_potential.h).
#pragma once

#include <Eigen/Core>
#include <string>

#include "cloud/cloud.h"
#include "live_evaluator.h"
#include "measures/result.h"

namespace barrow::ui {

/// Fills `out` (ny rows × nx columns, row = y index) from the w1 result's potential v. Returns why it cannot (empty on
/// success): the engine part is missing, w1 failed, or v does not match B's size.
std::string computePotentialMap(const Cloud& b, const Result& w1, const GridSpec& grid,
                                Eigen::MatrixXd* out);

}  // namespace barrow::ui
