// Runs replicate work items 0..count-1 on worker threads. Each item must derive its randomness
// from its index alone (ReplicateRng) and write only its own output slots, so the results do
// not depend on the thread count or the order in which threads take items.
#pragma once

#include <functional>

#include "base/run_control.h"

namespace barrow {

/// Calls item(index, inner) for each index; `inner` carries only the caller's cancel flag
/// (progress is reported by this loop, as the fraction of items done, from the calling thread).
/// `threads` 0 = all cores. Returns false when cancelled before every item ran.
bool runReplicates(int count, int threads, const RunControl* control,
                   const std::function<void(int index, const RunControl* inner)>& item);

}  // namespace barrow
