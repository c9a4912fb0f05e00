// Qt-free progress and cancellation hook, polled by long computations.
#pragma once

#include <atomic>
#include <functional>

namespace barrow {

/// Passed down to solvers. Both members are optional.
struct RunControl {
  /// Set from another thread to ask the computation to stop at its next check.
  const std::atomic<bool>* cancel = nullptr;
  /// Called now and then with the fraction done in [0,1]; returning false also stops.
  std::function<bool(double fraction)> onProgress;

  /// True when the work should stop; reports `fraction` to onProgress when given (>= 0).
  bool shouldStop(double fraction = -1.0) const {
    if (cancel && cancel->load(std::memory_order_relaxed)) return true;
    if (onProgress && fraction >= 0.0) return !onProgress(fraction);
    return false;
  }
};

}  // namespace barrow
