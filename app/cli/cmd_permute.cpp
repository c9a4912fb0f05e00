// barrow-cli permute --a A --b B [--measures ids] [--set k=v ...] [--permutations P] [--seed S]
//   [--threads N] [--json]
#include <cstdio>
#include <iostream>

#include "cli/cli_common.h"
#include "cli/commands.h"
#include "cli/resampling_cli.h"
#include "base/number_text.h"
#include "uncertainty/permutation_test.h"

namespace barrow::cli {

int runPermute(const std::vector<std::string>& argv) {
  const CliArgs args("permute", argv, {"a", "b", "measures", "permutations", "seed", "threads"}, {"json"});
  PermuteRequest req;
  req.permutations = args.integer("permutations", req.permutations);
  req.seed = seedOption(args);
  req.threads = threadsOption(args);
  if (auto e = checkCount("--permutations", req.permutations, kMaxPermutations)) throw UsageError{*e};
  const Cloud a = loadCloud(args.required("a"));
  const Cloud b = loadCloud(args.required("b"));
  req.params = parseSets(args);
  req.measures = selectMeasures(args);
  if (auto e = checkPermuteRequest(req)) throw InputError{*e};

  StderrProgress progress("permuting");
  const PermuteResult r = runPermutationTest(a, b, req, progress.control());
  progress.finish();

  nlohmann::json out = {{"measures", nlohmann::json::array()}};
  if (!args.flag("json"))
    std::printf("%d permutations, seed %llu; p = (1 + #{T_perm >= T_obs}) / (1 + P)\n%-10s %-14s %-10s %s\n",
                req.permutations, (unsigned long long)req.seed, "measure", "value", "p", "status");
  for (const PermuteRow& row : r.rows) {
    nlohmann::json j = {{"id", row.id},
                        {"value", jsonNumber(row.value)},
                        {"p_value", jsonNumber(row.pValue)},
                        {"permutations", req.permutations},
                        {"seed", req.seed},
                        {"status", statusName(row.status)}};
    if (row.failed > 0) j["failed"] = row.failed;
    if (!row.message.empty()) j["message"] = row.message;
    out["measures"].push_back(j);
    if (!args.flag("json")) {
      std::printf("%-10s %-14s %-10s %s\n", row.id.c_str(), sixDigits(row.value).c_str(),
                  sixDigits(row.pValue).c_str(), statusName(row.status));
      if (!row.message.empty()) std::printf("%-10s note: %s\n", "", row.message.c_str());
    }
  }
  if (args.flag("json")) std::cout << out.dump() << "\n";
  return r.cancelled ? kExitInternal : kExitOk;
}

}  // namespace barrow::cli
