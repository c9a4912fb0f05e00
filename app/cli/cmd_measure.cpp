// barrow-cli measure --a A.csv --b B.csv [--measures ids] [--set k=v ...] [--json]
#include <cmath>
#include <cstdio>
#include <iostream>
#include <nlohmann/json.hpp>

#include "base/number_text.h"
#include "cli/cli_common.h"
#include "cli/commands.h"
#include "measures/details_text.h"
#include "measures/evaluate.h"
#include "measures/measure_json.h"
#include "measures/units.h"

namespace barrow::cli {

int runMeasure(const std::vector<std::string>& argv) {
  const CliArgs args("measure", argv, {"a", "b", "measures"}, {"json"});
  const Cloud a = loadCloud(args.required("a"));
  const Cloud b = loadCloud(args.required("b"));
  EvalRequest req;
  req.params = parseSets(args);
  const auto measures = selectMeasures(args);

  nlohmann::json out = {{"measures", nlohmann::json::array()}};
  std::vector<std::string> unusable;  // "id: reason" for measures the input cannot feed
  for (const Measure* m : measures) {
    const Result r = evaluateMeasure(*m, a, b, req);
    if (r.status == Status::InvalidInput) unusable.push_back(m->id() + ": " + r.message);
    const std::string unit = measureUnit(*m, req.params);
    out["measures"].push_back(measureRowJson(*m, r, req.params));
    if (!args.flag("json")) {
      const std::string shown = shortestText(r.value) + " " + unit;  // the unit right beside the number
      std::printf("%-10s %-36s %-14s %8.3f ms\n", m->id().c_str(), shown.c_str(), statusName(r.status),
                  r.seconds * 1e3);
      if (!r.message.empty()) std::printf("%-10s note: %s\n", "", r.message.c_str());
      for (const auto& line : detailLines(r.details)) std::printf("%-10s %s\n", "", line.c_str());
    }
  }
  if (args.flag("json")) std::cout << out.dump() << "\n";
  if (!unusable.empty()) {
    // The values that could be computed are printed above; the exit code says the input did
    // not suit every requested measure, and stderr says which and why.
    std::string line = "the input cannot be used for " + std::to_string(unusable.size()) + " of " +
                       std::to_string(measures.size()) + " measures: ";
    for (std::size_t k = 0; k < unusable.size(); ++k) line += (k ? "; " : "") + unusable[k];
    std::fprintf(stderr, "barrow-cli: %s\n", line.c_str());
    return kExitBadInput;
  }
  return kExitOk;
}

}  // namespace barrow::cli
