// The demo as the docs show it: rendered at 1400×900 after every computation finished, the
// image must not be blank and must show both clouds in their colours on the Field and
// plotted curves on the Sweep plot (pixel statistics). The PNG is kept under the build tree.
#include <gtest/gtest.h>

#include <QImage>
#include <QSet>
#include <QSettings>

#include "field_panel.h"
#include "measures/registry.h"
#include "measure_style.h"
#include "palette.h"
#include "scenario/demo_scenario.h"
#include "sweep_panel.h"
#include "sweep_plots.h"
#include "sweep_runner.h"
#include "ui_test_support.h"

namespace barrow::ui {
namespace {

// Colour of a marker fill: the cloud colour at 78 % opacity over white (CloudLayer::draw).
QColor overWhite(const QColor& c, double alpha) {
  auto mix = [alpha](int v) { return int(std::lround(alpha * v + (1 - alpha) * 255)); };
  return QColor(mix(c.red()), mix(c.green()), mix(c.blue()));
}

int countNear(const QImage& img, const QRect& r, const QColor& c, int tol, const QRect& skip = QRect()) {
  int n = 0;
  for (int y = std::max(0, r.top()); y <= std::min(img.height() - 1, r.bottom()); ++y)
    for (int x = std::max(0, r.left()); x <= std::min(img.width() - 1, r.right()); ++x) {
      if (skip.contains(x, y)) continue;
      const QColor p = img.pixelColor(x, y);
      const int d = std::abs(p.red() - c.red()) + std::abs(p.green() - c.green()) + std::abs(p.blue() - c.blue());
      if (d <= tol) ++n;
    }
  return n;
}

QRect rectIn(QWidget* window, QWidget* w, const QRect& local) {
  return QRect(w->mapTo(window, local.topLeft()), local.size());
}

TEST(ScreenshotTest, DemoShowsBothCloudsAndCurves) {
  MainWindow::Options o;
  o.screenshot = true;
  o.quiet = true;
  MainWindow w(o);
  w.resize(1400, 900);
  w.setSession(demoSession());
  w.show();
  ASSERT_TRUE(QTest::qWaitForWindowExposed(&w));
  ASSERT_TRUE(test::waitIdle(w, 600000)) << "computations did not finish";
  QTest::qWait(50);
  const QImage img = w.grab().toImage().convertToFormat(QImage::Format_RGB32);
  const QString out = QString(BARROW_TEST_TMP_DIR) + "/demo_screenshot.png";
  ASSERT_TRUE(img.save(out, "PNG")) << out.toStdString();
  ASSERT_EQ(img.size(), QSize(1400, 900));

  // Not blank: a real window has many colours (text antialiasing, markers, curves).
  QSet<QRgb> colours;
  for (int y = 0; y < img.height(); y += 2)
    for (int x = 0; x < img.width(); x += 2) colours.insert(img.pixel(x, y));
  EXPECT_GT(colours.size(), 500);

  // Both clouds inside the Field's plotting area, legend excluded: one layer of marker fill,
  // or several overlapping ones (close to the pure colour). 300 markers of ~7 px overlap a
  // lot in the demo's thin strips; demand several hundred pixels each.
  QCustomPlot* field = w.field()->view()->plot();
  const QRect fieldRect = rectIn(&w, field, field->axisRect()->rect());
  const QRect legend = rectIn(&w, field, field->legend->outerRect());
  auto cloudPixels = [&](const QColor& c) {
    return countNear(img, fieldRect, overWhite(c, 0.78), 30, legend) +
           countNear(img, fieldRect, overWhite(c, 0.95), 30, legend);
  };
  EXPECT_GT(cloudPixels(palette::cloudA()), 400) << "cloud A colour on the Field";
  EXPECT_GT(cloudPixels(palette::cloudB()), 400) << "cloud B colour on the Field";

  // Curves on the Sweep plot, in the measures' own colours.
  SweepPlots* plots = w.sweep()->plots();
  EXPECT_GT(plots->curveCount(), 0);
  const QRect valueRect = rectIn(&w, plots->plot(), plots->valueRect()->rect());
  int curvePixels = 0;
  for (const Measure* m : MeasureRegistry::instance().defaults())
    curvePixels += countNear(img, valueRect, measurePen(m->id()).color(), 40);
  EXPECT_GT(curvePixels, 2000) << "curves on the sweep plot";
}

}  // namespace
}  // namespace barrow::ui
