#include "measures/critic_measure.h"

#include "critic/critic_trainer.h"

namespace barrow {

namespace {

struct CriticWarmState : WarmState {
  critic::CriticSettings settings;
  critic::TrainerState state;
};

// Everything but the step budget and what is only measured must match to continue a run.
bool sameTraining(const critic::CriticSettings& x, const critic::CriticSettings& y) {
  return x.method == y.method && x.shape.width == y.shape.width && x.shape.hidden == y.shape.hidden &&
         x.shape.activation == y.shape.activation && x.batch == y.batch && x.optimizer.adam == y.optimizer.adam &&
         x.optimizer.rate == y.optimizer.rate && x.optimizer.beta1 == y.optimizer.beta1 &&
         x.optimizer.beta2 == y.optimizer.beta2 && x.optimizer.decay == y.optimizer.decay &&
         x.optimizer.epsilon == y.optimizer.epsilon && x.clip == y.clip && x.lambda == y.lambda &&
         x.powerIterations == y.powerIterations && x.seed == y.seed;
}

}  // namespace

std::string CriticMeasure::id() const { return std::string("critic_") + critic::methodName(method_); }

std::string CriticMeasure::displayName() const {
  switch (method_) {
    case critic::Method::Clip: return "Critic, weight clipping";
    case critic::Method::Gp: return "Critic, gradient penalty";
    case critic::Method::Sn: return "Critic, spectral norm";
  }
  return "Critic";
}

std::string CriticMeasure::formula() const {
  return "E_A f - E_B f for a trained MLP critic f kept near 1-Lipschitz; lower_bound = value / L_upper <= W1";
}

Result CriticMeasure::evaluate(const Cloud& a, const Cloud& b, const EvalContext& ctx) const {
  const critic::CriticSettings s = critic::settingsFromParams(method_, ctx.params);
  const critic::TrainerState* warm = nullptr;
  if (ctx.warm && *ctx.warm)
    if (auto* w = dynamic_cast<CriticWarmState*>(ctx.warm->get()); w && sameTraining(w->settings, s) && w->state.fits(s))
      warm = &w->state;
  const bool warmUsed = warm != nullptr;
  critic::TrainOutcome t = critic::trainCritic(a, b, s, ctx.control, warm);
  if (t.cancelled) {
    Result r = Result::invalid("cancelled");
    r.status = Status::Cancelled;
    return r;
  }
  if (t.diverged) {
    Result r = Result::invalid("the critic's weights became non-finite after " + std::to_string(t.steps) + " steps");
    r.status = Status::NotConverged;
    return r;
  }
  const double estimate = critic::fullEstimate(t.network, s.shape.activation, a, b);
  const double upper = critic::lipschitzUpper(t.network);
  Result r = Result::ok(estimate);
  r.iterations = t.steps;
  r.details = {{"settings", critic::describeSettings(s)},
               {"lipschitz_upper", upper},
               {"lower_bound", upper > 0 ? estimate / upper : 0.0},
               {"warm_start", warmUsed}};
  if (ctx.warm) {
    auto next = std::make_shared<CriticWarmState>();
    next->settings = s;
    next->state = std::move(t.state);
    *ctx.warm = std::move(next);
  }
  return r;
}

}  // namespace barrow
