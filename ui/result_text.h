// How results read on screen and in exported tables: numbers, changes, statuses with their
// reasons, times, and the formula/settings box of a measure.
#pragma once

#include <QString>
#include <string>

#include "measures/measure.h"

namespace barrow::ui {

QString valueText(const Result& r);               // "0.4213", "∞", "—"
QString changeText(const Result& now, const Result& ref);  // "+0.0132", "-1.54e-05", "0", "+∞", "∞ → ∞"
QString statusText(const Result& r);              // "ok", "not converged (marginal error 3e-4)"
QString statusTooltip(const Result& r);           // the full message and iteration count
QString secondsText(double s);                    // "0.8 ms", "1.23 s"
QString detailsHtml(const Measure& m, const Result* r);
std::string csvNumber(const Result& r);           // "inf" when infinite, "" when failed
std::string csvDifference(double now, double ref);

}  // namespace barrow::ui
