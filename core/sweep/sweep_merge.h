// Several sweeps of the same settings over different measures (the window runs the quick
// measures first, then the slow ones) as one SweepResult, so they are written by the one
// sweep CSV writer. One part comes back unchanged.
#pragma once

#include <vector>

#include "sweep/sweep_result.h"

namespace barrow {

/// θ is the sorted union of the parts' θ; each series keeps its own values, and a θ its part
/// did not evaluate gets NaN with status Cancelled (an empty cell in the CSV). Settings,
/// threads and the refinement tolerance come from the first part; the measures list, point
/// counts and times add up; cancelled and budget flags from any part. Empty input: empty.
SweepResult mergeSweeps(const std::vector<SweepResult>& parts);

}  // namespace barrow
