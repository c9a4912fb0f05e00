#include "measures/param_text.h"

#include <cstdio>

namespace barrow {

namespace {

std::string num(double v) {
  char text[32];
  std::snprintf(text, sizeof text, "%.6g", v);
  return text;
}

std::string joined(const std::vector<std::string>& words) {
  std::string s;
  for (const auto& w : words) s += (s.empty() ? "" : "|") + w;
  return s;
}

}  // namespace

std::string rangeShort(const ParamSpec& s) {
  if (s.kind == ParamKind::Boolean) return "true|false";
  if (s.kind == ParamKind::Choice) return joined(s.choices);
  const bool hasMin = s.min > -1e299, hasMax = s.max < 1e299;
  std::string r;
  if (hasMin && hasMax) r = (s.minExclusive ? "(" : "[") + num(s.min) + ", " + num(s.max) + "]";
  else if (hasMin) r = (s.minExclusive ? "> " : "≥ ") + num(s.min);
  else if (hasMax) r = "≤ " + num(s.max);
  else r = "any";
  if (s.kind == ParamKind::RealPair) r += " (or x,y)";
  if (!s.choices.empty()) r += " | " + joined(s.choices);
  return r;
}

}  // namespace barrow
