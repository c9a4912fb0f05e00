#include "families/family_spec.h"

namespace barrow {

const std::vector<std::string>& familyNames() {
  static const std::vector<std::string> names = {"shift", "rotate", "scale", "interpolate", "mix"};
  return names;
}

double identityTheta(const std::string& family) { return family == "scale" ? 1.0 : 0.0; }

std::pair<double, double> defaultFamilyRange(const std::string& family) {
  if (family == "rotate") return {-180.0, 180.0};
  if (family == "scale") return {0.25, 2.0};
  if (family == "interpolate" || family == "mix") return {0.0, 1.0};
  return {-1.0, 1.0};
}

}  // namespace barrow
