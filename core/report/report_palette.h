// The window's colours for the report page (no Qt in core, so the values are repeated here;
// ui/palette.h is the source and a UI test checks the two agree): Okabe–Ito colours for A,
// B, the plan and the curves (Okabe & Ito 2008 (mem)); the k-th measure in registry order
// gets curve colour k mod 8, solid, then dashed, then dotted (as palette::curvePen).
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
inline constexpr std::array<const char*, 8> kCurves = {"#0072b2", "#d55e00", "#009e73", "#cc79a7",
                                                       "#e69f00", "#56b4e9", "#000000", "#f0e442"};
/// SVG stroke-dasharray of the k-th curve: "" (solid), dashed, dotted.
inline std::string curveDash(std::size_t k) {
  static const char* dashes[3] = {"", "6 4", "1.5 3"};
  return dashes[(k / 8) % 3];
}

}  // namespace barrow::report_palette
