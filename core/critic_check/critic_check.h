// One critic check: train a critic on (A, B) and measure it against the exact W1.
// Reported (issue 18):
//  - estimate  E_A f − E_B f over the whole weighted clouds;
//  - lipschitzUpper = Π_l ‖W_l‖₂ (exact SVD): f is L-Lipschitz for 1-Lipschitz activations [D];
//  - lipschitzGrid / lipschitzData: the largest ‖∇f‖ on a grid over both clouds (10 % margin)
//    and on the data points — a measured lower estimate of the true constant;
//  - lowerBound = estimate / lipschitzUpper ≤ W1, by Kantorovich–Rubinstein duality
//    (Villani 2009, Thm 5.10 and Particular Case 5.16 (mem)): any L-Lipschitz f has
//    E_A f − E_B f ≤ L·W1;
//  - potentialCorrelation: Pearson correlation of f with the exact potential φ over the
//    points of A and B, each weighted by half its normalised mass [CP].
#pragma once

#include <functional>
#include <string>
#include <vector>

#include "critic/critic_trainer.h"
#include "critic_check/exact_reference.h"

namespace barrow::critic {

struct CriticCheck {
  CriticSettings settings;
  Status status = Status::InvalidInput;
  std::string message;
  double estimate = 0.0;
  double lowerBound = 0.0;
  double w1 = 0.0;
  double lipschitzUpper = 0.0;
  double lipschitzGrid = 0.0;
  double lipschitzData = 0.0;
  double lipschitzMeasured = 0.0;  // max of the grid and data values
  double potentialCorrelation = 0.0;
  int steps = 0;
  double seconds = 0.0;  // training and measuring, not the exact solve
  std::vector<CurvePoint> curve;
  MlpParams network;      // f on the user's coordinates
  MlpParams unitNetwork;  // g on the input frame's coordinates (critic_trainer.h)
  TrainerState state;  // for a warm start
};

/// Trains with `s` (from `warm` when it fits) and fills every figure above. `ref` is
/// exactReference(a, b) (shared between methods). Pre: clouds validated, ref usable.
CriticCheck checkCritic(const Cloud& a, const Cloud& b, const ExactReference& ref, const CriticSettings& s,
                        const RunControl* control, const TrainerState* warm = nullptr,
                        const std::function<void(const CurvePoint&)>& onCurve = {});

/// The grid used for lipschitzGrid (and the window's maps): corners and spacing.
struct GridFrame {
  double x0 = 0, y0 = 0, dx = 1, dy = 1;
  int nx = 0, ny = 0;
  Eigen::MatrixXd points() const;  // 2 × nx·ny, column index = r·nx + c
};
GridFrame gridOver(const Cloud& a, const Cloud& b, int perSide);

/// f and ‖∇f‖ on a grid (ny × nx, row = y index).
Eigen::MatrixXd criticOnGrid(const MlpParams& net, Activation act, const GridFrame& g);
Eigen::MatrixXd gradientNormOnGrid(const MlpParams& net, Activation act, const GridFrame& g);

/// Weighted Pearson correlation (0 when either side is constant).
double weightedCorrelation(const Eigen::VectorXd& x, const Eigen::VectorXd& y, const Eigen::VectorXd& w);

}  // namespace barrow::critic
