// The window sweeps in passes (cheap measures first, slow ones after), each on its own θ grid
// after refinement. A report needs one table: this merges the passes on the union of their
// θ values; a measure has no value at a θ only the other pass computed (NaN, status
// Cancelled: an empty CSV cell, exactly as the window's own CSV export leaves it).
#pragma once

#include <vector>

#include "sweep/sweep_result.h"

namespace barrow {

SweepResult mergeSweepPasses(const std::vector<SweepResult>& passes);

}  // namespace barrow
