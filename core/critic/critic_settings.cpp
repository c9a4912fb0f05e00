#include "critic/critic_settings.h"

#include "base/number_text.h"

namespace barrow::critic {

const char* methodName(Method m) {
  switch (m) {
    case Method::Clip: return "clip";
    case Method::Gp: return "gp";
    case Method::Sn: return "sn";
  }
  return "gp";
}

bool parseMethod(const std::string& word, Method* out) {
  for (Method m : {Method::Clip, Method::Gp, Method::Sn})
    if (word == methodName(m)) {
      *out = m;
      return true;
    }
  return false;
}

CriticSettings defaultSettings(Method m) {
  CriticSettings s;
  s.method = m;
  s.batch = 64;
  switch (m) {
    case Method::Clip:
      s.optimizer.adam = false;
      s.optimizer.rate = 5e-5;
      s.optimizer.decay = 0.99;
      break;
    case Method::Gp:
      s.optimizer.adam = true;
      s.optimizer.rate = 1e-4;
      s.optimizer.beta1 = 0.0;
      s.optimizer.beta2 = 0.9;
      break;
    case Method::Sn:
      s.optimizer.adam = true;
      s.optimizer.rate = 1e-4;
      s.optimizer.beta1 = 0.5;
      s.optimizer.beta2 = 0.9;
      break;
  }
  return s;
}

std::vector<ParamSpec> criticParamSpecs() {
  auto real = [](std::string key, std::string def, double lo, bool loEx, double hi, std::vector<std::string> words,
                 std::string unit, std::string help) {
    ParamSpec p;
    p.key = std::move(key);
    p.kind = ParamKind::Real;
    p.defaultValue = std::move(def);
    p.min = lo;
    p.minExclusive = loEx;
    p.max = hi;
    p.choices = std::move(words);
    p.unit = std::move(unit);
    p.help = std::move(help);
    return p;
  };
  auto integer = [](std::string key, std::string def, double lo, double hi, std::string unit, std::string help) {
    ParamSpec p;
    p.key = std::move(key);
    p.kind = ParamKind::Integer;
    p.defaultValue = std::move(def);
    p.min = lo;
    p.max = hi;
    p.unit = std::move(unit);
    p.help = std::move(help);
    return p;
  };
  ParamSpec act;
  act.key = "critic.activation";
  act.kind = ParamKind::Choice;
  act.defaultValue = "relu";
  act.choices = {"relu", "leaky_relu", "tanh"};
  act.help = "hidden activation (all 1-Lipschitz)";
  return {
      integer("critic.steps", "1000", 1, 1000000, "updates", "critic training steps per evaluation"),
      integer("critic.batch", "64", 1, 65536, "points per cloud", "minibatch drawn from each cloud's weights per step"),
      integer("critic.width", "64", 1, 1024, "units", "units per hidden layer"),
      integer("critic.depth", "2", 1, 8, "layers", "hidden layers"),
      act,
      real("critic.lr", "paper", 0, true, 1, {"paper"}, "", "learning rate; paper: 5e-5 (clip), 1e-4 (gp, sn)"),
      real("critic.clip", "0.01", 0, true, 1e6, {}, "", "clip: weights and biases kept in [-c, c]"),
      real("critic.lambda", "10", 0, false, 1e6, {}, "", "gp: weight of the gradient penalty"),
      integer("critic.power_iterations", "1", 1, 100, "iterations", "sn: power iterations per step"),
      integer("critic.seed", "1", 0, 2147483647, "", "seed of initialisation and minibatches"),
      integer("critic.grid", "64", 2, 1024, "points per side", "grid on which the largest gradient norm is measured"),
  };
}

CriticSettings settingsFromParams(Method m, const ParamSet& params) {
  CriticSettings s = defaultSettings(m);
  auto has = [&](const char* k) { return params.has(k); };
  if (has("critic.steps")) s.steps = params.integer("critic.steps");
  if (has("critic.batch")) s.batch = params.integer("critic.batch");
  if (has("critic.width")) s.shape.width = params.integer("critic.width");
  if (has("critic.depth")) s.shape.hidden = params.integer("critic.depth");
  if (has("critic.activation")) parseActivation(params.text("critic.activation"), &s.shape.activation);
  if (has("critic.lr") && !params.isWord("critic.lr", "paper")) s.optimizer.rate = params.real("critic.lr");
  if (has("critic.clip")) s.clip = params.real("critic.clip");
  if (has("critic.lambda")) s.lambda = params.real("critic.lambda");
  if (has("critic.power_iterations")) s.powerIterations = params.integer("critic.power_iterations");
  if (has("critic.seed")) s.seed = std::uint64_t(params.integer("critic.seed"));
  if (has("critic.grid")) s.grid = params.integer("critic.grid");
  return s;
}

std::string describeSettings(const CriticSettings& s) {
  std::string t = std::string(methodName(s.method)) + ": 2";
  for (int l = 0; l < s.shape.hidden; ++l) t += "-" + std::to_string(s.shape.width);
  t += "-1 " + std::string(activationName(s.shape.activation)) + ", ";
  if (s.optimizer.adam)
    t += "Adam lr " + shortestText(s.optimizer.rate) + " b1 " + shortestText(s.optimizer.beta1) + " b2 " +
         shortestText(s.optimizer.beta2);
  else
    t += "RMSProp lr " + shortestText(s.optimizer.rate) + " decay " + shortestText(s.optimizer.decay);
  if (s.method == Method::Clip) t += ", clip " + shortestText(s.clip);
  if (s.method == Method::Gp) t += ", lambda " + shortestText(s.lambda);
  if (s.method == Method::Sn) t += ", power iterations " + std::to_string(s.powerIterations);
  t += ", batch " + std::to_string(s.batch) + ", steps " + std::to_string(s.steps) + ", seed " +
       std::to_string(s.seed);
  return t;
}

}  // namespace barrow::critic
