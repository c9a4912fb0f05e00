// Findings read against the resampling bands of a sweep (sweep --resamples): is a jump larger
// than the sample-to-sample spread on both sides of it, and does a flat stretch stay flat under
// resampling? Kept apart from the continuity rules: it takes a finished Finding and the band
// columns and only adds words.
#pragma once

#include <string>
#include <vector>

#include "sweep/findings.h"
#include "sweep/sweep_result.h"

namespace barrow {

struct JumpAgainstBand {
  double theta = 0.0, size = 0.0;
  double spreadLeft = NAN, spreadRight = NAN;  // band width (high − low) at the θ on each side
  bool beyondSpread = false;                   // |size| > both widths
};

struct FlatAgainstBand {
  double from = 0.0, to = 0.0;
  double bandMove = NAN;                       // largest change of low or high over the stretch
  bool survives = false;                       // bandMove ≤ 1 % of the series' value range [CP]
};

struct BandReading {
  std::vector<JumpAgainstBand> jumps;
  std::vector<FlatAgainstBand> flat;
  std::vector<std::string> notes;              // one sentence per jump and flat stretch
};

/// Pre: s.low/s.high have one entry per θ (empty → an empty reading).
BandReading readAgainstBands(const Finding& f, const std::vector<double>& theta, const SweepSeries& s);

}  // namespace barrow
