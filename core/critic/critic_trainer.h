// Trains one critic f to maximise E_A f − E_B f on minibatches drawn from the two weighted
// clouds, under one of the three Lipschitz rules (critic_settings.h), in the coordinates of the
// clouds' input frame (input_frame.h). Single-threaded, so a
// seed gives the same run bit for bit on the same build.
#pragma once

#include <functional>
#include <memory>
#include <vector>

#include "cloud/cloud.h"
#include "critic/critic_settings.h"
#include "critic/input_frame.h"
#include "critic/optimizers.h"
#include "critic/spectral_norm.h"
#include "base/run_control.h"

namespace barrow::critic {

/// Everything needed to continue training where a previous run stopped (a warm start).
struct TrainerState {
  Method method = Method::Gp;
  MlpShape shape;
  MlpParams raw;  // trained weights of g in frame coordinates (input_frame.h; before spectral normalisation for sn)
  OptimizerState optimizer;
  SpectralState spectral;
  long long stepsDone = 0;

  /// Same method, layer sizes and activation as `s` asks for.
  bool fits(const CriticSettings& s) const;
};

/// One full-data checkpoint of the training curve.
struct CurvePoint {
  int step = 0;                // updates done in this run
  double estimate = 0.0;       // Σ a_i f(x_i) − Σ b_j f(y_j) over the whole clouds
  double lipschitzUpper = 0.0; // product of the layers' spectral norms
  double lowerBound = 0.0;     // estimate / lipschitzUpper
};

struct TrainOutcome {
  TrainerState state;
  MlpParams network;      // f on the user's coordinates: g folded with the input frame (normalised for sn)
  MlpParams unitNetwork;  // g itself, on frame coordinates (for sn: the layers of spectral norm ≈ 1)
  InputFrame frame;
  std::vector<CurvePoint> curve;
  int steps = 0;      // updates done in this run
  bool cancelled = false;
  bool diverged = false;  // a weight became NaN or infinite
};

/// Trains from `warm` when it fits `s` (carrying weights and optimiser moments), otherwise
/// from a fresh initialisation with s.seed. Minibatches always come from s.seed, so the run is
/// a function of (clouds, settings, warm state). `onCurve` (optional) sees each checkpoint.
/// Pre: both clouds validated.
TrainOutcome trainCritic(const Cloud& a, const Cloud& b, const CriticSettings& s, const RunControl* control,
                         const TrainerState* warm, const std::function<void(const CurvePoint&)>& onCurve = {});

/// Σ a_i f(x_i) − Σ b_j f(y_j) with the normalised weights.
double fullEstimate(const MlpParams& net, Activation act, const Cloud& a, const Cloud& b);

/// Product of the layers' exact spectral norms: a Lipschitz bound for 1-Lipschitz activations.
double lipschitzUpper(const MlpParams& net);

}  // namespace barrow::critic
