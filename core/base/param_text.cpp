#include "base/param_text.h"

#include "base/number_text.h"

namespace barrow {

namespace {

std::string joined(const std::vector<std::string>& words) {
  std::string s;
  for (const auto& w : words) s += (s.empty() ? "" : "|") + w;
  return s;
}

}  // namespace

std::string rangeShort(const ParamSpec& s) {
  if (s.kind == ParamKind::Boolean) return "true|false";
  if (s.kind == ParamKind::Choice) return joined(s.choices);
  std::string r;
  if (s.hasMin() && s.hasMax()) r = (s.minExclusive ? "(" : "[") + sixDigits(s.min) + ", " + sixDigits(s.max) + "]";
  else if (s.hasMin()) r = (s.minExclusive ? "> " : "≥ ") + sixDigits(s.min);
  else if (s.hasMax()) r = "≤ " + sixDigits(s.max);
  else r = "any";
  if (s.kind == ParamKind::RealPair) r += " (or x,y)";
  if (!s.choices.empty()) r += " | " + joined(s.choices);
  return r;
}

}  // namespace barrow
