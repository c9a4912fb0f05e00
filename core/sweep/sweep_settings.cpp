#include "sweep/sweep_settings.h"

#include <cmath>

namespace barrow {

double SweepSettings::referenceTheta() const { return reference.value_or(identityTheta(family)); }

std::optional<std::string> SweepSettings::validate() const {
  const FamilySpec& spec = familySpec(family);
  if (!std::isfinite(from) || !std::isfinite(to)) return "the θ range must be finite numbers";
  if (!(to > from)) return "the θ range is empty: 'to' must be greater than 'from'";
  if (steps < 2) return "a sweep needs at least 2 steps";
  if (steps > 100001) return "a sweep is limited to 100001 steps";
  if (spec.usesDirection && std::hypot(direction[0], direction[1]) == 0)
    return "the shift direction must not be zero";
  if (spec.unitInterval && (from < 0 || to > 1))
    return "the " + std::string(spec.name) + " family takes θ in [0, 1]";
  if (reference && (*reference < from || *reference > to))
    return "the reference θ lies outside the sweep range";
  return std::nullopt;
}

}  // namespace barrow
