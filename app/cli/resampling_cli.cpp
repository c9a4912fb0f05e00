#include "cli/resampling_cli.h"

#include <unistd.h>

#include <cmath>
#include <cstdio>

#include "cli/cli_common.h"
#include "uncertainty/uncertainty_limits.h"

namespace barrow::cli {

std::uint64_t seedOption(const CliArgs& args) {
  const auto v = args.value("seed");
  if (!v) return kDefaultSeed;
  std::uint64_t seed = 0;
  bool digits = !v->empty() && v->size() <= 20;
  for (char c : *v) {
    if (c < '0' || c > '9') {
      digits = false;
      break;
    }
    const std::uint64_t d = std::uint64_t(c - '0');
    if (seed > (~std::uint64_t(0) - d) / 10) digits = false;
    seed = seed * 10 + d;
  }
  if (!digits) throw UsageError{"--seed: expected a whole number from 0 to 18446744073709551615, got '" + *v + "'"};
  return seed;
}

int threadsOption(const CliArgs& args) {
  const int t = args.integer("threads", 0);
  if (t < 0) throw UsageError{"--threads: expected 0 (all cores) or a positive number"};
  return t;
}

nlohmann::json jsonNumber(double v) { return std::isfinite(v) ? nlohmann::json(v) : nlohmann::json(); }

StderrProgress::StderrProgress(std::string verb) : verb_(std::move(verb)), start_(std::chrono::steady_clock::now()) {
  if (!isatty(STDERR_FILENO)) return;
  control_.onProgress = [this](double f) {
    const double elapsed = std::chrono::duration<double>(std::chrono::steady_clock::now() - start_).count();
    if (elapsed < 1.0) return true;
    const int percent = int(f * 100);
    std::lock_guard<std::mutex> lock(mutex_);
    if (percent / 5 != shown_ / 5) {
      shown_ = percent;
      std::fprintf(stderr, "\r%s: %3d%%", verb_.c_str(), percent);
      std::fflush(stderr);
    }
    return true;
  };
}

void StderrProgress::finish() {
  if (shown_ >= 0) std::fprintf(stderr, "\r%s: done\n", verb_.c_str());
}

std::string resamplingHelp(const std::string& command) {
  const std::string common =
      "  --measures ids   measures to run (default: all; entropic and sinkhorn are slow here)\n"
      "  --set key=value  measure settings; data-dependent ones (median σ, automatic bins, ε)\n"
      "                   are fixed once on the original A and B and reused on every draw\n"
      "  --seed S         random seed (default " + std::to_string(kDefaultSeed) +
      "); the same seed gives the same output, byte for byte,\n"
      "                   whatever --threads is\n"
      "  --threads N      worker threads (0 = all cores)\n"
      "  --json           one JSON object on stdout\n";
  if (command == "spread")
    return "usage: barrow-cli spread --a A --b B [--measures ...] [--set key=value ...] [--resamples 200]\n"
           "                         [--level 0.95] [--interval percentile|basic] [--seed S] [--threads N] [--json]\n\n"
           "spread: how much would each value move on another sample of the same size?\n"
           "Draws B resamples of both clouds with replacement (indices from the normalised\n"
           "weights; each resample has uniform weights) and reports the value on the original\n"
           "clouds, an interval at the chosen level and the resample standard deviation.\n\n"
           "  --resamples B    resamples, 1.." + std::to_string(kMaxResamples) + " (default 200)\n"
           "  --level L        interval level, strictly between 0 and 1 (default 0.95)\n"
           "  --interval K     percentile (default) or basic\n" + common +
           "\nThe percentile interval (the resample quantiles themselves) is shown by default:\n"
           "it stays inside the measure's range (no negative distances) and is the same whether\n"
           "a measure is reported squared or not. The basic interval (2·value − quantiles)\n"
           "reflects a lopsided resample distribution about the value; it can leave the range.\n"
           "Either one shows sample-to-sample variation only. It does NOT show the estimator's\n"
           "bias: resamples scatter around the sample value, not the population value, and\n"
           "exact W1 between samples, for one, sits above the population W1 by an amount that\n"
           "shrinks with the sample size (see `barrow-cli sizes`). Resampling can even add to\n"
           "it: a resample repeats some points and drops others, so for W1 and its kin the\n"
           "resamples sit further apart than the originals and the percentile interval may lie\n"
           "wholly above the value. Read the sd then, or use --interval basic.\n";
  if (command == "permute")
    return "usage: barrow-cli permute --a A --b B [--measures ...] [--set key=value ...] [--permutations 999]\n"
           "                          [--seed S] [--threads N] [--json]\n\n"
           "permute: could A and B come from one distribution? The permutation two-sample test\n"
           "with each measure as its statistic: A and B are pooled (each point keeps its weight,\n"
           "normalised within its own cloud), re-split at random into the original sizes P\n"
           "times, and p = (1 + #{T_perm >= T_obs}) / (1 + P) (Phipson & Smyth 2010), so p is\n"
           "never 0 and its smallest value is 1/(1 + P).\n\n"
           "  --permutations P permutations, 1.." + std::to_string(kMaxPermutations) + " (default 999)\n" + common;
  if (command == "sizes")
    return "usage: barrow-cli sizes --a A --b B [--measures ...] [--set key=value ...] [--sizes n1,n2,...]\n"
           "                        [--repeats 20] [--seed S] [--threads N] [--json]\n\n"
           "sizes: how does each value change with the number of points? For each size n, R\n"
           "subsamples of n points are drawn from each cloud (with replacement, from the\n"
           "normalised weights); the mean and standard deviation per size are reported with the\n"
           "least-squares slope of log(mean) against log(n). A measure whose mean falls with n\n"
           "on one and the same data is biased at small n.\n\n"
           "  --sizes n1,n2,.. sizes, each from 1 to the smaller cloud's size, at most " +
           std::to_string(kMaxSizeSteps) + "\n"
           "                   (default: 8 sizes spaced geometrically from 25 to that size)\n"
           "  --repeats R      subsamples per size, 1.." + std::to_string(kMaxRepeats) + " (default 20)\n" + common;
  return "";
}

}  // namespace barrow::cli
