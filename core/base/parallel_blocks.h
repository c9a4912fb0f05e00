// Runs independent blocks of work on all cores with std::thread, polling RunControl between
// blocks. The building block of the pair sums, the median heuristic and the batched
// nearest-neighbour queries.
#pragma once

#include <functional>

#include "base/run_control.h"

namespace barrow {

/// The part of a caller's progress bar one call covers: fractions done are reported as
/// from + (to - from) * done.
struct WorkSlice {
  const RunControl* control = nullptr;
  double from = 0.0;
  double to = 1.0;

  WorkSlice sub(double a, double b) const { return {control, from + (to - from) * a, from + (to - from) * b}; }
};

/// Calls work(block) once for every block in [0, blocks), on up to threadBudget(control)
/// threads (the calling thread is one of them), taking blocks in increasing order.
/// Cancellation is checked between blocks from every thread; progress is reported only from
/// the calling thread, so RunControl::onProgress never runs concurrently with itself.
/// Returns false when stopped early (some blocks were then not run).
/// `threads` = 0 uses the control's thread budget; a larger request is cut to that budget;
/// 1 runs everything on the calling thread.
/// An exception thrown by `work` is rethrown here after all threads have joined.
bool runBlocks(int blocks, const std::function<void(int block)>& work, const WorkSlice& slice,
               int threads = 0);

}  // namespace barrow
