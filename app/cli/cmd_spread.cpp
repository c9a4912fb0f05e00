// barrow-cli spread --a A --b B [--measures ids] [--set k=v ...] [--resamples B] [--level L]
//   [--interval percentile|basic] [--seed S] [--threads N] [--json]
#include <cstdio>
#include <iostream>

#include "cli/cli_common.h"
#include "cli/commands.h"
#include "cli/resampling_cli.h"
#include "base/number_text.h"
#include "uncertainty/spread.h"

namespace barrow::cli {

int runSpread(const std::vector<std::string>& argv) {
  const CliArgs args("spread", argv, {"a", "b", "measures", "resamples", "level", "interval", "seed", "threads"},
                     {"json"});
  SpreadRequest req;
  req.resamples = args.integer("resamples", req.resamples);
  req.level = args.number("level", req.level);
  if (auto k = args.value("interval")) {
    if (*k == "basic") req.interval = IntervalKind::Basic;
    else if (*k != "percentile") throw UsageError{"--interval: expected percentile or basic, got '" + *k + "'"};
  }
  req.seed = seedOption(args);
  req.threads = threadsOption(args);
  // Options are checked before the clouds are read: a bad count costs no loading.
  if (auto e = checkCount("--resamples", req.resamples, kMaxResamples)) throw UsageError{*e};
  if (auto e = checkLevel(req.level)) throw UsageError{"--" + *e};
  const Cloud a = loadCloud(args.required("a"));
  const Cloud b = loadCloud(args.required("b"));
  req.params = parseSets(args);
  req.measures = selectMeasures(args);
  if (auto e = checkSpreadRequest(req)) throw InputError{*e};

  StderrProgress progress("resampling");
  const SpreadResult r = runSpread(a, b, req, progress.control());
  progress.finish();

  nlohmann::json out = {{"measures", nlohmann::json::array()}};
  if (!args.flag("json"))
    std::printf("%d resamples, seed %llu, %s interval at level %s\n%-10s %-14s %-32s %-12s %s\n", req.resamples,
                (unsigned long long)req.seed, intervalKindName(req.interval), shortestText(req.level).c_str(), "measure",
                "value", "interval", "sd", "status");
  for (const SpreadRow& row : r.rows) {
    nlohmann::json j = {{"id", row.id},           {"value", jsonNumber(row.value)}, {"low", jsonNumber(row.low)},
                        {"high", jsonNumber(row.high)}, {"sd", jsonNumber(row.sd)},  {"resamples", req.resamples},
                        {"level", req.level},     {"seed", req.seed},               {"status", statusName(row.status)},
                        {"interval", intervalKindName(req.interval)}};
    if (row.failed > 0) j["failed"] = row.failed;
    if (!row.message.empty()) j["message"] = row.message;
    out["measures"].push_back(j);
    if (!args.flag("json")) {
      const std::string iv = "[" + sixDigits(row.low) + ", " + sixDigits(row.high) + "]";
      std::printf("%-10s %-14s %-32s %-12s %s\n", row.id.c_str(), sixDigits(row.value).c_str(), iv.c_str(),
                  sixDigits(row.sd).c_str(), statusName(row.status));
      if (!row.message.empty())
        std::printf("%-10s note: %s%s\n", "", row.failed > 0 ? (std::to_string(row.failed) + " resamples failed; ").c_str() : "",
                    row.message.c_str());
    }
  }
  if (args.flag("json")) std::cout << out.dump() << "\n";
  return r.cancelled ? kExitInternal : kExitOk;
}

}  // namespace barrow::cli
