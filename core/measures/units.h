// The unit of a measure's value, in the words the CLI contract uses ("unit" in measure --json,
// `# unit.<id>=` in the sweep CSV). Coordinates are in "length" (whatever unit the clouds'
// x, y are in); a value is length raised to a power, or carries no length at all:
//   "length", "length^2", "length^0.5"  powers of the coordinate unit (exponent as a number)
//   "nats"                               information (natural logarithms), dimensionless
//   "probability"                        a probability (mass), dimensionless, in [0, 1]
//   "dimensionless"                      a pure number with no scale of its own
// Each measure derives its unit from its definition (Measure::unit); the rule is stated
// beside it (Measure::unitRule) and printed by `barrow-cli measure --help`.
#pragma once

#include <optional>
#include <string>

namespace barrow {

class Measure;
class ParamSet;

inline constexpr const char* kUnitLength = "length";
inline constexpr const char* kUnitNats = "nats";
inline constexpr const char* kUnitProbability = "probability";
inline constexpr const char* kUnitDimensionless = "dimensionless";

/// "length" for 1, "length^2" for 2, "length^0.5" for 0.5 (shortest decimal exponent).
std::string lengthPower(double exponent);

/// The exponent k of a unit "length^k" ("length": 1); nullopt for units without length
/// (nats, probability, dimensionless). The inverse of lengthPower.
std::optional<double> lengthExponent(const std::string& unit);

/// The unit of m's value under the user's settings (defaults filled; invalid settings fall
/// back to the defaults, so the answer is always the unit of some valid configuration).
std::string measureUnit(const Measure& m, const ParamSet& user);

}  // namespace barrow
