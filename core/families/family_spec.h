// Which family moves A and where: the part of a sweep's settings a family reads.
#pragma once

#include <array>
#include <optional>
#include <string>
#include <utility>
#include <vector>

namespace barrow {

struct FamilySettings {
  std::string family = "shift";               // shift|rotate|scale|interpolate|mix
  std::array<double, 2> direction{1.0, 0.0};  // shift: direction (normalised at use)
  std::optional<std::array<double, 2>> center;  // rotate/scale: pivot; none = A's centroid
};

/// The families, in the order the GUI and --help list them.
const std::vector<std::string>& familyNames();

/// The θ at which a family leaves A as given: 1 for scale, 0 for the others.
double identityTheta(const std::string& family);

/// A sensible θ range for a family, for callers that were given none:
/// shift [−1, 1], rotate [−180, 180], scale [0.25, 2], interpolate and mix [0, 1].
std::pair<double, double> defaultFamilyRange(const std::string& family);

}  // namespace barrow
