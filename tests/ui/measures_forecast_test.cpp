// A measure still running on large clouds says how long it may take (issue 13, goal 6: the
// CLI's forecasts appear in the window beside each measure before its value arrives); a quick
// one just says it is updating [CP].
#include <gtest/gtest.h>

#include <QTreeWidget>

#include "live_evaluator.h"
#include "measures/registry.h"
#include "measures/time_estimate.h"
#include "measures_panel.h"
#include "session_document.h"

namespace barrow::ui {
namespace {

constexpr int kStatusColumn = 4;  // name, value, change, unit, status, time

TEST(MeasuresForecastTest, ASlowPendingMeasureShowsItsForecast) {
  SessionDocument doc;
  Session s;
  s.a = Cloud("A", Eigen::MatrixX2d::Random(8000, 2));
  s.b = Cloud("B", Eigen::MatrixX2d::Random(8000, 2));
  doc.reset(s, QString());
  MeasuresPanel panel(&doc, MeasureRegistry::instance().defaults());
  LiveUpdate u;
  u.pending = {"entropic", "frechet"};
  panel.applyUpdate(u);
  const auto forecast = estimateTime("entropic", 8000, 8000, 0);
  ASSERT_TRUE(forecast.has_value());
  ASSERT_GE(forecast->seconds, 1.0);
  EXPECT_EQ(panel.cellText("entropic", kStatusColumn),
            QStringLiteral("updating… ~") + QString::fromStdString(estimateText(forecast->seconds)));
  EXPECT_EQ(panel.cellText("frechet", kStatusColumn), QStringLiteral("updating…"));  // forecast under 1 s
}

}  // namespace
}  // namespace barrow::ui
