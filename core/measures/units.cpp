#include "measures/units.h"

#include "measures/evaluate.h"
#include "measures/number_text.h"

namespace barrow {

std::string lengthPower(double exponent) {
  if (exponent == 1.0) return kUnitLength;
  return std::string(kUnitLength) + "^" + shortestText(exponent);
}

std::string measureUnit(const Measure& m, const ParamSet& user) {
  std::string error;
  const ParamSet resolved = resolveParams(m, user, &error);
  if (error.empty()) return m.unit(resolved);
  return m.unit(resolveParams(m, ParamSet(), &error));
}

}  // namespace barrow
