// Gathers what a report shows from the clouds, the user's settings and a finished sweep:
// the Measures table (every swept measure on A as given against B, as `measure --json`
// prints it), the exact W2 plan at the reference θ, each cloud's content hash, the family's
// pivot and plan, and the barrow-cli lines that reproduce the numbers. The sweep itself is
// run by the caller (the CLI or the window), so its progress and cancel stay theirs.
#pragma once

#include <string>
#include <vector>

#include "cloud/cloud.h"
#include "base/params.h"
#include "base/run_control.h"
#include "report/report_input.h"
#include "sweep/findings.h"
#include "sweep/sweep_result.h"

namespace barrow {

struct ReportSources {
  std::string title;        // "" = "<A> against <B>"
  std::string sessionFile;  // the session the clouds came from, or ""
  std::string fileA;        // the cloud files, when the clouds came from files
  std::string fileB;
  std::string out = "report.html";  // where the report goes (for the reproducing command)
  ParamSet params;          // the user's settings as given
};

/// Evaluates the measures and the plan (both may take a while: `control` can cancel, in
/// which case the result's `measures` stops early and `cancelled` is set).
ReportInput gatherReport(const Cloud& a, const Cloud& b, const ReportSources& src, SweepResult sweep,
                         std::vector<Finding> findings, const RunControl* control = nullptr,
                         bool* cancelled = nullptr);

/// The barrow-cli lines that recompute the measures, the sweep and its findings, and the report.
std::vector<std::string> reproduceCommands(const ReportSources& src, const SweepResult& r);

/// SHA-256 of a cloud as CSV text (formatCloudCsv: x,y,w with round-trip digits).
std::string cloudHash(const Cloud& c);

/// Now, UTC, as "2026-12-03T23:01:00Z".
std::string utcNow();

}  // namespace barrow
