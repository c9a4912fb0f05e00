#include "cli/cli_common.h"

#include <unistd.h>

#include <algorithm>
#include <cerrno>
#include <cmath>
#include <cstdio>
#include <cstdlib>
#include <cstring>
#include <filesystem>

#include "io/cloud_file.h"
#include "measures/registry.h"

namespace barrow::cli {

Cloud loadCloud(const std::string& path) {
  auto loaded = readCloudFile(path);
  if (!loaded) throw InputError{loaded.error.text()};
  return std::move(*loaded.value);
}

std::vector<const Measure*> selectMeasures(const CliArgs& args) {
  const auto& reg = MeasureRegistry::instance();
  std::vector<const Measure*> out;
  if (!args.has("measures")) return reg.defaults();
  for (const auto& id : splitList(*args.value("measures"))) {
    if (const Measure* m = reg.find(id)) {
      out.push_back(m);
      continue;
    }
    std::string all;
    for (const Measure* k : reg.all()) all += (all.empty() ? "" : ",") + k->id();
    throw InputError{"unknown measure '" + id + "' (known: " + all + ")"};
  }
  if (out.empty()) throw InputError{"--measures lists no measure"};
  return out;
}

ParamSet parseSets(const CliArgs& args) {
  ParamSet set;
  const auto specs = MeasureRegistry::instance().allParams();
  for (const auto& s : args.sets()) {
    if (auto e = set.assign(s)) throw InputError{"--set: " + *e};
  }
  for (const auto& entry : set.values()) {
    // Plain references, not a structured binding: clang before 16 cannot capture one in a lambda.
    const std::string& key = entry.first;
    const std::string& value = entry.second;
    const auto it = std::find_if(specs.begin(), specs.end(), [&](const ParamSpec& p) { return p.key == key; });
    if (it == specs.end()) throw InputError{"--set: unknown parameter '" + key + "'"};
    if (auto e = checkParam(*it, value)) throw InputError{"--set: " + *e};
  }
  return set;
}

void checkWritable(const std::string& path, const std::string& option) {
  if (path == "-") return;
  namespace fs = std::filesystem;
  std::error_code ec;
  if (path.empty()) throw InputError{"--" + option + ": the file name is empty"};
  if (fs::is_directory(path, ec)) throw InputError{"--" + option + " " + path + ": is a directory, not a file"};
  const fs::path parent = fs::path(path).parent_path().empty() ? fs::path(".") : fs::path(path).parent_path();
  if (!fs::is_directory(parent, ec))
    throw InputError{"--" + option + " " + path + ": the folder " + parent.string() + " does not exist"};
  if (::access(parent.c_str(), W_OK) != 0 || (fs::exists(path, ec) && ::access(path.c_str(), W_OK) != 0))
    throw InputError{"--" + option + " " + path + ": cannot write there (" + std::strerror(errno) + ")"};
}

}  // namespace barrow::cli
