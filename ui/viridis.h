// A perceptually uniform colour map for the potential heat map, built from the published
// anchor colours of "viridis" (van der Walt & Smith 2015, matplotlib; the ten equally spaced
// samples as listed for R's viridisLite (mem)). Lightness rises monotonically from dark
// violet to yellow, so the order of values survives greyscale printing and colour-vision
// deficiencies. QCustomPlot 2.1 has no viridis preset.
#pragma once

#include <QColor>
#include <qcustomplot.h>
#include <vector>

namespace barrow::ui {

/// The anchor colours, at positions k/(n-1).
const std::vector<QColor>& viridisAnchors();
QCPColorGradient viridisGradient();

}  // namespace barrow::ui
