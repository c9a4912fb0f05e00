// Plots drawn in the application's colour scheme: background, axes, tick labels, grid and
// legend from palette.h, re-applied when the application palette changes.
#pragma once

#include <functional>

class QCPAxis;
class QCustomPlot;

namespace barrow::ui {

/// Colours every axis rect, axis, grid and the legend of `plot` for the current scheme.
void applyPlotTheme(QCustomPlot* plot);
/// Colours one axis (and its grid) for the current scheme, e.g. a colour scale's.
void applyAxisTheme(QCPAxis* axis);
/// Applies the theme now and again whenever the scheme changes, then calls `changed` (which
/// re-draws what carries scheme colours of its own, such as curves), then replots.
void followScheme(QCustomPlot* plot, std::function<void()> changed = {});

}  // namespace barrow::ui
