// ln f_A and ln f_B, the two KDEs with one common bandwidth, on one grid — accurate in relative
// terms wherever either density matters, including where the other one is astronomically
// small (separated clouds): there the KL integrand needs ln f, not an underflowed 0.
#pragma once

#include <Eigen/Core>
#include <vector>

#include "base/run_control.h"
#include "cloud/cloud.h"
#include "density/kde_grid.h"

namespace barrow {

/// Which logarithms must be exact where their density is negligible. The cut sums are exact to
/// e^{-50} of a kernel's peak in absolute terms; JS, TV and H², and the f·ln f parts of KL, move
/// by no more than about that when a negligible density is that far off. Only KL(A‖B)'s
/// ln f_B where f_A is not negligible needs more (and KL(B‖A)'s ln f_A): far from B, f_B may
/// even underflow, while the true KDE — and so the KL — is finite.
struct ExactLogs {
  bool a = false;
  bool b = false;
};

struct KdePairGrid {
  KdeGrid grid;
  Eigen::Vector2d s = Eigen::Vector2d::Ones();
  /// Per node (row-major, iy·x.count + ix). A node is included when either cut sum is above
  /// e^{-25} of a unit kernel's peak ("not negligible"); there the cut sum is exact to e^{-25}
  /// relative. Elsewhere ln of the cut sum (possibly -inf; exact to e^{-50} of a peak in
  /// absolute terms), except where ExactLogs asks for the uncut value. Integrals skip excluded
  /// nodes and count their mass as "outside".
  std::vector<double> logA, logB;
  std::vector<unsigned char> included;
  long long exactNodes = 0;  // (node, density) pairs evaluated without the cut (UncutLogKde)
  bool cancelled = false;
};

/// Pre: clouds validated, s > 0.
KdePairGrid evaluateKdePair(const Cloud& a, const Cloud& b, const Eigen::Vector2d& s,
                            const KdeGridOptions& opt, ExactLogs exact, const RunControl* ctl);

}  // namespace barrow
