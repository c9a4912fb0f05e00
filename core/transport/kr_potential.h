// Kantorovich–Rubinstein potential of W1 from the exact solver's dual potentials v on B
// (Kantorovich & Rubinstein 1958; Villani 2003, "Topics in Optimal Transportation",
// Thm 1.14 (mem)):
//   φ(z) = min_j (‖z − y_j‖ − v_j),
// the c-transform of v for the cost ‖x − y‖. φ is 1-Lipschitz on the whole plane, and for
// optimal potentials Σ_i a_i φ(x_i) − Σ_j b_j φ(y_j) = W1(a, b). The GUI draws φ as a heat
// map: it shows where moving mass is cheap or costly.
// Units: φ in coordinate units. Pre: v holds one potential per point of b (Result::v of the
// w1 measure); otherwise the value is NaN (grid: an empty matrix).
#pragma once

#include <Eigen/Core>

#include "cloud/cloud.h"

namespace barrow {

double krPotential(const Cloud& b, const Eigen::VectorXd& v, const Eigen::Vector2d& z);

/// φ on the grid z = (x0 + c·dx, y0 + r·dy), r < ny (row = y index), c < nx (column =
/// x index). Empty when nx or ny is not positive or v does not fit b.
Eigen::MatrixXd krPotentialGrid(const Cloud& b, const Eigen::VectorXd& v, double x0, double y0, double dx,
                                double dy, int nx, int ny);

}  // namespace barrow
