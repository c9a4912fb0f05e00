#include "base/row_workers.h"

#include <algorithm>

#include "base/busy_probe.h"
#include "base/run_control.h"

namespace barrow::kernel {

RowWorkers::RowWorkers(int threads) {
  if (threads <= 0) threads = defaultThreadCount();
  for (int t = 1; t < threads; ++t) helpers_.emplace_back([this] { helperLoop(); });
}

RowWorkers::~RowWorkers() {
  {
    std::lock_guard<std::mutex> lock(mutex_);
    stop_ = true;
  }
  wake_.notify_all();
  for (auto& t : helpers_) t.join();
}

void RowWorkers::drain(std::uint32_t generation, const std::function<void(int, int)>& fn, int rows, int grain) {
  const std::uint64_t tag = std::uint64_t(generation) << 32;
  std::uint64_t seen = claim_.load(std::memory_order_relaxed);
  for (;;) {
    if ((seen & ~0xffffffffull) != tag) return;  // a later job: nothing of ours is left
    const int begin = int(seen & 0xffffffffull);
    if (begin >= rows) return;
    const int end = std::min(rows, begin + grain);
    if (!claim_.compare_exchange_weak(seen, tag | std::uint64_t(end), std::memory_order_acq_rel)) continue;
    fn(begin, end);
    if (completed_.fetch_add(end - begin, std::memory_order_acq_rel) + (end - begin) == rows) {
      std::lock_guard<std::mutex> lock(mutex_);  // pairs with the caller's predicate check
      done_.notify_all();
    }
    seen = claim_.load(std::memory_order_relaxed);
  }
}

void RowWorkers::run(int rows, int grain, const std::function<void(int, int)>& fn) {
  if (rows <= 0) return;
  const BusyScope busy;
  grain = std::max(1, grain);
  if (helpers_.empty() || rows <= grain) {
    for (int b = 0; b < rows; b += grain) fn(b, std::min(rows, b + grain));
    return;
  }
  std::uint32_t generation;
  {
    std::lock_guard<std::mutex> lock(mutex_);
    generation = ++generation_;
    job_ = &fn;
    rows_ = rows;
    grain_ = grain;
    completed_.store(0, std::memory_order_relaxed);
    claim_.store(std::uint64_t(generation) << 32, std::memory_order_release);
  }
  wake_.notify_all();
  drain(generation, fn, rows, grain);
  std::unique_lock<std::mutex> lock(mutex_);
  done_.wait(lock, [&] { return completed_.load(std::memory_order_acquire) == rows; });
  job_ = nullptr;
}

void RowWorkers::helperLoop() {
  std::uint32_t seen = 0;
  for (;;) {
    const std::function<void(int, int)>* fn;
    int rows, grain;
    std::uint32_t generation;
    {
      std::unique_lock<std::mutex> lock(mutex_);
      wake_.wait(lock, [&] { return stop_ || (generation_ != seen && job_ != nullptr); });
      if (stop_) return;
      seen = generation = generation_;
      fn = job_;
      rows = rows_;
      grain = grain_;
    }
    // The job stays alive while a claim of its generation can succeed: its caller waits for
    // every claimed row before returning.
    const BusyScope busy;
    drain(generation, *fn, rows, grain);
  }
}

}  // namespace barrow::kernel
