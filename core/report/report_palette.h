// The window's colours for the report page (no Qt in core, so the values are repeated here;
// ui/palette.h is the source and a UI test checks the two agree): Okabe–Ito colours for A,
// B, the plan and the curves (Okabe & Ito 2008 (mem)); the k-th measure in registry order
// gets curve colour k mod 5 and dash pattern (k / 5) mod 4, as palette::curvePen in the light
// scheme (the page has a white background). The window's markers are not drawn here.
#pragma once

#include <array>
#include <string>

namespace barrow::report_palette {

inline constexpr const char* kCloudA = "#0072b2";
inline constexpr const char* kCloudB = "#d55e00";
inline constexpr const char* kPlan = "#000000";
inline constexpr const char* kJump = "#d55e00";
inline constexpr const char* kFlat = "#56b4e9";
inline constexpr const char* kInterpolation = "#009e73";
inline constexpr std::array<const char*, 5> kCurves = {"#0072b2", "#d55e00", "#009e73", "#cc79a7", "#000000"};
/// SVG stroke-dasharray patterns: solid, dashed, dotted, dash-dotted.
inline constexpr std::array<const char*, 4> kDashes = {"", "6 4", "1.5 3", "6 3 1.5 3"};
inline std::string curveColor(std::size_t k) { return kCurves[k % kCurves.size()]; }
inline std::string curveDash(std::size_t k) { return kDashes[(k / kCurves.size()) % kDashes.size()]; }

}  // namespace barrow::report_palette
