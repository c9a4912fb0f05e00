// The families θ ↦ A_θ as data: one enum and one table (name, label, default θ range, θ unit,
// which controls apply). The core, the CLI and the window read the table instead of
// spelling family names; adding a family is one enum value, one row, and its map in
// family_map.cpp (DEVELOPERS.md).
#pragma once

#include <array>
#include <optional>
#include <string>
#include <utility>
#include <vector>

namespace barrow {

enum class Family { Shift, Rotate, Scale, Interpolate, Mix };

struct FamilySpec {
  Family family;
  const char* name;       // the word in files, sessions and the CLI ("shift")
  const char* label;      // what θ means, for axis labels and help
  double from;            // default θ range, for callers given none
  double to;
  const char* thetaUnit;  // "cloud units", "degrees", ...
  bool usesDirection;     // the direction control applies
  bool usesCenter;        // the pivot control applies
  bool unitInterval;      // θ must lie in [0, 1]
  bool pointsMove;        // false: the family changes weights only (no velocity)
};

/// Every family, in the order the window and --help list them.
const std::vector<FamilySpec>& familySpecs();
const FamilySpec& familySpec(Family f);
/// The family spelled `name`, or null.
const FamilySpec* findFamily(const std::string& name);
/// "shift, rotate, scale, interpolate or mix", for error messages.
std::string familyChoices();
/// The names in table order.
const std::vector<std::string>& familyNames();

/// Which family moves A and where: the part of a sweep's settings a family reads.
struct FamilySettings {
  Family family = Family::Shift;
  std::array<double, 2> direction{1.0, 0.0};    // shift: direction (normalised at use)
  std::optional<std::array<double, 2>> center;  // rotate/scale: pivot; none = A's centroid
};

/// familySpec(f).name as a string.
std::string familyName(Family f);

/// The θ at which a family leaves A as given: 1 for scale, 0 for the others.
double identityTheta(Family f);

}  // namespace barrow
