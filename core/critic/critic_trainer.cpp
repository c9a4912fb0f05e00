#include "critic/critic_trainer.h"

#include <cmath>

#include "critic/allocation_hint.h"
#include "critic/input_frame.h"
#include "critic/mlp_gradients.h"
#include "critic/random_stream.h"
#include "critic/weighted_sampler.h"

namespace barrow::critic {

bool TrainerState::fits(const CriticSettings& s) const {
  if (method != s.method || shape.width != s.shape.width || shape.hidden != s.shape.hidden ||
      shape.activation != s.shape.activation)
    return false;
  if (raw.layers() != s.shape.hidden + 1) return false;
  return method != Method::Sn || spectral.fits(raw);
}

double fullEstimate(const MlpParams& net, Activation act, const Cloud& a, const Cloud& b) {
  const Eigen::RowVectorXd fa = evaluate(net, act, a.points.transpose());
  const Eigen::RowVectorXd fb = evaluate(net, act, b.points.transpose());
  return fa.dot(a.normalizedWeights()) - fb.dot(b.normalizedWeights());
}

double lipschitzUpper(const MlpParams& net) {
  double l = 1.0;
  for (const auto& w : net.w) l *= spectralNorm(w);
  return l;
}

namespace {

bool finite(const MlpParams& p) {
  for (int l = 0; l < p.layers(); ++l)
    if (!p.w[l].allFinite() || !p.b[l].allFinite()) return false;
  return true;
}

void clipAll(MlpParams& p, double c) {
  for (int l = 0; l < p.layers(); ++l) {
    p.w[l] = p.w[l].cwiseMax(-c).cwiseMin(c);
    p.b[l] = p.b[l].cwiseMax(-c).cwiseMin(c);
  }
}

// Distinct streams for initialisation, power iteration and minibatches from one seed.
constexpr std::uint64_t kInitStream = 0x9e3779b97f4a7c15ull;
constexpr std::uint64_t kSpectralStream = 0xbf58476d1ce4e5b9ull;
constexpr std::uint64_t kBatchStream = 0x94d049bb133111ebull;

// net and the clouds in frame coordinates; the estimate is reported in the user's units.
CurvePoint checkpoint(int step, const MlpParams& net, const CriticSettings& s, const Cloud& a, const Cloud& b,
                      double scale) {
  CurvePoint c;
  c.step = step;
  c.estimate = scale * fullEstimate(net, s.shape.activation, a, b);
  c.lipschitzUpper = lipschitzUpper(net);
  c.lowerBound = c.lipschitzUpper > 0 ? c.estimate / c.lipschitzUpper : 0.0;
  return c;
}

}  // namespace

TrainOutcome trainCritic(const Cloud& userA, const Cloud& userB, const CriticSettings& s, const RunControl* control,
                         const TrainerState* warm, const std::function<void(const CurvePoint&)>& onCurve) {
  keepHeapWarm();
  // Training sees the clouds in frame coordinates (input_frame.h); the state keeps g's weights.
  const InputFrame frame = InputFrame::of(userA, userB);
  const Cloud a = frame.toUnit(userA), b = frame.toUnit(userB);
  TrainOutcome out;
  TrainerState& st = out.state;
  if (warm && warm->fits(s)) {
    st = *warm;
  } else {
    st.method = s.method;
    st.shape = s.shape;
    st.raw = initParams(s.shape, s.seed ^ kInitStream);
    if (s.method == Method::Sn) st.spectral = initSpectral(st.raw, s.seed ^ kSpectralStream);
  }
  const Activation act = s.shape.activation;
  const int m = s.batch;
  RandomStream rng(s.seed ^ kBatchStream);
  const WeightedSampler drawA(a.weights), drawB(b.weights);

  auto network = [&]() {
    return s.method == Method::Sn ? spectralNormalize(st.raw, st.spectral, s.powerIterations) : st.raw;
  };
  // The weights f has between steps: for sn, one more power iteration on a copy of ũ, so
  // looking does not change the training run.
  auto current = [&]() {
    if (s.method != Method::Sn) return st.raw;
    SpectralState copy = st.spectral;
    return spectralNormalize(st.raw, copy, s.powerIterations);
  };
  const int every = std::max(1, s.steps / std::max(1, s.curvePoints));
  auto record = [&](int step, const MlpParams& net) {
    out.curve.push_back(checkpoint(step, net, s, a, b, frame.scale));
    if (onCurve) onCurve(out.curve.back());
  };
  if (s.method == Method::Clip && !(warm && warm->fits(s))) clipAll(st.raw, s.clip);
  record(0, current());

  Eigen::MatrixXd xy(2, 2 * m), interp(2, m);
  Eigen::RowVectorXd coef(2 * m);
  coef.head(m).setConstant(-1.0 / m);  // minimise −(mean f(A) − mean f(B))
  coef.tail(m).setConstant(1.0 / m);
  for (int step = 0; step < s.steps; ++step) {
    if (control && control->shouldStop(step % 8 == 0 ? double(step) / s.steps : -1.0)) {
      out.cancelled = true;
      break;
    }
    for (int k = 0; k < m; ++k) {
      xy.col(k) = a.points.row(drawA.draw(rng)).transpose();
      xy.col(m + k) = b.points.row(drawB.draw(rng)).transpose();
    }
    const MlpParams net = network();
    const ForwardCache cache = forward(net, act, xy);
    MlpParams grad = linearGradient(net, act, cache, coef);
    if (s.method == Method::Gp) {
      for (int k = 0; k < m; ++k) {
        const double e = rng.uniform();
        interp.col(k) = e * xy.col(k) + (1.0 - e) * xy.col(m + k);
      }
      penaltyGradient(net, act, forward(net, act, interp), s.lambda, 1.0 / m, &grad);
    }
    if (s.method == Method::Sn) grad = spectralBackward(net, st.spectral, grad);
    optimizerStep(s.optimizer, st.optimizer, st.raw, grad);
    if (s.method == Method::Clip) clipAll(st.raw, s.clip);
    ++st.stepsDone;
    out.steps = step + 1;
    if (out.steps % every == 0 || out.steps == s.steps) {
      if (!finite(st.raw)) {
        out.diverged = true;
        break;
      }
      record(out.steps, current());
    }
  }
  out.frame = frame;
  out.unitNetwork = current();
  out.network = frame.fold(out.unitNetwork);
  if (control && !out.cancelled) control->shouldStop(1.0);
  return out;
}

}  // namespace barrow::critic
