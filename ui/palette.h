// Colours used across the screen. Clouds, overlays and curves use hues of the Okabe–Ito set,
// chosen to stay distinguishable under the common colour-vision deficiencies (Okabe & Ito
// 2008, "Color Universal Design" (mem)). Plots follow the colour scheme the widgets are drawn
// in (light or dark), and every curve colour keeps a contrast of at least 3:1 against the plot
// background of its scheme (WCAG 2.1, success criterion 1.4.11; checked in
// tests/ui/series_style_test.cpp).
#pragma once

#include <QColor>
#include <QPen>

namespace barrow::ui::palette {

enum class Scheme { Light, Dark };

/// The scheme of the application palette: dark when its window colour is darker than mid
/// grey. (QStyleHints::colorScheme() arrived in Qt 6.5; Debian's Qt is 6.4. Following the
/// palette also makes the plots match the widgets when a dark palette is set explicitly.)
Scheme currentScheme();
/// Installs a dark (or the style's standard light) application palette: `--scheme`.
void applyScheme(Scheme s);

/// Plot background, axes, grid and neutral marks of a scheme.
QColor plotBackground(Scheme s);
QColor plotText(Scheme s);
QColor plotGrid(Scheme s);
/// Grey for marks that belong to no measure (the legend's explanations, the θ₀ line).
QColor neutralMark(Scheme s);

inline QColor cloudA() { return QColor(0, 114, 178); }   // Okabe–Ito blue
inline QColor cloudB() { return QColor(213, 94, 0); }    // Okabe–Ito vermillion
inline QColor accent() { return QColor(0, 158, 115); }   // Okabe–Ito bluish green
/// Okabe–Ito black (light grey on a dark background).
QColor exactPlan(Scheme s = currentScheme());
inline QColor entropicPlan() { return QColor(204, 121, 167); }  // Okabe–Ito reddish purple
inline QColor interpolation() { return accent(); }
/// Near black (near white when dark): distinct from every curve's colour and dash.
QColor cursor(Scheme s = currentScheme());
/// Text of a reassuring verdict (continuous) and of a warning one (jumps, flat, unresolved).
QColor goodText(Scheme s = currentScheme());
QColor warnText(Scheme s = currentScheme());
inline QColor jump() { return QColor(213, 94, 0); }
inline QColor flat() { return QColor(86, 180, 233, 60); }  // Okabe–Ito sky blue, translucent

/// Curve styles: colour k mod 5, dash pattern (k / 5) mod 4, marker k mod 6. Any two of the
/// first 20 curves differ in colour or dash; within 20 they also differ in at least two of
/// colour, dash and marker [D] (same colour: k differs by 5, 10 or 15, none a multiple of 6;
/// same dash: k differs by at most 4, so the markers differ).
inline constexpr int kCurveColours = 5;
inline constexpr int kCurveDashes = 4;
inline constexpr int kCurveMarkers = 6;
QColor curveColor(int k, Scheme s = currentScheme());
Qt::PenStyle curveDash(int k);
/// 0 circle, 1 square, 2 diamond, 3 cross, 4 plus, 5 star.
int curveMarker(int k);
QPen curvePen(int k, double width = 1.8, Scheme s = currentScheme());

}  // namespace barrow::ui::palette
