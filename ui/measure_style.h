// One colour and line style per measure, fixed by its place in the registry, so that a
// measure looks the same in the table, the sweep plot and the findings.
#pragma once

#include <QIcon>
#include <QPen>
#include <string>

namespace barrow::ui {

QPen measurePen(const std::string& id, double width = 1.7);
/// A small line sample in the measure's pen, for table rows.
QIcon measureIcon(const std::string& id);
/// Position in the registry (registry size when unknown): the order curves are listed in.
std::size_t measureRank(const std::string& id);

}  // namespace barrow::ui
