// A small fixed team of threads that splits row loops of the kernel passes between cores.
#pragma once

#include <atomic>
#include <condition_variable>
#include <functional>
#include <mutex>
#include <thread>
#include <vector>

namespace barrow::kernel {

/// Runs `fn(begin, end)` over [0, rows) in chunks, on the calling thread plus `threads - 1`
/// helpers that live as long as the object (a solve creates one and reuses it every pass,
/// so a pass costs one wake-up, not a thread start). Chunks are handed out dynamically, so a
/// core busy with other work simply takes fewer of them. Not reentrant: one run at a time.
class RowWorkers {
 public:
  /// threads <= 0: one per hardware thread.
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
  void drain();

  std::vector<std::thread> helpers_;
  std::mutex mutex_;
  std::condition_variable wake_;
  std::condition_variable done_;
  const std::function<void(int, int)>* job_ = nullptr;
  int rows_ = 0;
  int grain_ = 1;
  std::atomic<int> next_{0};
  unsigned long generation_ = 0;
  int busy_ = 0;
  bool stop_ = false;
};

}  // namespace barrow::kernel
