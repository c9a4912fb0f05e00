#include "palette.h"

#include <QApplication>
#include <QPalette>
#include <QStyle>
#include <algorithm>

namespace barrow::ui::palette {

Scheme currentScheme() {
  const QColor w = QGuiApplication::palette().color(QPalette::Window);
  return w.lightnessF() < 0.5 ? Scheme::Dark : Scheme::Light;
}

void applyScheme(Scheme s) {
  if (s == Scheme::Light) {
    QApplication::setPalette(QApplication::style()->standardPalette());
    return;
  }
  QPalette p;
  const QColor window(45, 45, 48), base(30, 30, 30), text(225, 225, 225), dim(140, 140, 140);
  p.setColor(QPalette::Window, window);
  p.setColor(QPalette::WindowText, text);
  p.setColor(QPalette::Base, base);
  p.setColor(QPalette::AlternateBase, QColor(38, 38, 40));
  p.setColor(QPalette::ToolTipBase, QColor(55, 55, 58));
  p.setColor(QPalette::ToolTipText, text);
  p.setColor(QPalette::PlaceholderText, dim);
  p.setColor(QPalette::Text, text);
  p.setColor(QPalette::Button, window);
  p.setColor(QPalette::ButtonText, text);
  p.setColor(QPalette::BrightText, QColor(255, 110, 90));
  p.setColor(QPalette::Light, QColor(70, 70, 74));
  p.setColor(QPalette::Midlight, QColor(58, 58, 62));
  p.setColor(QPalette::Mid, QColor(36, 36, 38));
  p.setColor(QPalette::Dark, QColor(24, 24, 26));
  p.setColor(QPalette::Shadow, QColor(10, 10, 10));
  p.setColor(QPalette::Highlight, QColor(0, 114, 178));
  p.setColor(QPalette::HighlightedText, QColor(255, 255, 255));
  p.setColor(QPalette::Link, QColor(86, 180, 233));
  p.setColor(QPalette::LinkVisited, QColor(204, 121, 167));
  for (auto role : {QPalette::WindowText, QPalette::Text, QPalette::ButtonText})
    p.setColor(QPalette::Disabled, role, dim);
  QApplication::setPalette(p);
}

QColor plotBackground(Scheme s) { return s == Scheme::Dark ? QColor(30, 30, 30) : QColor(255, 255, 255); }
QColor plotText(Scheme s) { return s == Scheme::Dark ? QColor(220, 220, 220) : QColor(0, 0, 0); }
QColor plotGrid(Scheme s) { return s == Scheme::Dark ? QColor(72, 72, 72) : QColor(200, 200, 200); }
QColor neutralMark(Scheme s) { return s == Scheme::Dark ? QColor(160, 160, 160) : QColor(90, 90, 90); }
QColor exactPlan(Scheme s) { return s == Scheme::Dark ? QColor(224, 224, 224) : QColor(0, 0, 0); }
QColor goodText(Scheme s) { return s == Scheme::Dark ? QColor(90, 200, 150) : QColor(0, 110, 80); }
QColor warnText(Scheme s) { return s == Scheme::Dark ? QColor(240, 150, 80) : QColor(190, 80, 0); }
QColor cursor(Scheme s) { return s == Scheme::Dark ? QColor(235, 235, 235) : QColor(40, 40, 40); }

// Okabe–Ito blue, vermillion, bluish green, reddish purple and black (light grey on dark).
// Orange (2.25:1 on white), sky blue (2.31:1) and yellow (1.32:1) fail 3:1 on white; darkened
// just enough to pass, each comes within 5.5–6.8 (CAM02-UCS) of a kept colour as a dichromat
// sees it, while the kept five stay at least 11.7 apart (tests/ui/check_palette_cvd.py), so
// they are not used for curves: four dash patterns make up for the three colours.
QColor curveColor(int k, Scheme s) {
  static const QColor light[kCurveColours] = {QColor(0, 114, 178), QColor(213, 94, 0), QColor(0, 158, 115),
                                              QColor(204, 121, 167), QColor(0, 0, 0)};
  static const QColor dark[kCurveColours] = {QColor(0, 114, 178), QColor(213, 94, 0), QColor(0, 158, 115),
                                             QColor(204, 121, 167), QColor(224, 224, 224)};
  const int i = ((k % kCurveColours) + kCurveColours) % kCurveColours;
  return s == Scheme::Dark ? dark[i] : light[i];
}

Qt::PenStyle curveDash(int k) {
  static const Qt::PenStyle styles[kCurveDashes] = {Qt::SolidLine, Qt::DashLine, Qt::DotLine, Qt::DashDotLine};
  return styles[(std::max(k, 0) / kCurveColours) % kCurveDashes];
}

int curveMarker(int k) { return std::max(k, 0) % kCurveMarkers; }

QPen curvePen(int k, double width, Scheme s) {
  QPen pen(curveColor(k, s), width);
  pen.setStyle(curveDash(k));
  return pen;
}

}  // namespace barrow::ui::palette
