// barrow-cli sizes --a A --b B [--measures ids] [--set k=v ...] [--sizes n1,n2,...] [--repeats R]
//   [--seed S] [--threads N] [--json]
#include <algorithm>
#include <cmath>
#include <cstdio>
#include <iostream>

#include "cli/cli_common.h"
#include "cli/commands.h"
#include "cli/resampling_cli.h"
#include "base/number_text.h"
#include "uncertainty/value_vs_size.h"

namespace barrow::cli {

namespace {

std::vector<int> sizesOption(const CliArgs& args) {
  std::vector<int> out;
  const auto v = args.value("sizes");
  if (!v) return out;
  for (const auto& part : splitList(*v)) {
    const auto d = parseNumber(part);
    if (!d || *d != std::floor(*d) || *d < 1 || *d > 1e9)
      throw UsageError{"--sizes: '" + part + "' is not a positive whole number"};
    out.push_back(int(*d));
  }
  if (out.empty()) throw UsageError{"--sizes: no size given"};
  std::sort(out.begin(), out.end());
  out.erase(std::unique(out.begin(), out.end()), out.end());
  return out;
}

}  // namespace

int runSizes(const std::vector<std::string>& argv) {
  const CliArgs args("sizes", argv, {"a", "b", "measures", "sizes", "repeats", "seed", "threads"}, {"json"});
  SizesRequest req;
  req.sizes = sizesOption(args);
  req.repeats = args.integer("repeats", req.repeats);
  req.seed = seedOption(args);
  req.threads = threadsOption(args);
  if (auto e = checkCount("--repeats", req.repeats, kMaxRepeats)) throw UsageError{*e};
  const Cloud a = loadCloud(args.required("a"));
  const Cloud b = loadCloud(args.required("b"));
  req.params = parseSets(args);
  req.measures = selectMeasures(args);
  if (auto e = checkSizesRequest(req, int(std::min(a.size(), b.size())))) throw InputError{"--sizes: " + *e};

  StderrProgress progress("subsampling");
  const SizesResult r = runValueVsSize(a, b, req, progress.control());
  progress.finish();

  nlohmann::json out = {{"measures", nlohmann::json::array()}};
  if (!args.flag("json")) {
    std::printf("%d subsamples per size, seed %llu; mean ± sd per size, slope of log(mean) against log(n)\n",
                req.repeats, (unsigned long long)req.seed);
    std::printf("%-10s", "n");
    for (int n : r.sizes) std::printf(" %23d", n);
    std::printf("   slope\n");
  }
  for (const SizesRow& row : r.rows) {
    nlohmann::json mean = nlohmann::json::array(), sd = nlohmann::json::array();
    for (std::size_t s = 0; s < r.sizes.size() && s < row.mean.size(); ++s) {
      mean.push_back(jsonNumber(row.mean[s]));
      sd.push_back(jsonNumber(row.sd[s]));
    }
    nlohmann::json j = {{"id", row.id}, {"sizes", r.sizes},          {"mean", mean}, {"sd", sd},
                        {"slope", jsonNumber(row.slope)}, {"repeats", req.repeats}, {"seed", req.seed},
                        {"status", statusName(row.status)}};
    if (row.failed > 0) j["failed"] = row.failed;
    if (!row.message.empty()) j["message"] = row.message;
    out["measures"].push_back(j);
    if (!args.flag("json")) {
      std::printf("%-10s", row.id.c_str());
      for (std::size_t s = 0; s < row.mean.size(); ++s) {
        const std::string cell = sixDigits(row.mean[s]) + " ± " + sixDigits(row.sd[s]);
        std::printf(" %23s", cell.c_str());
      }
      std::printf("   %s  %s\n", sixDigits(row.slope).c_str(), statusName(row.status));
      if (!row.message.empty()) std::printf("%-10s note: %s\n", "", row.message.c_str());
    }
  }
  if (args.flag("json")) std::cout << out.dump() << "\n";
  return r.cancelled ? kExitInternal : kExitOk;
}

}  // namespace barrow::cli
