#include "report/report_build.h"

#include <ctime>

#include "families/family_map.h"
#include "io/csv_io.h"
#include "measures/evaluate.h"
#include "measures/measure_json.h"
#include "base/number_text.h"
#include "measures/registry.h"
#include "report/sha256.h"

#ifndef BARROW_VERSION
#define BARROW_VERSION "unknown"
#endif

namespace barrow {

namespace {

// Reports the fraction done and asks whether to stop (RunControl::shouldStop).
bool stopAt(const RunControl* c, double fraction) { return c && c->shouldStop(fraction); }

// A shell word: left bare when it has only safe characters, else single-quoted.
std::string shellWord(const std::string& s) {
  bool safe = !s.empty();
  for (char c : s)
    safe = safe && (std::isalnum(static_cast<unsigned char>(c)) || std::string("_./,=:+-@%").find(c) != std::string::npos);
  if (safe) return s;
  std::string out = "'";
  for (char c : s) out += c == '\'' ? std::string("'\\''") : std::string(1, c);
  return out + "'";
}

std::string joinedIds(const SweepResult& r) {
  std::string s;
  for (const auto& ser : r.series) s += (s.empty() ? "" : ",") + ser.id;
  return s;
}

}  // namespace

std::string cloudHash(const Cloud& c) { return sha256Hex(formatCloudCsv(c)); }

std::string utcNow() {
  const std::time_t t = std::time(nullptr);
  std::tm tm{};
  gmtime_r(&t, &tm);
  char buf[32];
  std::strftime(buf, sizeof buf, "%Y-%m-%dT%H:%M:%SZ", &tm);
  return buf;
}

std::vector<std::string> reproduceCommands(const ReportSources& src, const SweepResult& r) {
  const SweepSettings& s = r.settings;
  const std::string a = shellWord(src.fileA.empty() ? "A.csv" : src.fileA);
  const std::string b = shellWord(src.fileB.empty() ? "B.csv" : src.fileB);
  std::string sets;
  for (const auto& [k, v] : src.params.values()) sets += " --set " + shellWord(k + "=" + v);
  const std::string ids = joinedIds(r);

  std::string sweep = "barrow-cli sweep --a " + a + " --b " + b + " --family " + shellWord(familyName(s.family));
  if (s.family == Family::Shift) sweep += " --direction " + shellWord(shortestText(s.direction[0]) + "," + shortestText(s.direction[1]));
  if (s.center && (s.family == Family::Rotate || s.family == Family::Scale))
    sweep += " --center " + shellWord(shortestText((*s.center)[0]) + "," + shortestText((*s.center)[1]));
  sweep += " --from " + shellWord(shortestText(s.from)) + " --to " + shellWord(shortestText(s.to)) +
           " --steps " + std::to_string(s.steps);
  if (s.reference) sweep += " --reference " + shellWord(shortestText(*s.reference));
  sweep += " --measures " + ids + sets;
  if (r.threads > 0) sweep += " --threads " + std::to_string(r.threads);
  if (r.refineTolerance == 0.0) sweep += " --no-refine";
  else sweep += " --refine-budget " + std::to_string(r.refineBudget) + " --resolution " + shellWord(shortestText(r.refineTolerance));
  if (!r.warmStart) sweep += " --no-warm-start";

  std::vector<std::string> lines;
  lines.push_back("barrow-cli measure --a " + a + " --b " + b + " --measures " + ids + sets + " --json");
  lines.push_back(sweep + " --out sweep.csv");
  lines.push_back("barrow-cli findings --sweep sweep.csv --json");
  if (!src.sessionFile.empty())
    lines.push_back("barrow-cli report --session " + shellWord(src.sessionFile) + " --out " + shellWord(src.out));
  else
    lines.push_back(sweep.replace(0, std::string("barrow-cli sweep").size(), "barrow-cli report") + " --out " +
                    shellWord(src.out));
  return lines;
}

ReportInput gatherReport(const Cloud& a, const Cloud& b, const ReportSources& src, SweepResult sweep,
                         std::vector<Finding> findings, const RunControl* control, bool* cancelled) {
  if (cancelled) *cancelled = false;
  ReportInput in;
  const std::string nameA = a.name.empty() ? "A" : a.name, nameB = b.name.empty() ? "B" : b.name;
  in.title = src.title.empty() ? nameA + " against " + nameB : src.title;
  in.created = utcNow();
  in.version = BARROW_VERSION;
  in.sessionFile = src.sessionFile;
  in.a = {a, src.fileA, cloudHash(a)};
  in.b = {b, src.fileB, cloudHash(b)};
  in.params = src.params;
  in.commands = reproduceCommands(src, sweep);

  const SweepSettings& s = sweep.settings;
  const FamilyMap family(a, b, s);
  if (!family.error()) {
    in.pivot = family.center();
    in.familyPlan = family.plan();
  }

  EvalRequest req;
  req.params = src.params;
  req.control = control;
  const double parts = double(sweep.series.size() + 1);
  for (std::size_t k = 0; k < sweep.series.size(); ++k) {
    const auto& ser = sweep.series[k];
    if (stopAt(control, k / parts)) {
      if (cancelled) *cancelled = true;
      break;
    }
    if (const Measure* m = MeasureRegistry::instance().find(ser.id))
      in.measures.push_back(measureRowJson(*m, evaluateMeasure(*m, a, b, req), req.params));
  }

  if (family.error()) {
    in.referencePlanNote = "no plan: " + *family.error();
  } else if (const Measure* w2 = MeasureRegistry::instance().find("w2"); !w2) {
    in.referencePlanNote = "no plan: the w2 measure is not in this build";
  } else if (!stopAt(control, sweep.series.size() / parts)) {
    EvalRequest planReq;
    planReq.wantPlan = true;
    planReq.control = control;
    const Result r = evaluateMeasure(*w2, family.at(s.referenceTheta()), b, planReq);
    if (r.status == Status::Ok) in.referencePlan = r.plan;
    else in.referencePlanNote = "no plan: the exact W2 solve ended with status " + std::string(statusName(r.status)) +
                                (r.message.empty() ? "" : " (" + r.message + ")");
  }
  if (cancelled && stopAt(control, 1.0)) *cancelled = true;
  in.sweep = std::move(sweep);
  in.findings = std::move(findings);
  return in;
}

}  // namespace barrow
