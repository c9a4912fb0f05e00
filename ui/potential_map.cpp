#include "potential_map.h"

#include "transport/kr_potential.h"

namespace barrow::ui {

std::string computePotentialMap(const Cloud& b, const Result& w1, const GridSpec& grid,
                                Eigen::MatrixXd* out) {
  if (!w1.usable()) return "W1 failed: " + w1.message;
  if (w1.v.size() != b.size()) return "the W1 result carries no potential on B";
  if (grid.nx < 1 || grid.ny < 1) return "empty grid";
  *out = krPotentialGrid(b, w1.v, grid.x0, grid.y0, grid.dx, grid.dy, grid.nx, grid.ny);
  if (out->rows() != grid.ny || out->cols() != grid.nx) return "the potential could not be evaluated on the grid";
  return {};
}

}  // namespace barrow::ui
