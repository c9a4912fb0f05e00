// What a sweep runs: the family that moves A, the θ range, and the reference θ.
// Shared by the session file, the CLI and the GUI.
#pragma once

#include <array>
#include <optional>
#include <string>
#include <vector>

namespace barrow {

struct SweepSettings {
  std::string family = "shift";             // shift|rotate|scale|interpolate|mix
  std::array<double, 2> direction{1.0, 0.0};  // shift: direction (normalised at use)
  std::optional<std::array<double, 2>> center;  // rotate/scale: pivot; none = A's centroid
  double from = -1.0;
  double to = 1.0;
  int steps = 81;                           // number of θ values, >= 2
  std::optional<double> reference;          // θ0 where data-dependent settings are frozen;
                                            // none = the family's identity (identityTheta)
  std::vector<std::string> measures;        // ids; empty = all

  /// θ0: `reference` when set, else the family's identity (A_θ0 = A as given).
  double referenceTheta() const;

  /// Reason the settings are unusable, if any.
  std::optional<std::string> validate() const;
};

/// The θ at which a family leaves A as given: 1 for scale, 0 for the others.
double identityTheta(const std::string& family);

/// The families, in the order the GUI and --help list them.
const std::vector<std::string>& familyNames();

}  // namespace barrow
