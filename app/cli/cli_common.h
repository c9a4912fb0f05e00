// Shared pieces of barrow-cli commands: errors mapped to exit codes, loading inputs,
// resolving measure lists and --set parameters.
#pragma once

#include <string>
#include <vector>

#include "cli/cli_args.h"
#include "cloud/cloud.h"
#include "measures/measure.h"

namespace barrow::cli {

/// Exit codes of the contract.
inline constexpr int kExitOk = 0;
inline constexpr int kExitInternal = 1;
inline constexpr int kExitBadInput = 2;

/// Bad input (file, value, option): one line, exit 2.
struct InputError {
  std::string message;
};
/// A failure of ours: one line, exit 1.
struct InternalError {
  std::string message;
};

/// Reads a CSV or .npy cloud; throws InputError naming file, line and reason.
Cloud loadCloud(const std::string& path);

/// The measures named in --measures (the registry's default set when absent). Unknown ids are an
/// InputError naming the registered ones.
std::vector<const Measure*> selectMeasures(const CliArgs& args);

/// Every --set, checked against the known parameter keys and their ranges.
ParamSet parseSets(const CliArgs& args);

/// Fails (InputError) unless `path` can be written: its folder exists and is writable, and it
/// is not itself a folder. Called before long work so a typo does not waste it. "-" (stdout)
/// passes.
void checkWritable(const std::string& path, const std::string& option);

}  // namespace barrow::cli
