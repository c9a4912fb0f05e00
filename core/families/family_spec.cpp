#include "families/family_spec.h"

namespace barrow {

const std::vector<FamilySpec>& familySpecs() {
  // clang-format off
  static const std::vector<FamilySpec> table = {
    // family               name           label                                         from    to     unit          dir    pivot  [0,1]  moves
    {Family::Shift,       "shift",       "distance A is moved along the direction",      -1.0,   1.0,  "cloud units", true,  false, false, true},
    {Family::Rotate,      "rotate",      "rotation of A about the pivot",               -180.0, 180.0, "degrees",     false, true,  false, true},
    {Family::Scale,       "scale",       "scale factor of A about the pivot",             0.25,  2.0,  "factor",      false, true,  false, true},
    {Family::Interpolate, "interpolate", "displacement interpolation from A (0) to B (1)", 0.0,  1.0,  "t",           false, false, true,  true},
    {Family::Mix,         "mix",         "share of B in the mixture (1−θ)A + θB",         0.0,   1.0,  "mass share",  false, false, true,  false},
  };
  // clang-format on
  return table;
}

const FamilySpec& familySpec(Family f) {
  for (const auto& s : familySpecs())
    if (s.family == f) return s;
  return familySpecs().front();  // unreachable: every enum value has a row (family_spec_test)
}

const FamilySpec* findFamily(const std::string& name) {
  for (const auto& s : familySpecs())
    if (name == s.name) return &s;
  return nullptr;
}

std::string familyChoices() {
  std::string out;
  const auto& t = familySpecs();
  for (std::size_t k = 0; k < t.size(); ++k)
    out += (k == 0 ? "" : k + 1 == t.size() ? " or " : ", ") + std::string(t[k].name);
  return out;
}

const std::vector<std::string>& familyNames() {
  static const std::vector<std::string> names = [] {
    std::vector<std::string> out;
    for (const auto& s : familySpecs()) out.push_back(s.name);
    return out;
  }();
  return names;
}

std::string familyName(Family f) { return familySpec(f).name; }

double identityTheta(Family f) { return f == Family::Scale ? 1.0 : 0.0; }

}  // namespace barrow
