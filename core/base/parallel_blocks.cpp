#include "base/parallel_blocks.h"

#include "base/busy_probe.h"

#include <algorithm>
#include <atomic>
#include <exception>
#include <mutex>
#include <thread>
#include <vector>

namespace barrow {

bool runBlocks(int blocks, const std::function<void(int)>& work, const WorkSlice& slice, int threads) {
  if (blocks <= 0) return true;
  const RunControl* ctl = slice.control;
  if (threads <= 0) threads = threadBudget(ctl);
  else if (ctl && ctl->threads > 0) threads = std::min(threads, ctl->threads);
  threads = std::max(1, std::min(threads, blocks));

  std::atomic<int> next{0};
  std::atomic<int> done{0};
  std::atomic<bool> stop{false};
  std::exception_ptr failure;
  std::mutex failureMutex;

  // worker(true) runs on the calling thread and is the only one that reports progress.
  auto worker = [&](bool reporter) {
    const BusyScope busy;
    try {
      for (;;) {
        if (stop.load(std::memory_order_relaxed)) return;
        const double fraction = double(done.load(std::memory_order_relaxed)) / blocks;
        const bool halt = ctl && (reporter ? ctl->shouldStop(slice.from + (slice.to - slice.from) * fraction)
                                           : ctl->shouldStop());
        if (halt) {
          stop.store(true);
          return;
        }
        const int b = next.fetch_add(1);
        if (b >= blocks) return;
        work(b);
        done.fetch_add(1, std::memory_order_relaxed);
      }
    } catch (...) {
      std::lock_guard<std::mutex> lock(failureMutex);
      if (!failure) failure = std::current_exception();
      stop.store(true);
    }
  };

  std::vector<std::thread> pool;
  pool.reserve(std::size_t(threads - 1));
  for (int t = 1; t < threads; ++t) pool.emplace_back(worker, false);
  worker(true);
  for (auto& th : pool) th.join();
  if (failure) std::rethrow_exception(failure);
  if (stop.load()) return false;
  if (ctl) (void)ctl->shouldStop(slice.to);  // all blocks ran: report completion, result stands
  return true;
}

}  // namespace barrow
