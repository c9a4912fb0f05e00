// Exports: figures as PNG (at the chosen pixel size), SVG and PDF (by their file
// signatures), the sweep as CSV with the header of the command-line contract, and clouds
// as CSV/.npy that read back to the same points.
#include <gtest/gtest.h>

#include <sstream>

#include <QImage>

#include "field_panel.h"
#include "figure_export.h"
#include "io/cloud_file.h"
#include "scenario/demo_scenario.h"
#include "session_files.h"
#include "support/test_support.h"
#include "sweep_panel.h"
#include "sweep_plots.h"
#include "sweep_runner.h"
#include "ui_test_support.h"

namespace barrow::ui {
namespace {

using test::makeWindow;
using test::sameCloud;
using test::waitIdle;

TEST(ExportTest, FieldFigureInThreeFormats) {
  auto w = makeWindow(demoSession());
  ASSERT_TRUE(waitIdle(*w));
  QCustomPlot* plot = w->field()->view()->plot();
  const QString png = QString::fromStdString(barrow::test::tempPath("field.png"));
  ASSERT_TRUE(exportPlot(plot, png, 640, 480).isEmpty());
  const QImage img(png);
  EXPECT_EQ(img.size(), QSize(640, 480));
  const QString svg = QString::fromStdString(barrow::test::tempPath("field.svg"));
  ASSERT_TRUE(exportPlot(plot, svg, 640, 480).isEmpty());
  EXPECT_NE(barrow::test::readText(svg.toStdString()).find("<svg"), std::string::npos);  // W3C SVG root
  const QString pdf = QString::fromStdString(barrow::test::tempPath("field.pdf"));
  ASSERT_TRUE(exportPlot(plot, pdf, 640, 480).isEmpty());
  EXPECT_EQ(barrow::test::readText(pdf.toStdString()).substr(0, 5), "%PDF-");  // ISO 32000 header
  // A name we cannot write, or a format we do not know, is a message naming the file.
  const QString bad = exportPlot(plot, "/nonexistent-folder/x.png", 640, 480);
  EXPECT_TRUE(bad.contains("/nonexistent-folder/x.png")) << bad.toStdString();
  EXPECT_FALSE(exportPlot(plot, QString::fromStdString(barrow::test::tempPath("f.bmpx")), 640, 480).isEmpty());
}

TEST(ExportTest, CloudsReadBackToTheSamePoints) {
  auto w = makeWindow(demoSession());
  for (const char* ext : {"csv", "npy"}) {
    const QString path = QString::fromStdString(barrow::test::tempPath(std::string("b.") + ext));
    ASSERT_TRUE(w->files()->exportCloud(path, Which::B).isEmpty());
    auto back = readCloudFile(path.toStdString());
    ASSERT_TRUE(back) << back.error.text();
    EXPECT_TRUE(sameCloud(*back.value, w->session().b)) << ext;
  }
  ASSERT_TRUE(waitIdle(*w));
}

TEST(ExportTest, SweepCsvFollowsTheCommandLineHeader) {
  Session s = demoSession();
  s.sweep.steps = 9;
  s.selected = {"js", "tv"};
  auto w = makeWindow(s);
  w->sweep()->run();
  ASSERT_TRUE(waitIdle(*w));
  const std::string csv = w->sweep()->toCsv();
  ASSERT_FALSE(csv.empty());
  // DEVELOPERS.md, Command-line contract: "#" settings lines, then theta,<id>,...,d_<id>,...
  std::istringstream in(csv);
  std::string line;
  std::size_t settings = 0, rows = 0;
  std::string header;
  while (std::getline(in, line)) {
    if (!line.empty() && line[0] == '#') {
      EXPECT_EQ(rows, 0u) << "a settings line after the table: " << line;
      ++settings;
    } else if (header.empty()) {
      header = line;
    } else {
      ++rows;
    }
  }
  EXPECT_GT(settings, 0u);
  EXPECT_EQ(header, "theta,js,tv,d_js,d_tv");
  EXPECT_GE(rows, 9u);  // at least the grid (refinement may add θ)
}

}  // namespace
}  // namespace barrow::ui
