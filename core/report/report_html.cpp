#include "report/report_html.h"

#include <cmath>
#include <set>
#include <sstream>

#include "io/atomic_write.h"
#include "measures/details_text.h"
#include "base/number_text.h"
#include "measures/registry.h"
#include "report/html_text.h"
#include "report/report_data.h"
#include "report/report_palette.h"

namespace barrow {

namespace {

using ojson = nlohmann::ordered_json;

std::size_t rankOf(const std::string& id) {
  const auto& all = MeasureRegistry::instance().all();
  for (std::size_t k = 0; k < all.size(); ++k)
    if (all[k]->id() == id) return k;
  return all.size();
}

std::string nameOf(const std::string& id) {
  const Measure* m = MeasureRegistry::instance().find(id);
  return m ? m->displayName() : id;
}

std::string num(double v) {
  if (std::isnan(v)) return "—";
  if (std::isinf(v)) return v > 0 ? "+∞" : "−∞";
  return sixDigits(v);
}

std::string point(double x, double y) { return "(" + sixDigits(x) + ", " + sixDigits(y) + ")"; }

std::string swatch(const std::string& id) {
  const std::size_t k = rankOf(id);
  const std::string dash = report_palette::curveDash(k);
  return std::string("<svg class=\"swatch\" width=\"22\" height=\"10\" aria-hidden=\"true\"><line x1=\"1\" y1=\"5\" "
                     "x2=\"21\" y2=\"5\" stroke=\"") +
         report_palette::curveColor(k) + "\" stroke-width=\"2.4\"" +
         (dash.empty() ? "" : " stroke-dasharray=\"" + dash + "\"") + "/></svg>";
}

// What the family does to A, in words (θ's meaning included).
std::string familyWords(const SweepSettings& s, const Eigen::Vector2d& pivot) {
  if (s.family == Family::Shift)
    return "shifting A along the direction " + point(s.direction[0], s.direction[1]) + " by the distance θ";
  if (s.family == Family::Rotate) return "rotating A about " + point(pivot.x(), pivot.y()) + " by θ degrees";
  if (s.family == Family::Scale) return "scaling A about " + point(pivot.x(), pivot.y()) + " by the factor θ";
  if (s.family == Family::Interpolate)
    return "moving A towards B along the exact W2 plan (displacement interpolation, θ = t)";
  if (s.family == Family::Mix) return "mixing A with B, (1−θ)·A + θ·B";
  return "the family '" + familyName(s.family) + "'";
}

std::string cloudLabel(const ReportCloud& c, const char* role) {
  return c.cloud.name.empty() ? std::string(role) : c.cloud.name;
}

void header(std::ostringstream& o, const ReportInput& in) {
  const SweepSettings& s = in.sweep.settings;
  o << "<header class=\"top\">\n<p class=\"kicker\">Barrow report</p>\n<h1>" << htmlText(in.title) << "</h1>\n";
  o << "<p class=\"lede\">Compares cloud A, <q>" << htmlText(cloudLabel(in.a, "A")) << "</q> ("
    << in.a.cloud.size() << (in.a.cloud.size() == 1 ? " point" : " points") << "), with cloud B, <q>"
    << htmlText(cloudLabel(in.b, "B")) << "</q> (" << in.b.cloud.size()
    << (in.b.cloud.size() == 1 ? " point" : " points") << "), under " << in.sweep.series.size()
    << (in.sweep.series.size() == 1 ? " measure" : " measures") << ", " << htmlText(familyWords(s, in.pivot))
    << " for θ from " << num(s.from) << " to " << num(s.to) << ".</p>\n";
  o << "<dl class=\"meta\"><div><dt>Written</dt><dd>" << htmlText(in.created) << "</dd></div>"
    << "<div><dt>Barrow</dt><dd>" << htmlText(in.version) << "</dd></div>";
  if (!in.sessionFile.empty())
    o << "<div><dt>Session</dt><dd><code>" << htmlText(in.sessionFile) << "</code></dd></div>";
  o << "</dl>\n";
  o << "<table class=\"files\"><thead><tr><th>Cloud</th><th>Name</th><th>File</th><th class=\"n\">Points</th>"
       "<th>SHA-256 of the cloud as CSV</th></tr></thead><tbody>\n";
  for (const auto* c : {&in.a, &in.b}) {
    const bool isA = c == &in.a;
    o << "<tr><td><span class=\"mark " << (isA ? "mark-a" : "mark-b") << "\" aria-hidden=\"true\"></span>"
      << (isA ? "A" : "B") << "</td><td>" << htmlText(c->cloud.name) << "</td><td><code>"
      << htmlText(c->file.empty() ? "(inside the session)" : c->file) << "</code></td><td class=\"n\">"
      << c->cloud.size() << "</td><td><code class=\"hash\" title=\"" << htmlText(c->sha256) << "\">"
      << htmlText(c->sha256.substr(0, 16)) << "…</code></td></tr>\n";
  }
  o << "</tbody></table>\n</header>\n";
}

void explorer(std::ostringstream& o, const ReportInput& in) {
  const SweepSettings& s = in.sweep.settings;
  o << "<section id=\"sweep\" aria-labelledby=\"sweep-h\">\n<h2 id=\"sweep-h\">A along θ</h2>\n";
  o << "<p class=\"note screen-only\">Move θ with the slider (arrow keys, Page Up/Down, Home/End) or by clicking the curves. "
       "A moves exactly as the sweep moved it; every number shown is the sweep's own value at the "
       "nearest θ it computed. The plan is the exact W2 plan at the reference θ = "
    << num(s.referenceTheta()) << ".</p>\n";
  o << "<p class=\"note print-only\">The figures show A at the reference θ = " << num(s.referenceTheta())
    << " with the exact W2 plan there; the table under them reads every measure out at that θ.</p>\n";
  o << "<noscript><p class=\"warn\">The figures and the θ slider need JavaScript; the tables below do not.</p></noscript>\n";
  o << "<div class=\"explorer\">\n"
       "<figure class=\"fig clouds\"><svg id=\"cloud-fig\" role=\"img\" aria-label=\"The two clouds\"></svg>"
       "<figcaption id=\"cloud-legend\"></figcaption></figure>\n"
       "<figure class=\"fig curves\"><svg id=\"curve-fig\" role=\"img\" aria-label=\"Every measure against θ\"></svg>"
       "<figcaption id=\"curve-legend\"></figcaption></figure>\n</div>\n";
  o << "<div class=\"controls\" id=\"controls\">\n"
       "<label class=\"slider\" for=\"theta\"><span>θ</span>"
       "<input type=\"range\" id=\"theta\" min=\"0\" max=\"0\" step=\"1\" value=\"0\"></label>\n"
       "<output id=\"theta-out\" for=\"theta\" aria-live=\"polite\"></output>\n"
       "<button type=\"button\" id=\"to-reference\">Reference θ</button>\n"
       "<label class=\"toggle\"><input type=\"checkbox\" id=\"normalise\" checked> Normalised to [0, 1]</label>\n"
       "</div>\n";
  o << "<table class=\"readout\" id=\"readout\"><thead><tr><th>Measure</th><th class=\"n\">D(A<sub>θ</sub>, B)</th>"
       "<th class=\"n\">dD/dθ</th><th>At this θ</th></tr></thead><tbody></tbody></table>\n</section>\n";
}

std::string settingsWords(const nlohmann::json& details) {
  std::string out;
  for (const auto& item : detailItems(details)) out += (out.empty() ? "" : "; ") + item;
  return out.empty() ? "—" : out;
}

void measuresTable(std::ostringstream& o, const ReportInput& in) {
  bool interval = false, pvalue = false;
  for (const auto& row : in.measures) {
    interval = interval || (row.contains("low") && row.contains("high"));
    pvalue = pvalue || row.contains("p_value");
  }
  o << "<section id=\"measures\" aria-labelledby=\"measures-h\">\n<h2 id=\"measures-h\">Measures of A as given against B</h2>\n";
  o << "<table class=\"measures\"><thead><tr><th>Measure</th><th class=\"n\">Value</th><th>Status</th>";
  if (interval) o << "<th class=\"n\">Interval</th>";
  if (pvalue) o << "<th class=\"n\">p-value</th>";
  o << "<th>Settings used</th><th class=\"n\">Time</th></tr></thead><tbody>\n";
  for (const auto& row : in.measures) {
    const std::string id = row.value("id", "");
    const std::string status = row.value("status", "");
    const double value = row["value"].is_number() ? row["value"].get<double>()
                         : status == "infinite"   ? INFINITY
                                                  : NAN;
    o << "<tr data-id=\"" << htmlText(id) << "\"><td>" << swatch(id) << htmlText(row.value("name", id))
      << " <code>" << htmlText(id) << "</code></td><td class=\"n\">" << num(value) << "</td><td><span class=\"status s-"
      << htmlText(status) << "\">" << htmlText(status) << "</span>";
    if (row.contains("message")) o << "<div class=\"msg\">" << htmlText(row["message"].get<std::string>()) << "</div>";
    o << "</td>";
    auto numberAt = [&](const char* key) {
      return row.contains(key) && row[key].is_number() ? row[key].get<double>() : NAN;
    };
    if (interval)
      o << "<td class=\"n\">" << (row.contains("low") ? "[" + num(numberAt("low")) + ", " + num(numberAt("high")) + "]" : "—")
        << "</td>";
    if (pvalue) o << "<td class=\"n\">" << num(numberAt("p_value")) << "</td>";
    o << "<td class=\"settings\">" << htmlText(settingsWords(row.contains("details") ? row["details"] : nlohmann::json::object()))
      << "</td><td class=\"n\">" << sixDigits(1e3 * row.value("seconds", 0.0)) << " ms</td></tr>\n";
  }
  o << "</tbody></table>\n</section>\n";
}

void findingsList(std::ostringstream& o, const ReportInput& in) {
  o << "<section id=\"findings\" aria-labelledby=\"findings-h\">\n<h2 id=\"findings-h\">Findings</h2>\n";
  if (in.findings.empty()) o << "<p>No findings: the sweep produced no series.</p>\n";
  o << "<ul class=\"findings\">\n";
  for (const Finding& f : in.findings) {
    const bool flat = !f.flat.empty();
    o << "<li class=\"" << (f.continuous ? (flat ? "v-flat" : "v-ok") : "v-jump") << "\" data-id=\"" << htmlText(f.id)
      << "\"><div class=\"f-head\">" << swatch(f.id) << "<strong>"
      << htmlText(nameOf(f.id)) << "</strong> <code>" << htmlText(f.id) << "</code>"
      << "<span class=\"chip " << (f.continuous ? "ok" : "bad") << "\">"
      << (f.continuous ? "continuous" : !f.jumps.empty() ? "jumps" : "unresolved") << "</span>";
    if (flat) o << "<span class=\"chip flat\">flat stretches</span>";
    o << "</div>\n<p>" << htmlText(f.summary) << "</p>\n<p class=\"f-facts\">";
    if (!f.jumps.empty()) {
      o << "Jumps at ";
      for (std::size_t k = 0; k < f.jumps.size(); ++k)
        o << (k ? ", " : "") << "θ ≈ " << num(f.jumps[k].theta) << " (size " << num(f.jumps[k].size) << ")";
      o << ". ";
    }
    if (!f.unresolved.empty()) {
      o << "Unresolved (jump-like, not confirmed at the resolution) at ";
      for (std::size_t k = 0; k < f.unresolved.size(); ++k) o << (k ? ", " : "") << "θ ≈ " << num(f.unresolved[k].theta);
      o << ". ";
    }
    if (flat) {
      o << "No gradient on ";
      for (std::size_t k = 0; k < f.flat.size(); ++k)
        o << (k ? ", " : "") << "[" << num(f.flat[k].first) << ", " << num(f.flat[k].second) << "]";
      o << ". ";
    }
    o << "Lipschitz estimate " << num(f.lipschitz) << "; "
      << (f.monotone ? "grows away from its best θ on both sides." : "does not grow steadily away from its best θ.")
      << "</p></li>\n";
  }
  o << "</ul>\n</section>\n";
}

void cautions(std::ostringstream& o, const ReportInput& in) {
  const SweepResult& r = in.sweep;
  o << "<section id=\"cautions\" aria-labelledby=\"cautions-h\">\n<h2 id=\"cautions-h\">Read with care</h2>\n<ul class=\"cautions\">\n";
  o << "<li><strong>Estimates from samples.</strong> Every value is computed from the finite clouds A and B. "
       "Another sample of the same distributions gives other numbers; small differences between measures or "
       "between θ values may be sampling noise.</li>\n";
  o << "<li><strong>Settings matter.</strong> ε, the kernel bandwidth σ, the number of slicing directions, the "
       "density estimator and its bin width, bandwidth or k all change the values, sometimes by a lot. The settings "
       "used are listed beside every value. Settings that depend on the data were fixed once at the reference θ = "
    << num(r.settings.referenceTheta()) << " and kept for the whole sweep.</li>\n";
  bool density = false;
  for (const auto& s : r.series)
    density = density || s.id == "kl_ab" || s.id == "kl_ba" || s.id == "js" || s.id == "tv" || s.id == "hellinger";
  if (density)
    o << "<li><strong>Divergences compare density estimates.</strong> KL, Jensen–Shannon, total variation and "
         "Hellinger are computed between densities estimated from the points, not between the clouds themselves; "
         "KL is +∞ where an estimate of one density is zero and the other is not.</li>\n";
  o << "<li><strong>A grid of θ.</strong> The sweep computed " << r.theta.size() << " values of θ";
  if (r.refinedPoints > 0) o << " (" << r.refinedPoints << " of them added near suspected jumps)";
  o << ". A change narrower than the spacing can be missed, and the findings use thresholds relative to each "
       "measure's range.";
  if (r.refineTolerance == 0.0)
    o << " Refinement was off, so a reported jump may be a steep but continuous change.";
  if (r.refineBudgetHit) o << " Refinement stopped at its point budget before its tolerance.";
  o << "</li>\n";
  for (const auto& s : r.series) {
    std::size_t failed = 0;
    for (Status st : s.status) failed += !usable(st);
    if (failed > 0)
      o << "<li><strong>" << htmlText(s.id) << " failed at " << failed << " of " << s.status.size()
        << " θ values</strong>: " << htmlText(s.message) << "</li>\n";
  }
  if (r.cancelled) o << "<li><strong>The sweep was cancelled</strong>; the curves stop where it stopped.</li>\n";
  o << "</ul>\n</section>\n";
}

void reproduce(std::ostringstream& o, const ReportInput& in) {
  o << "<section id=\"reproduce\" aria-labelledby=\"reproduce-h\">\n<h2 id=\"reproduce-h\">Reproduce these numbers</h2>\n";
  o << "<p>With Barrow " << htmlText(in.version) << " installed, these commands recompute the tables and the sweep";
  if (in.a.file.empty() || in.b.file.empty())
    o << " (the clouds came from a session: save them as CSV with the buttons below first)";
  o << ":</p>\n<pre class=\"commands\"><code>";
  for (const auto& line : in.commands) o << htmlText(line) << "\n";
  o << "</code></pre>\n<p class=\"saves\"><button type=\"button\" data-save=\"A\">Save A as CSV</button> "
       "<button type=\"button\" data-save=\"B\">Save B as CSV</button> "
       "<button type=\"button\" data-save=\"sweep\">Save the sweep table as CSV</button></p>\n";
  o << "<p class=\"note\">The numbers are also inside this file as JSON, in the element "
       "<code>script#barrow-report-data</code> (keys clouds, settings, measures, sweep, findings).</p>\n</section>\n";
}

ojson viewJson(const ReportInput& in) {
  ojson v;
  ojson rank = ojson::object(), names = ojson::object();
  for (const auto& s : in.sweep.series) {
    rank[s.id] = rankOf(s.id);
    names[s.id] = nameOf(s.id);
  }
  v["rank"] = std::move(rank);
  v["names"] = std::move(names);
  v["colors"] = {{"A", report_palette::kCloudA}, {"B", report_palette::kCloudB}, {"plan", report_palette::kPlan},
                 {"jump", report_palette::kJump}, {"flat", report_palette::kFlat}};
  v["curves"] = report_palette::kCurves;
  v["dashes"] = report_palette::kDashes;
  return v;
}

}  // namespace

std::string formatReportHtml(const ReportInput& in) {
  std::ostringstream o;
  o << "<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n"
       "<meta name=\"viewport\" content=\"width=device-width, initial-scale=1\">\n"
       // Nothing may be fetched: no network, no other file. Inline style and script only.
       "<meta http-equiv=\"Content-Security-Policy\" content=\"default-src 'none'; style-src 'unsafe-inline'; "
       "script-src 'unsafe-inline'; img-src data:\">\n"
       "<meta name=\"generator\" content=\"Barrow "
    << htmlText(in.version) << "\">\n<title>" << htmlText(in.title) << " — Barrow report</title>\n<style>\n"
    << reportPageStyle() << "</style>\n</head>\n<body>\n";
  header(o, in);
  o << "<nav class=\"toc\" aria-label=\"Contents\"><a href=\"#sweep\">A along θ</a><a href=\"#measures\">Measures</a>"
       "<a href=\"#findings\">Findings</a><a href=\"#cautions\">Read with care</a><a href=\"#reproduce\">Reproduce</a></nav>\n";
  o << "<main>\n";
  explorer(o, in);
  measuresTable(o, in);
  findingsList(o, in);
  cautions(o, in);
  reproduce(o, in);
  o << "</main>\n<footer>Written by Barrow " << htmlText(in.version) << " on " << htmlText(in.created)
    << ". This file is complete on its own: it loads nothing.</footer>\n";
  o << "<script type=\"application/json\" id=\"barrow-report-data\">" << scriptSafeJson(reportData(in)) << "</script>\n";
  o << "<script type=\"application/json\" id=\"barrow-report-view\">" << scriptSafeJson(viewJson(in)) << "</script>\n";
  o << "<script>\n" << reportPageScript() << "</script>\n</body>\n</html>\n";
  return o.str();
}

std::optional<std::string> writeReportHtml(const std::string& path, const ReportInput& in) {
  return atomicWriteFile(path, formatReportHtml(in));
}

}  // namespace barrow
