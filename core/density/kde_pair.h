// ln f_A and ln f_B, the two KDEs with one common bandwidth, on one grid — accurate in relative
// terms wherever either density matters, including where the other one is astronomically
// small (separated clouds): there the KL integrand needs ln f, not an underflowed 0.
#pragma once

#include <Eigen/Core>
#include <vector>

#include "cloud/cloud.h"
#include "density/kde_grid.h"
#include "measures/run_control.h"

namespace barrow {

struct KdePairGrid {
  KdeGrid grid;
  Eigen::Vector2d s = Eigen::Vector2d::Ones();
  /// Per node (row-major, iy·x.count + ix). A node is included when either cut sum is above
  /// e^{-25} of a unit kernel's peak; there the cut sum is exact to e^{-25} relative (the cut
  /// leaves out at most e^{-50}). Where one density's cut sum is below that, its ln is
  /// recomputed by a full log-sum-exp. Excluded nodes hold -inf in both and count as "outside".
  std::vector<double> logA, logB;
  std::vector<unsigned char> included;
  long long exactNodes = 0;  // (node, density) pairs recomputed by log-sum-exp
  bool cancelled = false;
};

/// Pre: clouds validated, s > 0.
KdePairGrid evaluateKdePair(const Cloud& a, const Cloud& b, const Eigen::Vector2d& s,
                            const KdeGridOptions& opt, const RunControl* ctl);

}  // namespace barrow
