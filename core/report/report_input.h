// Everything a report shows, gathered before the page is written (report_build.h gathers it
// from clouds and a sweep; report_html.h writes it). Plain data: the writer computes nothing.
#pragma once

#include <Eigen/Core>
#include <nlohmann/json.hpp>
#include <string>
#include <vector>

#include "cloud/cloud.h"
#include "base/params.h"
#include "measures/result.h"
#include "sweep/findings.h"
#include "sweep/sweep_result.h"

namespace barrow {

struct ReportCloud {
  Cloud cloud;
  std::string file;    // the path it was read from; "" when it came from a session
  std::string sha256;  // of the cloud as CSV text (formatCloudCsv), hex
};

struct ReportInput {
  std::string title;        // the scenario's name (user text: escaped on output)
  std::string created;      // UTC, ISO 8601
  std::string version;      // Barrow's version
  std::string sessionFile;  // the session the report was made from, "" when from cloud files
  ReportCloud a, b;
  ParamSet params;          // the user's settings (group.key = value), as given
  SweepResult sweep;
  std::vector<Finding> findings;
  nlohmann::json measures = nlohmann::json::array();  // rows of `measure --json` (A as given vs B)
  std::vector<PlanEntry> referencePlan;  // exact W2 plan between A at the reference θ and B
  std::string referencePlanNote;         // why there is none, when empty
  std::vector<PlanEntry> familyPlan;     // the plan `interpolate` moves A along (else empty)
  Eigen::Vector2d pivot{0.0, 0.0};       // rotate/scale pivot as the family map uses it
  std::vector<std::string> commands;     // barrow-cli lines that reproduce the numbers
};

}  // namespace barrow
