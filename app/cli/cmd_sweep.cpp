// barrow-cli sweep --a A.csv --b B.csv --family shift|rotate|scale|interpolate|mix
//   [--direction dx,dy] [--center x,y] [--from F --to T --steps N] [--reference R]
//   [--measures ids] [--set k=v ...] [--threads N] [--no-refine] [--no-warm-start] --out sweep.csv
//   [--resamples B [--level L] [--seed S]]   (adds lo_<id>,hi_<id> resampling bands)
#include <unistd.h>

#include <cstdio>
#include <cstdlib>
#include <mutex>

#include "base/number_text.h"
#include "cli/cli_common.h"
#include "cli/interrupt.h"
#include "cli/progress_line.h"
#include "measures/time_estimate.h"
#include "cli/commands.h"
#include "cli/resampling_cli.h"
#include "families/family_map.h"
#include "io/sweep_csv.h"
#include "sweep/sweep_engine.h"
#include "uncertainty/sweep_bands.h"

namespace barrow::cli {

namespace {

std::array<double, 2> pairOption(const CliArgs& args, const std::string& name) {
  const auto parts = splitList(*args.value(name));
  std::optional<double> x, y;
  if (parts.size() == 2) x = parseNumber(parts[0]), y = parseNumber(parts[1]);
  if (!x || !y || !std::isfinite(*x) || !std::isfinite(*y))
    throw UsageError{"--" + name + ": expected two numbers 'x,y', got '" + *args.value(name) + "'"};
  return {*x, *y};
}

SweepRequest requestFromArgs(const CliArgs& args) {
  SweepRequest req;
  SweepSettings& s = req.settings;
  const std::string family = args.required("family");
  const FamilySpec* spec = findFamily(family);
  if (!spec) throw InputError{"unknown family '" + family + "' (expected " + familyChoices() + ")"};
  s.family = spec->family;
  s.from = args.number("from", spec->from);
  s.to = args.number("to", spec->to);
  s.steps = args.integer("steps", s.steps);
  if (args.has("reference")) s.reference = args.number("reference", s.from);
  if (args.has("direction")) s.direction = pairOption(args, "direction");
  if (args.has("center")) s.center = pairOption(args, "center");
  for (const Measure* m : selectMeasures(args)) s.measures.push_back(m->id());
  if (auto e = s.validate()) throw InputError{*e};
  req.params = parseSets(args);
  req.threads = args.integer("threads", 0);
  if (req.threads < 0) throw UsageError{"--threads: expected 0 (all cores) or a positive number"};
  req.refineJumps = !args.flag("no-refine");
  req.maxRefinePoints = args.integer("refine-budget", 0);
  if (req.maxRefinePoints < 0 || req.maxRefinePoints > kMaxRefinePoints)
    throw UsageError{"--refine-budget: expected 0 (the default, max(64, steps)) to " + std::to_string(kMaxRefinePoints)};
  req.thetaTolerance = args.number("resolution", 0.0);
  if (!(req.thetaTolerance >= 0) || !std::isfinite(req.thetaTolerance) ||
      (req.thetaTolerance > 0 && req.thetaTolerance > s.to - s.from))
    throw UsageError{"--resolution: expected a θ width > 0 and below the range (0 = the default, 1e-5 × range)"};
  req.warmStart = !args.flag("no-warm-start");
  return req;
}

}  // namespace

const std::vector<std::string>& sweepOptionNames() {
  static const std::vector<std::string> names = {"a", "b", "family", "direction", "center", "from", "to",
                                                 "steps", "reference", "measures", "threads",
                                                 "refine-budget", "resolution"};
  return names;
}

SweepResult sweepFromArgs(const CliArgs& args) {
  const Cloud a = loadCloud(args.required("a"));
  const Cloud b = loadCloud(args.required("b"));
  return runSweepWithProgress(a, b, requestFromArgs(args));
}

SweepResult runSweepWithProgress(const Cloud& a, const Cloud& b, const SweepRequest& req) {
  RunControl control;
  control.cancel = interruptFlag();  // Ctrl+C: stop, write nothing (a partial sweep would mislead)
  ProgressLine progress;
  control.onProgress = [&](double f) {
    progress.show("sweeping", f);
    return true;
  };
  SweepResult r = barrow::runSweep(a, b, req, &control);
  progress.finish("sweeping: done in " + estimateText(progress.elapsed()));
  if (interrupted()) {
    std::fprintf(stderr, "barrow-cli: interrupted; nothing written\n");
    std::exit(kExitInterrupted);
  }
  if (r.theta.empty()) throw InputError{r.message};
  return r;
}

void printSweepFrame(const SweepResult& r, std::FILE* to) {
  const SweepSettings& s = r.settings;
  std::fprintf(to, "  settings frozen at the reference θ0 = %s (%s)\n", shortestText(r.referenceTheta).c_str(),
               s.reference ? "set with --reference" : "the family's identity: A as given");
  if (r.refineTolerance > 0)
    std::fprintf(to, "  jumps confirmed to Δθ <= %.3g; refinement budget %d θ values, %d used%s\n",
                 r.refineTolerance, r.refineBudget, r.refinedPoints,
                 r.refineBudgetHit ? " (ran out: some suspects stay unresolved; raise --refine-budget)" : "");
}

void printSweepNotes(const SweepResult& r, std::FILE* to) {
  for (const auto& s : r.series) {
    std::size_t failed = 0;
    for (Status st : s.status) failed += !usable(st);
    if (failed > 0)
      std::fprintf(to, "  note: %s failed at %zu of %zu θ values: %s\n", s.id.c_str(), failed, s.status.size(),
                   s.message.c_str());
  }
}

int runSweep(const std::vector<std::string>& argv) {
  std::vector<std::string> valued = sweepOptionNames();
  valued.insert(valued.end(), {"out", "resamples", "level", "seed"});
  const CliArgs args("sweep", argv, valued, {"no-refine", "no-warm-start"});
  const std::string out = args.required("out");
  SweepBandRequest bands;
  bands.resamples = args.integer("resamples", 0);
  bands.level = args.number("level", bands.level);
  bands.seed = seedOption(args);
  bands.threads = args.integer("threads", 0);
  bands.warmStart = !args.flag("no-warm-start");
  const bool wantBands = args.has("resamples");
  if (wantBands)
    if (auto e = checkSweepBandRequest(bands)) throw UsageError{"--resamples/--level: " + *e};
  checkWritable(out, "out");
  SweepResult r = sweepFromArgs(args);
  if (wantBands) {
    const Cloud a = loadCloud(args.required("a"));
    const Cloud b = loadCloud(args.required("b"));
    StderrProgress progress("resampling the sweep");
    if (auto e = addSweepBands(a, b, r, bands, progress.control())) throw InputError{*e};
    progress.finish();
  }
  if (auto e = writeSweepCsv(out, r)) throw InputError{*e};
  std::printf("wrote %s: %zu θ values (%d added near suspected jumps) × %zu measures in %.2f s on %d threads\n",
              out.c_str(), r.theta.size(), r.refinedPoints, r.series.size(), r.seconds, r.threads);
  printSweepFrame(r, stdout);
  if (r.bandResamples > 0)
    std::printf("bands: %d resamples per θ, %s percentile interval, seed %llu (lo_<id>, hi_<id> columns)\n",
                r.bandResamples, shortestText(r.bandLevel).c_str(), (unsigned long long)r.bandSeed);
  printSweepNotes(r, stdout);
  return kExitOk;
}

}  // namespace barrow::cli
