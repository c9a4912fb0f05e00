// The two ways Barrow writes a double as text, in one place: exactly (files and settings
// that must read back bit for bit) and for reading (details, help, ranges).
#pragma once

#include <string>

namespace barrow {

/// Shortest text that reads back to the same double ("0.1", "1e-09", "inf", "nan").
std::string shortestText(double v);

/// Six significant digits, printf %g style ("0.333333", "1e-09").
std::string sixDigits(double v);

}  // namespace barrow
