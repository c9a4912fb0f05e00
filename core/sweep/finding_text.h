// The one plain sentence per measure that the findings carry ("js jumps by +0.693 at
// θ = 0.125; it is constant at 0.693 for θ > 0.125: no gradient there").
#pragma once

#include <cstddef>
#include <string>
#include <utility>
#include <vector>

#include "sweep/findings.h"

namespace barrow {

struct FlatFacts {
  double from = 0.0, to = 0.0;  // θ extent
  double low = 0.0, high = 0.0; // values of D over it (+inf when infinite)
};

/// What the sentence needs beyond the Finding itself.
struct FindingFacts {
  std::size_t samples = 0;
  std::size_t failed = 0;
  std::string failure;        // the first failure's reason
  bool refined = false;       // suspects were bisected (Finding::resolution > 0)
  bool constant = false;      // one finite value at every θ
  bool infiniteEverywhere = false;  // +∞ at every θ that did not fail
  double lowest = 0.0;        // smallest finite value
  double range = 0.0;         // largest finite value minus the smallest
  std::pair<double, double> best{0.0, 0.0};  // θ extent where it is reached (NaN: +∞ throughout)
  double thetaLow = 0.0, thetaHigh = 0.0;
  double constantTolerance = 0.0;  // a stretch whose values differ by less is "constant"
  std::vector<FlatFacts> flat;
};

std::string describeFinding(const Finding& f, const FindingFacts& facts);

/// A number in three significant digits, "+∞"/"−∞" for infinities.
std::string shortNumber(double v);

}  // namespace barrow
