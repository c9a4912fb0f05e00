// The potential map's colour scale: perceptually ordered, i.e. CIE lightness L* rises
// strictly from one end to the other, and it ends on the published anchor colours.
#include <gtest/gtest.h>

#include <cmath>

#include "viridis.h"

namespace barrow::ui {
namespace {

// sRGB → linear (IEC 61966-2-1 [P]); relative luminance Y with the Rec. 709 primaries [P];
// CIE 1976 L* = 116 f(Y) − 16 with the cube root above (6/29)³ [P] (CIE 15:2004).
double lightness(const QColor& c) {
  auto lin = [](double v) { return v <= 0.04045 ? v / 12.92 : std::pow((v + 0.055) / 1.055, 2.4); };
  const double y = 0.2126 * lin(c.redF()) + 0.7152 * lin(c.greenF()) + 0.0722 * lin(c.blueF());
  const double f = y > std::pow(6.0 / 29.0, 3) ? std::cbrt(y) : y / (3 * std::pow(6.0 / 29.0, 2)) + 4.0 / 29.0;
  return 116 * f - 16;
}

TEST(ViridisTest, LightnessRisesStrictlyAlongTheScale) {
  QCPColorGradient g = viridisGradient();
  double last = -1;
  for (int k = 0; k <= 100; ++k) {
    const QColor c = QColor::fromRgb(g.color(k / 100.0, QCPRange(0, 1)));
    const double l = lightness(c);
    EXPECT_GT(l, last) << "at " << k / 100.0;
    last = l;
  }
}

TEST(ViridisTest, EndsOnThePublishedAnchors) {
  QCPColorGradient g = viridisGradient();
  const auto& a = viridisAnchors();
  ASSERT_EQ(a.size(), 10u);
  EXPECT_EQ(QColor::fromRgb(g.color(0.0, QCPRange(0, 1))), a.front());
  EXPECT_EQ(QColor::fromRgb(g.color(1.0, QCPRange(0, 1))), a.back());
  // (mem) viridis starts near L* 15 (dark violet) and ends near L* 90 (yellow).
  EXPECT_NEAR(lightness(a.front()), 15.5, 2.0);
  EXPECT_NEAR(lightness(a.back()), 90.0, 3.0);
}

}  // namespace
}  // namespace barrow::ui
