// Qt-free progress, cancellation and thread budget, passed down to every long computation.
#pragma once

#include <atomic>
#include <functional>

namespace barrow {

/// Passed down to solvers. Every member is optional.
struct RunControl {
  /// Set from another thread to ask the computation to stop at its next check.
  const std::atomic<bool>* cancel = nullptr;
  /// Called now and then with the fraction done in [0,1]; returning false also stops.
  std::function<bool(double fraction)> onProgress;
  /// Threads this computation may keep busy at once, counting the calling thread, including
  /// everything it starts (row teams, block runners). 0 = one per core. A caller that runs
  /// several computations side by side divides its own budget between them.
  int threads = 0;

  /// True when the work should stop; reports `fraction` to onProgress when given (>= 0).
  bool shouldStop(double fraction = -1.0) const {
    if (cancel && cancel->load(std::memory_order_relaxed)) return true;
    if (onProgress && fraction >= 0.0) return !onProgress(fraction);
    return false;
  }

  /// This control seen through a window of its progress: fraction f of the part is reported
  /// as lo + (hi − lo)·f, so that consecutive parts report one rising fraction. Same cancel
  /// flag and thread budget. The result refers to *this, which must outlive it.
  RunControl sub(double lo, double hi) const {
    RunControl r;
    r.cancel = cancel;
    r.threads = threads;
    if (onProgress) r.onProgress = [this, lo, hi](double f) { return onProgress(lo + (hi - lo) * f); };
    return r;
  }
};

/// One per hardware thread (at least 1).
int defaultThreadCount();

/// Threads a computation under `control` may use: its budget, or one per core when it has
/// none (null control or threads = 0). At least 1.
int threadBudget(const RunControl* control);

}  // namespace barrow
