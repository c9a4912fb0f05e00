#include "report/report_data.h"

#include <cmath>

#include "base/number_text.h"
#include "io/findings_json.h"
#include "io/sweep_csv.h"

namespace barrow {

namespace {

using ojson = nlohmann::ordered_json;

ojson number(double v) { return std::isfinite(v) ? ojson(v) : ojson(); }

ojson cloudJson(const ReportCloud& c) {
  ojson points = ojson::array();
  ojson weights = ojson::array();
  for (Eigen::Index i = 0; i < c.cloud.size(); ++i) {
    points.push_back({c.cloud.points(i, 0), c.cloud.points(i, 1)});
    weights.push_back(c.cloud.weights(i));
  }
  ojson o;
  o["name"] = c.cloud.name;
  o["file"] = c.file;
  o["sha256"] = c.sha256;
  o["points"] = std::move(points);
  o["weights"] = std::move(weights);
  return o;
}

ojson planJson(const std::vector<PlanEntry>& plan) {
  ojson list = ojson::array();
  for (const PlanEntry& e : plan) list.push_back({e.i, e.j, e.mass});
  return list;
}

ojson paramsJson(const ParamSet& p) {
  ojson o = ojson::object();
  for (const auto& [k, v] : p.values()) o[k] = v;
  return o;
}

// A CSV cell as JSON: the number it reads back to, "inf"/"-inf" kept as text (JSON has no
// infinity), null for an empty (failed) cell.
ojson cellJson(const std::string& c) {
  if (c.empty()) return ojson();
  if (c == "inf" || c == "-inf") return c;
  const auto v = parseNumber(c);
  return v ? ojson(*v) : ojson(c);
}

}  // namespace

nlohmann::ordered_json reportData(const ReportInput& in) {
  const SweepResult& r = in.sweep;
  const SweepSettings& s = r.settings;

  ojson clouds;
  clouds["A"] = cloudJson(in.a);
  clouds["B"] = cloudJson(in.b);
  ojson plan;
  plan["theta"] = s.referenceTheta();
  plan["cost"] = "w2";
  plan["entries"] = planJson(in.referencePlan);
  if (!in.referencePlanNote.empty()) plan["note"] = in.referencePlanNote;
  clouds["plan"] = std::move(plan);
  if (s.family == Family::Interpolate) clouds["interpolation_plan"] = planJson(in.familyPlan);

  ojson sweep;
  sweep["family"] = familyName(s.family);
  sweep["direction"] = {s.direction[0], s.direction[1]};
  sweep["center"] = s.center ? ojson({(*s.center)[0], (*s.center)[1]}) : ojson();
  sweep["pivot"] = {number(in.pivot.x()), number(in.pivot.y())};
  sweep["from"] = s.from;
  sweep["to"] = s.to;
  sweep["steps"] = s.steps;
  sweep["reference"] = s.referenceTheta();
  ojson ids = ojson::array();
  for (const auto& ser : r.series) ids.push_back(ser.id);
  sweep["measures"] = ids;
  sweep["threads"] = r.threads;
  sweep["warm_start"] = r.warmStart;
  sweep["refine_tolerance"] = r.refineTolerance;
  sweep["refined_points"] = r.refinedPoints;
  sweep["refine_budget"] = r.refineBudget;
  sweep["refine_budget_hit"] = r.refineBudgetHit;
  sweep["seconds"] = r.seconds;
  ojson frozen = ojson::object(), rules = ojson::object(), gradient = ojson::object();
  for (const auto& ser : r.series) {
    frozen[ser.id] = paramsJson(ser.frozen);
    rules[ser.id] = paramsJson(ser.rules);
    gradient[ser.id] = ser.gradientMethod;
  }

  ojson settings;
  settings["title"] = in.title;
  settings["created"] = in.created;
  settings["barrow_version"] = in.version;
  settings["session"] = in.sessionFile;
  settings["params"] = paramsJson(in.params);
  settings["sweep"] = std::move(sweep);
  settings["frozen"] = std::move(frozen);
  settings["rules"] = std::move(rules);
  settings["gradient"] = std::move(gradient);
  settings["commands"] = in.commands;

  const SweepTable t = sweepTable(r);
  ojson rows = ojson::array();
  for (const auto& row : t.rows) {
    ojson jr = ojson::array();
    for (const auto& c : row) jr.push_back(cellJson(c));
    rows.push_back(std::move(jr));
  }
  ojson table;
  table["columns"] = t.columns;
  table["rows"] = std::move(rows);

  ojson out;
  out["clouds"] = std::move(clouds);
  out["settings"] = std::move(settings);
  out["measures"] = ojson::parse(in.measures.dump());  // keep measure --json's key order
  out["sweep"] = std::move(table);
  out["findings"] = findingsToJson(in.findings)["findings"];
  return out;
}

std::string scriptSafeJson(const nlohmann::ordered_json& j) {
  const std::string text = j.dump(-1, ' ', false, nlohmann::ordered_json::error_handler_t::replace);
  std::string out;
  out.reserve(text.size() + text.size() / 64);
  for (std::size_t k = 0; k < text.size(); ++k) {
    const char c = text[k];
    if (c == '<') out += "\\u003c";
    else if (c == '>') out += "\\u003e";
    else if (c == '&') out += "\\u0026";
    else if (c == '\xE2' && k + 2 < text.size() && text[k + 1] == '\x80' && (text[k + 2] == '\xA8' || text[k + 2] == '\xA9')) {
      out += text[k + 2] == '\xA8' ? "\\u2028" : "\\u2029";
      k += 2;
    } else {
      out += c;
    }
  }
  return out;
}

}  // namespace barrow
