// File → Export report: the file is written off the GUI thread, holds the data block with the
// window's sweep (or one run for the export when none is current), and can be cancelled. The
// report's colours are the window's.
#include <gtest/gtest.h>

#include <map>
#include <sstream>

#include <QSignalSpy>
#include <nlohmann/json.hpp>

#include "measures/registry.h"
#include "palette.h"
#include "report/report_palette.h"
#include "report_export.h"
#include "scenario/demo_scenario.h"
#include "support/test_support.h"
#include "sweep_panel.h"
#include "sweep_runner.h"
#include "ui_test_support.h"

namespace barrow::ui {
namespace {

using test::makeWindow;
using test::waitIdle;

nlohmann::json dataBlock(const std::string& html) {
  const std::string open = "<script type=\"application/json\" id=\"barrow-report-data\">";
  const auto p = html.find(open);
  if (p == std::string::npos) return {};
  const auto q = html.find("</script>", p);
  return nlohmann::json::parse(html.substr(p + open.size(), q - p - open.size()));
}

// Waits for the export's end; returns its error text ("" on success).
QString waitExport(MainWindow& w) {
  QSignalSpy done(w.reportExport(), &ReportExport::finished);
  if (!done.wait(120000)) return "timed out";
  return done.takeFirst().at(1).toString();
}

TEST(ReportExportTest, WritesTheFileWithTheWindowsSweep) {
  Session s = demoSession();
  s.sweep.steps = 9;
  s.selected = {"w2", "js"};
  auto w = makeWindow(s);
  w->sweep()->run();
  ASSERT_TRUE(waitIdle(*w));
  const std::string path = barrow::test::tempPath("window-report.html");
  w->exportReport(QString::fromStdString(path));
  EXPECT_TRUE(w->reportExport()->running());  // the GUI thread returned at once
  ASSERT_EQ(waitExport(*w), QString());
  const auto data = dataBlock(barrow::test::readText(path));
  ASSERT_TRUE(data.is_object());
  // The table is the window's sweep: its CSV header and its number of θ values.
  const std::string csv = w->sweep()->toCsv();
  std::vector<std::string> header;
  for (const auto& c : data["sweep"]["columns"]) header.push_back(c.get<std::string>());
  std::string joined;
  for (const auto& h : header) joined += (joined.empty() ? "" : ",") + h;
  std::vector<std::string> table;  // the CSV without its "#" settings lines
  std::istringstream in(csv);
  for (std::string line; std::getline(in, line);)
    if (line.empty() || line[0] != '#') table.push_back(line);
  ASSERT_FALSE(table.empty());
  EXPECT_EQ(joined, table.front());
  EXPECT_EQ(data["sweep"]["rows"].size() + 1, table.size());
  EXPECT_EQ(data["findings"].size(), 2u);
  EXPECT_EQ(data["clouds"]["A"]["points"].size(), std::size_t(s.a.size()));
}

TEST(ReportExportTest, RunsTheSweepWhenNoneIsCurrentAndCanBeCancelled) {
  Session s = demoSession();
  s.sweep.steps = 7;
  s.selected = {"energy"};
  auto w = makeWindow(s);
  ASSERT_TRUE(waitIdle(*w));
  const std::string path = barrow::test::tempPath("window-report-fresh.html");
  w->exportReport(QString::fromStdString(path));
  ASSERT_EQ(waitExport(*w), QString());
  const auto data = dataBlock(barrow::test::readText(path));
  EXPECT_EQ(data["sweep"]["columns"], nlohmann::json({"theta", "energy", "d_energy"}));
  EXPECT_GE(data["sweep"]["rows"].size(), 7u);

  // Cancelled at once: nothing is written.
  s.sweep.steps = 400;
  s.selected = {};
  w->setSession(s);
  ASSERT_TRUE(waitIdle(*w));
  const std::string cancelled = barrow::test::tempPath("window-report-cancelled.html");
  w->exportReport(QString::fromStdString(cancelled));
  w->reportExport()->cancel();
  EXPECT_EQ(waitExport(*w), QString("cancelled"));
  EXPECT_FALSE(QFile::exists(QString::fromStdString(cancelled)));
}

// [D] ui/palette.h is the source of the report's colours: the curves in registry order, A, B.
TEST(ReportExportTest, ReportColoursAreTheWindows) {
  const std::map<Qt::PenStyle, std::string> svgDash = {
      {Qt::SolidLine, ""}, {Qt::DashLine, "6 4"}, {Qt::DotLine, "1.5 3"}, {Qt::DashDotLine, "6 3 1.5 3"}};
  for (std::size_t k = 0; k < MeasureRegistry::instance().all().size(); ++k) {
    const QPen pen = palette::curvePen(int(k), 1.8, palette::Scheme::Light);  // the page is white
    EXPECT_EQ(pen.color().name().toStdString(), report_palette::curveColor(k)) << k;
    ASSERT_TRUE(svgDash.count(pen.style())) << k;
    EXPECT_EQ(svgDash.at(pen.style()), report_palette::curveDash(k)) << k;
  }
  EXPECT_EQ(palette::cloudA().name().toStdString(), report_palette::kCloudA);
  EXPECT_EQ(palette::cloudB().name().toStdString(), report_palette::kCloudB);
  EXPECT_EQ(palette::jump().name().toStdString(), report_palette::kJump);
  EXPECT_EQ(QColor(palette::flat().rgb()).name().toStdString(), report_palette::kFlat);
}

}  // namespace
}  // namespace barrow::ui
