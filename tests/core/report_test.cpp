// The report: its data block carries the sweep CSV's cells and the findings JSON unchanged,
// no user string can end a <script> element or become markup, and the page names every
// input. The browser checks of the page itself are in tests/report/.
#include <gtest/gtest.h>

#include <cmath>
#include <sstream>

#include "measures/registry.h"
#include "report/html_text.h"
#include "report/report_build.h"
#include "report/report_data.h"
#include "report/report_html.h"
#include "support/test_support.h"
#include "sweep/continuity.h"
#include "io/findings_json.h"
#include "io/sweep_csv.h"
#include "sweep/sweep_engine.h"

namespace barrow {
namespace {

const std::string kHostile1 = "<script>alert(1)</script>";
const std::string kHostile2 = "</script><img src=x onerror=alert(2)>";

ReportInput smallReport(const std::string& nameA, const std::string& title) {
  Cloud a = test::gaussianCloud(30, 11, 0.0, 1.0);
  Cloud b = test::gaussianCloud(25, 12, 0.8, 1.0);
  a.name = nameA;
  b.name = "B & co \u2028 line";
  SweepRequest req;
  req.settings.family = Family::Shift;
  req.settings.from = -1;
  req.settings.to = 1;
  req.settings.steps = 9;
  req.settings.measures = {"w2", "mmd", "kl_ab"};
  req.threads = 1;
  SweepResult r = runSweep(a, b, req);
  ReportSources src;
  src.title = title;
  src.fileA = "dir/" + nameA + ".csv";
  src.fileB = "b.csv";
  auto findings = findContinuity(r);
  return gatherReport(a, b, src, std::move(r), std::move(findings));
}

std::string dataBlock(const std::string& html) {
  const std::string open = "<script type=\"application/json\" id=\"barrow-report-data\">";
  const auto p = html.find(open);
  if (p == std::string::npos) return {};
  const auto q = html.find("</script>", p);
  return html.substr(p + open.size(), q - p - open.size());
}

std::size_t count(const std::string& s, const std::string& what) {
  std::size_t n = 0;
  for (auto p = s.find(what); p != std::string::npos; p = s.find(what, p + 1)) ++n;
  return n;
}

// [D] The five keys of the contract; the sweep rows are the CSV's cells (number, "inf" or
// null for an empty cell) and the findings are those of findings --json.
TEST(ReportDataTest, CarriesTheSweepCsvCellsAndTheFindingsJson) {
  const ReportInput in = smallReport("a", "t");
  const auto data = reportData(in);
  std::vector<std::string> keys;
  for (const auto& [k, v] : data.items()) keys.push_back(k);
  EXPECT_EQ(keys, (std::vector<std::string>{"clouds", "settings", "measures", "sweep", "findings"}));

  const SweepTable t = sweepTable(in.sweep);
  ASSERT_EQ(data["sweep"]["columns"].get<std::vector<std::string>>(), t.columns);
  ASSERT_EQ(data["sweep"]["rows"].size(), t.rows.size());
  bool sawInf = false;
  for (std::size_t k = 0; k < t.rows.size(); ++k)
    for (std::size_t c = 0; c < t.columns.size(); ++c) {
      const auto& cell = data["sweep"]["rows"][k][c];
      const std::string& text = t.rows[k][c];
      if (text.empty()) EXPECT_TRUE(cell.is_null());
      else if (text == "inf") {
        sawInf = true;
        EXPECT_EQ(cell, "inf");
      }
      else EXPECT_EQ(cell.get<double>(), std::stod(text)) << t.columns[c] << " row " << k;
    }
  EXPECT_TRUE(sawInf) << "KL between shifted Gaussians on a histogram should meet +inf somewhere";
  EXPECT_EQ(data["findings"].dump(), findingsToJson(in.findings)["findings"].dump());
  ASSERT_EQ(data["measures"].size(), 3u);
  EXPECT_EQ(data["measures"][0]["id"], "w2");
  EXPECT_EQ(data["clouds"]["A"]["points"].size(), 30u);
  EXPECT_EQ(data["clouds"]["A"]["sha256"].get<std::string>(), cloudHash(in.a.cloud));
  EXPECT_FALSE(data["clouds"]["plan"]["entries"].empty());
}

// [D] After escaping, no '<', '>' or '&' and no raw U+2028/2029 are left, and parsing gives
// back every string exactly.
TEST(ReportDataTest, ScriptSafeJsonCannotCloseTheScriptElement) {
  nlohmann::ordered_json j;
  j["a"] = kHostile1;
  j["b"] = kHostile2;
  j["c"] = "<!-- & \u2028\u2029 -->";
  const std::string text = scriptSafeJson(j);
  for (const char* bad : {"<", ">", "&", "\u2028", "\u2029"}) EXPECT_EQ(text.find(bad), std::string::npos) << bad;
  EXPECT_EQ(nlohmann::ordered_json::parse(text), j);
}

// [D] The five HTML special characters become references; other text is unchanged.
TEST(ReportHtmlTest, HtmlTextEscapesTheFiveSpecialCharacters) {
  EXPECT_EQ(htmlText("a<b>&\"'c"), "a&lt;b&gt;&amp;&quot;&#39;c");
  EXPECT_EQ(htmlText("θ ∞"), "θ ∞");
}

// [D] Hostile names and titles appear only as text: the page has exactly its three script
// elements and no <img>; the data block still parses and holds the names unchanged.
TEST(ReportHtmlTest, UserStringsNeverBecomeMarkup) {
  const ReportInput in = smallReport(kHostile1, kHostile2);
  const std::string html = formatReportHtml(in);
  EXPECT_EQ(count(html, "<script"), 3u);
  EXPECT_EQ(count(html, "</script>"), 3u);
  EXPECT_EQ(html.find("<img"), std::string::npos);
  EXPECT_NE(html.find("&lt;script&gt;alert(1)&lt;/script&gt;"), std::string::npos);
  const auto data = nlohmann::json::parse(dataBlock(html));
  EXPECT_EQ(data["clouds"]["A"]["name"], kHostile1);
  EXPECT_EQ(data["settings"]["title"], kHostile2);
  EXPECT_EQ(data["clouds"]["B"]["name"], "B & co \u2028 line");
}

// [D] The reproducing lines name the inputs, every measure and every setting that changes
// the numbers, with shell quoting where a path needs it.
TEST(ReportBuildTest, CommandsNameInputsMeasuresAndSettings) {
  ReportSources src;
  src.fileA = "my clouds/a.csv";
  src.fileB = "b.csv";
  src.params.set("mmd.sigma", "0.5");
  SweepResult r;
  r.settings.family = Family::Rotate;
  r.settings.center = std::array<double, 2>{1, 2};
  r.settings.from = -90;
  r.settings.to = 90;
  r.settings.steps = 37;
  r.threads = 2;
  SweepSeries s;
  s.id = "mmd";
  r.series.push_back(s);
  const auto lines = reproduceCommands(src, r);
  ASSERT_EQ(lines.size(), 4u);
  EXPECT_EQ(lines[0], "barrow-cli measure --a 'my clouds/a.csv' --b b.csv --measures mmd --set mmd.sigma=0.5 --json");
  EXPECT_EQ(lines[1],
            "barrow-cli sweep --a 'my clouds/a.csv' --b b.csv --family rotate --center 1,2 --from -90 --to 90 "
            "--steps 37 --measures mmd --set mmd.sigma=0.5 --threads 2 --no-refine --out sweep.csv");
  EXPECT_EQ(lines[2], "barrow-cli findings --sweep sweep.csv --json");
  EXPECT_EQ(lines[3].rfind("barrow-cli report --a 'my clouds/a.csv'", 0), 0u);
}

}  // namespace
}  // namespace barrow
