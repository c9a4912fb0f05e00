#include "measures/units.h"

#include "measures/evaluate.h"
#include "base/number_text.h"
#include "base/params.h"

#include <cmath>

namespace barrow {

std::string lengthPower(double exponent) {
  if (exponent == 1.0) return kUnitLength;
  return std::string(kUnitLength) + "^" + shortestText(exponent);
}

std::optional<double> lengthExponent(const std::string& unit) {
  const std::string base = kUnitLength;
  if (unit == base) return 1.0;
  if (unit.rfind(base + "^", 0) != 0) return std::nullopt;
  const auto k = parseNumber(unit.substr(base.size() + 1));
  return k && std::isfinite(*k) ? k : std::nullopt;
}

std::string measureUnit(const Measure& m, const ParamSet& user) {
  std::string error;
  const ParamSet resolved = resolveParams(m, user, &error);
  if (error.empty()) return m.unit(resolved);
  return m.unit(resolveParams(m, ParamSet(), &error));
}

}  // namespace barrow
