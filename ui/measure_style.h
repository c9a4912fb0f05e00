// One colour, dash pattern and marker per measure, fixed by its place in the registry, so
// that a measure looks the same in the table, the sweep plot and the findings (palette.h:
// no two of the registered measures share colour and dash).
#pragma once

#include <QIcon>
#include <QPen>
#include <string>

class QCPScatterStyle;

namespace barrow::ui {

QPen measurePen(const std::string& id, double width = 1.7);
/// The measure's marker drawn in `pen`'s colour (solid outline, hollow).
QCPScatterStyle measureMarker(const std::string& id, const QPen& pen, double size = 6);
/// A small line sample in the measure's pen with its marker, for table rows.
QIcon measureIcon(const std::string& id);
/// Position in the registry (registry size when unknown): the order curves are listed in.
std::size_t measureRank(const std::string& id);

}  // namespace barrow::ui
