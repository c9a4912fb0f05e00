#include "viridis.h"

namespace barrow::ui {

const std::vector<QColor>& viridisAnchors() {
  static const std::vector<QColor> anchors = {
      QColor(0x44, 0x01, 0x54), QColor(0x48, 0x28, 0x78), QColor(0x3E, 0x4A, 0x89),
      QColor(0x31, 0x68, 0x8E), QColor(0x26, 0x82, 0x8E), QColor(0x1F, 0x9E, 0x89),
      QColor(0x35, 0xB7, 0x79), QColor(0x6D, 0xCD, 0x59), QColor(0xB4, 0xDE, 0x2C),
      QColor(0xFD, 0xE7, 0x25)};
  return anchors;
}

QCPColorGradient viridisGradient() {
  QCPColorGradient g;
  g.clearColorStops();
  const auto& a = viridisAnchors();
  for (std::size_t k = 0; k < a.size(); ++k) g.setColorStopAt(double(k) / double(a.size() - 1), a[k]);
  g.setColorInterpolation(QCPColorGradient::ciRGB);
  g.setLevelCount(256);
  return g;
}

}  // namespace barrow::ui
