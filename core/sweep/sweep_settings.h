// What a sweep runs: the family that moves A, the θ range, and the reference θ.
// Shared by the session file, the CLI and the GUI.
#pragma once

#include <array>
#include <optional>
#include <string>
#include <vector>

#include "families/family_spec.h"

namespace barrow {

/// The family and its placement (family_spec.h), then the θ grid and the measures.
struct SweepSettings : FamilySettings {
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

}  // namespace barrow
