// barrow-cli critic --a A --b B [--method clip|gp|sn|all] [--steps N] [--seed S]
//                   [--set critic.key=value ...] [--json]
// Trains each chosen critic and sets it beside the exact W1 (core/critic/critic_check.h).
#include <unistd.h>

#include <chrono>
#include <cmath>
#include <cstdio>
#include <iostream>
#include <nlohmann/json.hpp>

#include "cli/cli_common.h"
#include "cli/commands.h"
#include "critic_check/critic_check.h"
#include "base/number_text.h"

namespace barrow::cli {

namespace {

std::vector<critic::Method> methodsFrom(const CliArgs& args) {
  const std::string word = args.value("method").value_or("all");
  if (word == "all") return {critic::Method::Clip, critic::Method::Gp, critic::Method::Sn};
  critic::Method m;
  if (!critic::parseMethod(word, &m)) throw InputError{"--method: expected clip, gp, sn or all, got '" + word + "'"};
  return {m};
}

ParamSet criticSets(const CliArgs& args) {
  ParamSet sets = parseSets(args);
  for (const auto& [key, value] : sets.values())
    if (key.rfind("critic.", 0) != 0) throw InputError{"--set: only critic.* parameters apply here, got '" + key + "'"};
  auto number = [&](const char* option, const char* key) {
    if (!args.has(option)) return;
    const std::string text = *args.value(option);
    for (const ParamSpec& p : critic::criticParamSpecs())
      if (p.key == key)
        if (auto e = checkParam(p, text)) throw InputError{"--" + std::string(option) + ": " + *e};
    sets.set(key, text);
  };
  number("steps", "critic.steps");
  number("seed", "critic.seed");
  return sets;
}

nlohmann::json number(double v) { return std::isfinite(v) ? nlohmann::json(v) : nlohmann::json(); }

}  // namespace

int runCritic(const std::vector<std::string>& argv) {
  const CliArgs args("critic", argv, {"a", "b", "method", "steps", "seed"}, {"json"});
  const Cloud a = loadCloud(args.required("a"));
  const Cloud b = loadCloud(args.required("b"));
  if (auto e = a.validate()) throw InputError{args.required("a") + ": " + *e};
  if (auto e = b.validate()) throw InputError{args.required("b") + ": " + *e};
  const auto methods = methodsFrom(args);
  const ParamSet sets = criticSets(args);

  const auto start = std::chrono::steady_clock::now();
  const bool terminal = isatty(STDERR_FILENO);
  std::string label;
  int shown = -1;
  RunControl control;
  control.onProgress = [&](double f) {
    const double elapsed = std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
    const int percent = int(f * 100);
    if (terminal && elapsed > 1.0 && percent / 10 != shown / 10) {
      shown = percent;
      std::fprintf(stderr, "\rcritic %s: %3d%%", label.c_str(), percent);
      std::fflush(stderr);
    }
    return true;
  };

  label = "exact W1";
  const critic::ExactReference ref = critic::exactReference(a, b, &control);
  if (!ref.usable()) throw InternalError{"exact W1 failed: " + ref.message};

  std::vector<critic::CriticCheck> checks;
  for (critic::Method m : methods) {
    label = critic::methodName(m);
    checks.push_back(critic::checkCritic(a, b, ref, critic::settingsFromParams(m, sets), &control));
  }
  if (shown >= 0) std::fprintf(stderr, "\rcritic: done          \n");

  if (args.flag("json")) {
    nlohmann::json out = {{"critics", nlohmann::json::array()}};
    for (const auto& c : checks)
      out["critics"].push_back({{"method", critic::methodName(c.settings.method)},
                                {"estimate", number(c.estimate)},
                                {"lower_bound", number(c.lowerBound)},
                                {"w1", number(c.w1)},
                                {"lipschitz_upper", number(c.lipschitzUpper)},
                                {"lipschitz_measured", number(c.lipschitzMeasured)},
                                {"potential_correlation", number(c.potentialCorrelation)},
                                {"steps", c.steps},
                                {"seconds", c.seconds},
                                {"status", statusName(c.status)}});
    std::cout << out.dump() << "\n";
    return kExitOk;
  }
  std::printf("exact W1 = %s\n", sixDigits(ref.w1).c_str());
  std::printf("%-6s %11s %11s %9s %9s %9s %9s %6s %7s %8s  %s\n", "method", "estimate", "lower_bnd", "gap", "L_upper",
              "L_grid", "L_data", "corr", "steps", "seconds", "status");
  for (const auto& c : checks) {
    std::printf("%-6s %11s %11s %9s %9s %9s %9s %6.3f %7d %8.2f  %s\n", critic::methodName(c.settings.method),
                sixDigits(c.estimate).c_str(), sixDigits(c.lowerBound).c_str(), sixDigits(c.w1 - c.lowerBound).c_str(),
                sixDigits(c.lipschitzUpper).c_str(), sixDigits(c.lipschitzGrid).c_str(),
                sixDigits(c.lipschitzData).c_str(), c.potentialCorrelation, c.steps, c.seconds,
                statusName(c.status));
    if (!c.message.empty()) std::printf("       note: %s\n", c.message.c_str());
    std::printf("       %s\n", critic::describeSettings(c.settings).c_str());
  }
  std::printf("lower_bnd = estimate / L_upper <= W1 (Kantorovich-Rubinstein); gap = W1 - lower_bnd;\n"
              "corr = correlation of f with the exact W1 potential on the data points.\n");
  return kExitOk;
}

}  // namespace barrow::cli
