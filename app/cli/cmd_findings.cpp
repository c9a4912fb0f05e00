// barrow-cli findings --sweep sweep.csv [--json]
// barrow-cli findings <the sweep options> [--out sweep.csv] [--json]
// One line per measure (its plain-words summary), or the contract's JSON with --json.
#include <cstdio>
#include <iostream>

#include "cli/cli_common.h"
#include "cli/commands.h"
#include "io/sweep_csv.h"
#include "sweep/continuity.h"
#include "io/findings_json.h"
#include "io/sweep_csv.h"
#include "uncertainty/band_notes.h"

namespace barrow::cli {

int runFindings(const std::vector<std::string>& argv) {
  std::vector<std::string> valued = sweepOptionNames();
  valued.push_back("sweep");
  valued.push_back("out");
  const CliArgs args("findings", argv, valued, {"json", "no-refine", "no-warm-start"});
  SweepResult r;
  if (args.has("sweep")) {
    for (const auto& name : sweepOptionNames())
      if (args.has(name)) throw UsageError{"give either --sweep FILE or the sweep options, not both (--" + name + ")"};
    if (args.has("out")) throw UsageError{"--out writes a new sweep; it has no use with --sweep"};
    auto loaded = readSweepCsv(*args.value("sweep"));
    if (!loaded) throw InputError{loaded.error.text()};
    r = std::move(*loaded.value);
  } else {
    if (!args.has("a") && !args.has("b")) throw UsageError{"'findings' needs --sweep FILE or the sweep options (--a, --b, --family, ...)"};
    if (args.has("out")) checkWritable(*args.value("out"), "out");
    r = sweepFromArgs(args);
    if (args.has("out"))
      if (auto e = writeSweepCsv(*args.value("out"), r)) throw InputError{*e};
  }
  auto findings = findContinuity(r);
  // A sweep with resampling bands: each jump and flat stretch is read against them.
  for (std::size_t k = 0; k < findings.size() && k < r.series.size(); ++k)
    for (const auto& note : readAgainstBands(findings[k], r.theta, r.series[k]).notes)
      findings[k].summary += "; " + note;
  if (args.flag("json")) {
    std::cout << formatFindingsJson(findings);
  } else {
    for (const auto& f : findings) std::printf("%s\n", f.summary.c_str());
    if (!args.has("sweep")) {
      printSweepFrame(r, stdout);
      printSweepNotes(r, stdout);
    }
  }
  return kExitOk;
}

}  // namespace barrow::cli
