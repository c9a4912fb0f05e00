// The Field canvas: equal aspect ratio, both clouds in view, marker area following weight.
#include <gtest/gtest.h>

#include <QApplication>
#include <qcustomplot.h>

#include "cloud_layer.h"
#include "field_view.h"

namespace barrow::ui {
namespace {

Cloud line(double x0, int n) {
  Eigen::MatrixX2d p(n, 2);
  for (int i = 0; i < n; ++i) p.row(i) << x0, -1.0 + 2.0 * i / (n - 1);
  return Cloud("line", p);
}

// [D] one data unit must span the same number of pixels on both axes.
TEST(FieldViewTest, FitShowsBothCloudsWithEqualAspect) {
  FieldView view;
  view.resize(900, 500);
  view.show();
  view.setClouds(line(0.0, 20), line(1.2, 20));
  QApplication::processEvents();
  view.fitToData();
  QApplication::processEvents();
  QCustomPlot* p = view.plot();
  const QCPRange x = p->xAxis->range(), y = p->yAxis->range();
  EXPECT_LT(x.lower, -0.05);
  EXPECT_GT(x.upper, 1.25);
  EXPECT_LT(y.lower, -1.0);
  EXPECT_GT(y.upper, 1.0);
  const QRect r = p->axisRect()->rect();
  EXPECT_NEAR(x.size() / r.width(), y.size() / r.height(), 1e-3 * x.size() / r.width());
  // Still true after the window is resized.
  view.resize(600, 700);
  QApplication::processEvents();
  const QRect r2 = p->axisRect()->rect();
  EXPECT_NEAR(p->xAxis->range().size() / r2.width(), p->yAxis->range().size() / r2.height(),
              1e-3 * p->xAxis->range().size() / r2.width());
  EXPECT_LT(p->xAxis->range().lower, -0.05);
  EXPECT_GT(p->xAxis->range().upper, 1.25);
}

// [D] marker area ∝ share of mass: a point with 4× the uniform weight has 2× the diameter.
TEST(FieldViewTest, MarkerAreaFollowsWeight) {
  FieldView view;
  Eigen::MatrixX2d p(4, 2);
  p << 0, 0, 1, 0, 2, 0, 3, 0;
  Eigen::VectorXd w(4);
  w << 1, 1, 1, 4;  // shares 4/7·… relative to the mean weight 7/4
  view.setClouds(Cloud("a", p, w), Cloud("b", p));
  const CloudLayer* a = view.layer(Which::A);
  EXPECT_NEAR(a->markerSize(3) / a->markerSize(0), 2.0, 1e-12);
  const CloudLayer* b = view.layer(Which::B);
  EXPECT_NEAR(b->markerSize(0), b->markerSize(3), 1e-12);
}

}  // namespace
}  // namespace barrow::ui
