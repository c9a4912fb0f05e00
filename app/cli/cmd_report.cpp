// barrow-cli report --session S.json [--title T] [--threads N] [--no-refine] [--no-warm-start] --out report.html
// barrow-cli report --a A --b B <the sweep options> [--title T] --out report.html
// Runs the sweep, its findings and the measures, then writes one self-contained HTML file.
#include <algorithm>
#include <cmath>
#include <cstdio>

#include "cli/cli_common.h"
#include "cli/commands.h"
#include "io/csv_io.h"
#include "io/session_io.h"
#include "measures/registry.h"
#include "report/report_build.h"
#include "report/report_html.h"
#include "sweep/continuity.h"
#include "sweep/sweep_engine.h"

namespace barrow::cli {

namespace {

// The sweep a session describes, measured on the measures the window would sweep: the
// session's selection, else the sweep's list, else every registered measure.
SweepRequest requestFromSession(const Session& s, const CliArgs& args, const std::string& file) {
  SweepRequest req;
  req.settings = s.sweep;
  req.settings.measures = !s.selected.empty() ? s.selected : s.sweep.measures;
  if (req.settings.measures.empty())
    for (const Measure* m : MeasureRegistry::instance().defaults()) req.settings.measures.push_back(m->id());
  for (const auto& id : req.settings.measures)
    if (!MeasureRegistry::instance().find(id)) throw InputError{file + ": measures: unknown measure '" + id + "'"};
  if (auto e = req.settings.validate()) throw InputError{file + ": sweep: " + *e};
  req.params = s.params;
  req.threads = args.integer("threads", 0);
  if (req.threads < 0) throw UsageError{"--threads: expected 0 (all cores) or a positive number"};
  req.refineJumps = !args.flag("no-refine");
  req.maxRefinePoints = args.integer("refine-budget", 0);
  req.thetaTolerance = args.number("resolution", 0.0);
  if (req.maxRefinePoints < 0) throw UsageError{"--refine-budget: expected 0 (the default) or a positive number"};
  if (!(req.thetaTolerance >= 0) || !std::isfinite(req.thetaTolerance))
    throw UsageError{"--resolution: expected a θ width > 0 (0 = the default)"};
  req.warmStart = !args.flag("no-warm-start");
  return req;
}

}  // namespace

int runReport(const std::vector<std::string>& argv) {
  std::vector<std::string> valued = sweepOptionNames();
  for (const char* extra : {"session", "out", "title"}) valued.push_back(extra);
  const CliArgs args("report", argv, valued, {"no-refine", "no-warm-start"});
  const std::string out = args.required("out");
  checkWritable(out, "out");

  ReportSources src;
  src.out = out;
  src.title = args.value("title").value_or("");
  Cloud a, b;
  SweepResult sweep;
  if (args.has("session")) {
    for (const auto& name : sweepOptionNames())
      if (args.has(name) && name != "threads" && name != "refine-budget" && name != "resolution")
        throw UsageError{"give either --session FILE or the clouds and sweep options, not both (--" + name + ")"};
    if (!args.sets().empty()) throw UsageError{"--set has no use with --session: the session holds the settings"};
    src.sessionFile = *args.value("session");
    auto loaded = readSession(src.sessionFile);
    if (!loaded) throw InputError{loaded.error.text()};
    const Session& s = *loaded.value;
    a = s.a;
    b = s.b;
    src.params = s.params;
    if (src.title.empty()) src.title = fileStem(src.sessionFile);
    sweep = runSweepWithProgress(a, b, requestFromSession(s, args, src.sessionFile));
  } else {
    if (!args.has("a") || !args.has("b")) throw UsageError{"'report' needs --session FILE, or --a, --b and the sweep options"};
    src.fileA = *args.value("a");
    src.fileB = *args.value("b");
    a = loadCloud(src.fileA);
    b = loadCloud(src.fileB);
    src.params = parseSets(args);
    sweep = sweepFromArgs(args);
  }
  std::vector<Finding> findings = findContinuity(sweep);
  const ReportInput in = gatherReport(a, b, src, std::move(sweep), std::move(findings));
  if (auto e = writeReportHtml(out, in)) throw InputError{*e};
  std::printf("wrote %s: %zu θ values × %zu measures, %lld + %lld points\n", out.c_str(), in.sweep.theta.size(),
              in.sweep.series.size(), static_cast<long long>(a.size()), static_cast<long long>(b.size()));
  printSweepNotes(in.sweep, stdout);
  return kExitOk;
}

}  // namespace barrow::cli
