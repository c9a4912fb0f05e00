// A small fixed team of threads that splits row loops of the kernel passes between cores.
#pragma once

#include <atomic>
#include <condition_variable>
#include <cstdint>
#include <functional>
#include <mutex>
#include <thread>
#include <vector>

namespace barrow::kernel {

/// Runs `fn(begin, end)` over [0, rows) in chunks, on the calling thread plus `threads - 1`
/// helpers that live as long as the object (a solve creates one and reuses it every pass,
/// so a pass costs one wake-up, not a thread start). Chunks are claimed dynamically, and the
/// caller waits only for chunks a helper actually took: on a loaded machine a helper that
/// wakes late finds the work done and the caller never waits for it. Not reentrant.
class RowWorkers {
 public:
  /// threads <= 0: one per hardware thread. Callers under a RunControl pass
  /// threadBudget(control) (run_control.h), so nested teams stay within the budget.
  explicit RowWorkers(int threads = 0);
  ~RowWorkers();
  RowWorkers(const RowWorkers&) = delete;
  RowWorkers& operator=(const RowWorkers&) = delete;

  int threads() const { return int(helpers_.size()) + 1; }

  /// Calls fn on disjoint row ranges covering [0, rows), each at most `grain` rows long;
  /// returns when all are done. fn must not throw.
  void run(int rows, int grain, const std::function<void(int, int)>& fn);

 private:
  void helperLoop();
  // Claims and runs chunks of job `generation` until none is left.
  void drain(std::uint32_t generation, const std::function<void(int, int)>& fn, int rows, int grain);

  std::vector<std::thread> helpers_;
  std::mutex mutex_;
  std::condition_variable wake_;
  std::condition_variable done_;
  // The current job, read under mutex_ by a waking helper.
  const std::function<void(int, int)>* job_ = nullptr;
  int rows_ = 0;
  int grain_ = 1;
  std::uint32_t generation_ = 0;
  bool stop_ = false;
  // (generation << 32) | next row: a claim succeeds only for the job it was meant for.
  std::atomic<std::uint64_t> claim_{0};
  std::atomic<int> completed_{0};  // rows finished in the current job
};

}  // namespace barrow::kernel
