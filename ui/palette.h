// Colours used across the screen. Clouds, overlays and curves use the Okabe–Ito set, chosen
// to stay distinguishable under the common colour-vision deficiencies (Okabe & Ito 2008,
// "Color Universal Design" (mem)); curves beyond eight also change line style.
#pragma once

#include <QColor>
#include <QPen>

namespace barrow::ui::palette {

inline QColor cloudA() { return QColor(0, 114, 178); }   // Okabe–Ito blue
inline QColor cloudB() { return QColor(213, 94, 0); }    // Okabe–Ito vermillion
inline QColor accent() { return QColor(0, 158, 115); }   // Okabe–Ito bluish green
inline QColor exactPlan() { return QColor(0, 0, 0); }    // Okabe–Ito black
inline QColor entropicPlan() { return QColor(204, 121, 167); }  // Okabe–Ito reddish purple
inline QColor interpolation() { return accent(); }
inline QColor cursor() { return QColor(40, 40, 40); }    // near black: distinct from every curve's dash
inline QColor jump() { return QColor(213, 94, 0); }
inline QColor flat() { return QColor(86, 180, 233, 60); }  // Okabe–Ito sky blue, translucent

/// Pen for the k-th curve of a plot: eight Okabe–Ito colours, then the same colours dashed,
/// then dotted.
inline QPen curvePen(int k, double width = 1.8) {
  static const QColor colors[8] = {QColor(0, 114, 178),  QColor(213, 94, 0),  QColor(0, 158, 115),
                                   QColor(204, 121, 167), QColor(230, 159, 0), QColor(86, 180, 233),
                                   QColor(0, 0, 0),       QColor(240, 228, 66)};
  static const Qt::PenStyle styles[3] = {Qt::SolidLine, Qt::DashLine, Qt::DotLine};
  QPen pen(colors[k % 8], width);
  pen.setStyle(styles[(k / 8) % 3]);
  return pen;
}

}  // namespace barrow::ui::palette
