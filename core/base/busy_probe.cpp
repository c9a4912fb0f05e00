#include "base/busy_probe.h"

#include <atomic>

namespace barrow {

namespace {
std::atomic<bool> enabled{false};
std::atomic<int> busy{0};
std::atomic<int> highest{0};
thread_local int depth = 0;
}  // namespace

void BusyProbe::start() {
  busy.store(0);
  highest.store(0);
  enabled.store(true);
}

void BusyProbe::stop() { enabled.store(false); }

int BusyProbe::peak() { return highest.load(); }

BusyScope::BusyScope() {
  if (depth++ != 0 || !enabled.load(std::memory_order_relaxed)) return;
  counted_ = true;
  const int now = busy.fetch_add(1) + 1;
  int seen = highest.load();
  while (now > seen && !highest.compare_exchange_weak(seen, now)) {
  }
}

BusyScope::~BusyScope() {
  --depth;
  if (counted_) busy.fetch_sub(1);
}

}  // namespace barrow
