// Colours used across the screen: Okabe–Ito (colour-blind safe) for the two clouds.
#pragma once

#include <QColor>

namespace barrow::ui::palette {

inline QColor cloudA() { return QColor(0, 114, 178); }   // Okabe–Ito blue
inline QColor cloudB() { return QColor(213, 94, 0); }    // Okabe–Ito vermillion
inline QColor accent() { return QColor(0, 158, 115); }   // Okabe–Ito bluish green

}  // namespace barrow::ui::palette
