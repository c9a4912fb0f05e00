// Large clouds stay readable (issues 13 and 19: "at 3000+ points per cloud A is drawn over B
// and hides it"): with thousands of points the markers become small and translucent, so where
// the clouds overlap the colour drawn first still shows through the one drawn over it. Checked
// on the rendered pixels: the overlap's mean colour, placed on the line from A's colour to B's,
// must lie a good way towards B [CP].
#include <gtest/gtest.h>

#include <QImage>
#include <qcustomplot.h>
#include <random>

#include "cloud_layer.h"

namespace barrow::ui {
namespace {

Eigen::MatrixX2d square(int n, unsigned seed) {
  std::mt19937 rng(seed);
  std::uniform_real_distribution<double> u(0.2, 0.8);
  Eigen::MatrixX2d p(n, 2);
  for (int i = 0; i < n; ++i) p.row(i) << u(rng), u(rng);
  return p;
}

// Where the mean colour of the centre patch lies between pure A (0) and pure B (1).
double towardsB(int n) {
  QCustomPlot plot;
  plot.resize(400, 400);
  plot.xAxis->setRange(0, 1);
  plot.yAxis->setRange(0, 1);
  const QColor ca(0, 114, 178), cb(213, 94, 0);
  auto* b = new CloudLayer(plot.xAxis, plot.yAxis);  // drawn first
  b->setStyle(cb, MarkerShape::Triangle, 8);
  b->setData(square(n, 2), Eigen::VectorXd::Ones(n));
  auto* a = new CloudLayer(plot.xAxis, plot.yAxis);  // drawn over B
  a->setStyle(ca, MarkerShape::Disc, 7);
  a->setData(square(n, 1), Eigen::VectorXd::Ones(n));
  const QImage img = plot.toPixmap(400, 400).toImage();
  const QPoint c = QPoint(plot.xAxis->coordToPixel(0.5), plot.yAxis->coordToPixel(0.5));
  double r = 0, g = 0, bl = 0;
  int count = 0;
  for (int dy = -15; dy <= 15; ++dy)
    for (int dx = -15; dx <= 15; ++dx) {
      const QColor p = img.pixelColor(c + QPoint(dx, dy));
      r += p.red(), g += p.green(), bl += p.blue(), ++count;
    }
  r /= count, g /= count, bl /= count;
  const double ux = cb.red() - ca.red(), uy = cb.green() - ca.green(), uz = cb.blue() - ca.blue();
  return ((r - ca.red()) * ux + (g - ca.green()) * uy + (bl - ca.blue()) * uz) / (ux * ux + uy * uy + uz * uz);
}

TEST(CloudCrowdTest, TheCloudDrawnFirstShowsThroughALargeCloudDrawnOverIt) {
  for (int n : {5000, 20000, 100000}) {
    const double t = towardsB(n);
    EXPECT_GT(t, 0.2) << n << " points: B hidden under A";
    EXPECT_LT(t, 0.8) << n << " points: A hidden";
  }
}

TEST(CloudCrowdTest, AFewHundredPointsKeepTheirOpaqueOutlinedMarkers) {
  QCustomPlot plot;
  plot.resize(400, 400);
  plot.xAxis->setRange(0, 1);
  plot.yAxis->setRange(0, 1);
  auto* a = new CloudLayer(plot.xAxis, plot.yAxis);
  a->setStyle(QColor(0, 114, 178), MarkerShape::Disc, 7);
  a->setData(square(300, 3), Eigen::VectorXd::Ones(300));
  plot.toPixmap(400, 400);
  EXPECT_NEAR(a->fillAlpha(), 0.78, 0.01);
  EXPECT_NEAR(a->markerSize(0), 7.0, 1e-12);
}

}  // namespace
}  // namespace barrow::ui
