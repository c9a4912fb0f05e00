// Counts the threads doing engine work at the same moment, so a test can check that nested
// parallelism stays within the thread budget (run_control.h) by counting, not timing.
// Off unless a test switches it on; then each marked region costs two atomic updates.
#pragma once

namespace barrow {

class BusyProbe {
 public:
  /// Starts counting from zero (and clears the peak).
  static void start();
  static void stop();
  /// Most threads seen busy at once since start().
  static int peak();
};

/// Marks the calling thread busy while alive. Nested scopes on one thread count once, so a
/// thread that runs a row team's share of work inside a sweep's θ step is one busy thread.
class BusyScope {
 public:
  BusyScope();
  ~BusyScope();
  BusyScope(const BusyScope&) = delete;
  BusyScope& operator=(const BusyScope&) = delete;

 private:
  bool counted_ = false;
};

}  // namespace barrow
