#include "transport/kr_potential.h"

#include <cmath>

#include "transport/exact_cost.h"
#include "transport/exact_pricing.h"
#include "transport/exact_site_tree.h"

namespace barrow {
namespace {

bool fits(const Cloud& b, const Eigen::VectorXd& v) { return b.size() > 0 && v.size() == b.size(); }

}  // namespace

double krPotential(const Cloud& b, const Eigen::VectorXd& v, const Eigen::Vector2d& z) {
  if (!fits(b, v)) return NAN;
  return cTransformAt(z.x(), z.y(), b.points.col(0).array(), b.points.col(1).array(), v.array(), GroundCost(1.0));
}

Eigen::MatrixXd krPotentialGrid(const Cloud& b, const Eigen::VectorXd& v, double x0, double y0, double dx,
                                double dy, int nx, int ny) {
  if (!fits(b, v) || nx <= 0 || ny <= 0) return {};
  SiteTree sites(b.points.col(0).array(), b.points.col(1).array(), GroundCost(1.0));
  sites.setPotentials(v.array());
  Eigen::MatrixXd out(ny, nx);
  for (int r = 0; r < ny; ++r)
    for (int c = 0; c < nx; ++c) out(r, c) = sites.minScore(x0 + c * dx, y0 + r * dy);
  return out;
}

}  // namespace barrow
