// barrow-cli demo [--out DIR] [--threads N] [--json]
// Writes the built-in scenario (core/scenario/demo_scenario.h) as a.csv and b.csv into DIR
// (default ./barrow-demo), sweeps every available measure over its θ range, writes
// DIR/sweep.csv and prints the findings (the contract's JSON with --json).
#include <cstdio>
#include <filesystem>
#include <iostream>
#include <system_error>

#include "cli/cli_common.h"
#include "cli/commands.h"
#include "io/csv_io.h"
#include "io/sweep_csv.h"
#include "measures/registry.h"
#include "scenario/demo_scenario.h"
#include "sweep/continuity.h"
#include "io/findings_json.h"
#include "sweep/sweep_engine.h"

namespace barrow::cli {

int runDemo(const std::vector<std::string>& argv) {
  const CliArgs args("demo", argv, {"out", "threads"}, {"json"});
  const std::string dir = args.value("out").value_or("barrow-demo");
  std::error_code ec;
  std::filesystem::create_directories(dir, ec);
  if (ec) throw InputError{dir + ": cannot create the folder: " + ec.message()};

  const Session s = demoSession();
  const std::string aPath = dir + "/a.csv", bPath = dir + "/b.csv", sweepPath = dir + "/sweep.csv";
  if (auto e = writeCloudCsv(aPath, s.a)) throw InputError{*e};
  if (auto e = writeCloudCsv(bPath, s.b)) throw InputError{*e};

  SweepRequest req;
  req.settings = s.sweep;
  req.settings.measures = s.selected;
  req.params = s.params;
  req.threads = args.integer("threads", 0);
  if (req.threads < 0) throw UsageError{"--threads: expected 0 (all cores) or a positive number"};
  const SweepResult r = runSweepWithProgress(s.a, s.b, req);
  if (auto e = writeSweepCsv(sweepPath, r)) throw InputError{*e};

  const auto findings = findContinuity(r);
  if (args.flag("json")) {
    std::cout << formatFindingsJson(findings);
    return kExitOk;
  }
  std::printf("demo: '%s' (A, %lld points) and '%s' (B, %lld points) written to %s and %s\n", s.a.name.c_str(),
              static_cast<long long>(s.a.size()), s.b.name.c_str(), static_cast<long long>(s.b.size()),
              aPath.c_str(), bPath.c_str());
  std::printf("sweep: %s of A, θ from %g to %g, %zu θ values, %zu measures, %.2f s -> %s\n\n",
              familyName(r.settings.family).c_str(), r.settings.from, r.settings.to, r.theta.size(), r.series.size(), r.seconds,
              sweepPath.c_str());
  for (const auto& f : findings) std::printf("%s\n", f.summary.c_str());
  printSweepNotes(r, stdout);
  return kExitOk;
}

}  // namespace barrow::cli
