#include "transport/kernel_pass_threads.h"

#include <algorithm>

namespace barrow::kernel {

RowWorkers::RowWorkers(int threads) {
  if (threads <= 0) threads = int(std::max(1u, std::thread::hardware_concurrency()));
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

void RowWorkers::drain() {
  const auto& fn = *job_;
  for (;;) {
    const int begin = next_.fetch_add(grain_, std::memory_order_relaxed);
    if (begin >= rows_) return;
    fn(begin, std::min(rows_, begin + grain_));
  }
}

void RowWorkers::run(int rows, int grain, const std::function<void(int, int)>& fn) {
  if (rows <= 0) return;
  grain = std::max(1, grain);
  if (helpers_.empty() || rows <= grain) {
    for (int b = 0; b < rows; b += grain) fn(b, std::min(rows, b + grain));
    return;
  }
  {
    std::lock_guard<std::mutex> lock(mutex_);
    job_ = &fn;
    rows_ = rows;
    grain_ = grain;
    next_.store(0, std::memory_order_relaxed);
    busy_ = int(helpers_.size());
    ++generation_;
  }
  wake_.notify_all();
  drain();
  std::unique_lock<std::mutex> lock(mutex_);
  done_.wait(lock, [this] { return busy_ == 0; });
  job_ = nullptr;
}

void RowWorkers::helperLoop() {
  unsigned long seen = 0;
  for (;;) {
    {
      std::unique_lock<std::mutex> lock(mutex_);
      wake_.wait(lock, [&] { return stop_ || generation_ != seen; });
      if (stop_) return;
      seen = generation_;
    }
    drain();
    {
      std::lock_guard<std::mutex> lock(mutex_);
      --busy_;
    }
    done_.notify_one();
  }
}

}  // namespace barrow::kernel
