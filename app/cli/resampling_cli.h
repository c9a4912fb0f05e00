// Pieces shared by the resampling commands (spread, permute, sizes): the seed option, progress
// on stderr for runs longer than a second, JSON numbers, and their --help text.
#pragma once

#include <chrono>
#include <cstdint>
#include <mutex>
#include <nlohmann/json.hpp>
#include <string>

#include "cli/cli_args.h"
#include "base/run_control.h"

namespace barrow::cli {

/// --seed as an unsigned 64-bit integer (default kDefaultSeed); a UsageError otherwise.
std::uint64_t seedOption(const CliArgs& args);

/// --threads: 0 (all cores) or positive.
int threadsOption(const CliArgs& args);

/// A finite number, or null (the contract's spelling of inf/NaN in JSON).
nlohmann::json jsonNumber(double v);

/// Prints "<verb>: 40%" to stderr when it is a terminal and the run has lasted over a second;
/// `finish()` ends the line.
class StderrProgress {
 public:
  explicit StderrProgress(std::string verb);
  const RunControl* control() const { return &control_; }
  void finish();

 private:
  std::string verb_;
  RunControl control_;
  std::mutex mutex_;
  std::chrono::steady_clock::time_point start_;
  int shown_ = -1;
};

/// The extra --help text of spread, permute or sizes ("" for other commands).
std::string resamplingHelp(const std::string& command);

}  // namespace barrow::cli
