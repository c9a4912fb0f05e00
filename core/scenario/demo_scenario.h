// The built-in demo: two batches of readings from a line-scan sensor, the second batch
// recorded after the mount slipped sideways. The supports barely overlap, which is where the
// measures disagree most. Used by `barrow` at start-up and by `barrow-cli demo`.
#pragma once

#include "io/session_io.h"

namespace barrow {

/// Deterministic: the same clouds and settings every run. The application ships 300 points
/// per batch; benchmarks also use larger batches of the same scene.
Session demoSession(int pointsPerBatch = 300);

}  // namespace barrow
