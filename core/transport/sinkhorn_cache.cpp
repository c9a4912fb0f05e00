#include "transport/sinkhorn_cache.h"

#include <chrono>
#include <cstring>
#include <utility>

namespace barrow {

namespace {

// 64-bit hash of a run of doubles, 8 bytes at a time: a multiply–xorshift mix per word
// (the finaliser of splitmix64) [CP]. It only picks the candidate; bytes decide.
std::uint64_t mixWord(std::uint64_t h, std::uint64_t w) {
  h ^= w + 0x9E3779B97F4A7C15ull + (h << 6) + (h >> 2);
  h ^= h >> 30;
  h *= 0xBF58476D1CE4E5B9ull;
  h ^= h >> 27;
  h *= 0x94D049BB133111EBull;
  return h ^ (h >> 31);
}

std::uint64_t mixDoubles(std::uint64_t h, const double* v, Eigen::Index count) {
  h = mixWord(h, std::uint64_t(count));
  for (Eigen::Index k = 0; k < count; ++k) {
    std::uint64_t w;
    std::memcpy(&w, v + k, sizeof w);
    h = mixWord(h, w);
  }
  return h;
}

std::uint64_t mixDouble(std::uint64_t h, double d) { return mixDoubles(h, &d, 1); }

template <class M>
bool sameBytes(const M& stored, const M& given) {
  return stored.rows() == given.rows() && stored.cols() == given.cols() &&
         (stored.size() == 0 ||
          std::memcmp(stored.data(), given.data(), std::size_t(stored.size()) * sizeof(double)) == 0);
}


std::uint64_t hashOptions(const SinkhornOptions& o) {
  std::uint64_t h = mixDouble(0x51CA7E, o.epsilon);
  h = mixWord(h, std::uint64_t(o.p));
  h = mixWord(h, std::uint64_t(o.maxIterations));
  h = mixDouble(h, o.tolerance);
  h = mixWord(h, o.epsilonScaling ? 1 : 0);
  h = mixDouble(h, o.scalingFactor);
  h = mixWord(h, std::uint64_t(o.stageIterations));
  h = mixDouble(h, o.stageTolerance);
  h = mixWord(h, o.overRelaxation ? 1 : 0);
  h = mixWord(h, std::uint64_t(o.coarseGrid));
  h = mixWord(h, std::uint64_t(o.coarseFrom));
  h = mixWord(h, o.truncation ? 1 : 0);
  return mixWord(h, std::uint64_t(o.truncateFrom));
}

std::size_t bytesOf(const Eigen::MatrixX2d& x, const Eigen::VectorXd& a) {
  return std::size_t(x.size() + a.size()) * sizeof(double);
}

// A result that stands for every start: see the header.
bool worthKeeping(const SinkhornResult& r) {
  return r.status == SinkhornStatus::Converged || (r.status == SinkhornStatus::MaxIterations && !r.warmStarted);
}

}  // namespace

// The request's problem; the arrays are the caller's (copied only when an entry is made).
struct SinkhornCache::Key {
  std::uint64_t hash = 0;
  bool symmetric = false;
  SinkhornOptions options;
  const Eigen::MatrixX2d* x = nullptr;
  const Eigen::VectorXd* a = nullptr;
  const Eigen::MatrixX2d* y = nullptr;  // null for the symmetric problem
  const Eigen::VectorXd* b = nullptr;

  Key(const Eigen::MatrixX2d& px, const Eigen::VectorXd& pa, const Eigen::MatrixX2d* py, const Eigen::VectorXd* pb,
      const SinkhornOptions& o)
      : symmetric(py == nullptr), options(o), x(&px), a(&pa), y(py), b(pb) {
    hash = mixWord(hashOptions(o), symmetric ? 2 : 1);
    hash = mixDoubles(hash, px.data(), px.size());
    hash = mixDoubles(hash, pa.data(), pa.size());
    if (py) {
      hash = mixDoubles(hash, py->data(), py->size());
      hash = mixDoubles(hash, pb->data(), pb->size());
    }
  }
};

struct SinkhornCache::Entry {
  std::uint64_t hash = 0;
  bool symmetric = false;
  SinkhornOptions options;
  Eigen::MatrixX2d x, y;
  Eigen::VectorXd a, b;
  bool done = false;  // false while a thread solves it
  SinkhornResult result;
  std::size_t bytes = 0;

  bool matches(const Key& k) const {
    return hash == k.hash && symmetric == k.symmetric && sameSinkhornOptions(options, k.options) && sameBytes(x, *k.x) &&
           sameBytes(a, *k.a) && (symmetric || (sameBytes(y, *k.y) && sameBytes(b, *k.b)));
  }
};

SinkhornCache& SinkhornCache::shared() {
  static SinkhornCache cache;
  return cache;
}

SinkhornCache::SinkhornCache(std::size_t byteBudget, int maxEntries)
    : byteBudget_(byteBudget), maxEntries_(maxEntries) {}

void SinkhornCache::clear() {
  std::lock_guard<std::mutex> lock(mutex_);
  ++generation_;
  // In-flight entries stay until their solver ends (waiters look for them); the rest go.
  entries_.remove_if([](const std::shared_ptr<Entry>& e) { return e->done; });
  stats_ = {};
}

void SinkhornCache::setEnabled(bool enabled) {
  std::lock_guard<std::mutex> lock(mutex_);
  enabled_ = enabled;
}

bool SinkhornCache::enabled() const {
  std::lock_guard<std::mutex> lock(mutex_);
  return enabled_;
}

SinkhornCache::Stats SinkhornCache::stats() const {
  std::lock_guard<std::mutex> lock(mutex_);
  Stats s = stats_;
  s.entries = 0;
  s.bytes = 0;
  for (const auto& e : entries_)
    if (e->done) {
      ++s.entries;
      s.bytes += e->bytes;
    }
  return s;
}

void SinkhornCache::evictLocked() {
  std::size_t bytes = 0;
  int count = 0;
  for (auto it = entries_.begin(); it != entries_.end();) {
    const auto& e = *it;
    if (!e->done) {  // in flight: its owner decides
      ++it;
      continue;
    }
    if (count + 1 > maxEntries_ || bytes + e->bytes > byteBudget_) {
      it = entries_.erase(it);
      continue;
    }
    ++count;
    bytes += e->bytes;
    ++it;
  }
}

SinkhornResult SinkhornCache::through(Key key, const Solver& solver, const RunControl* control, bool* reused) {
  if (reused) *reused = false;
  std::unique_lock<std::mutex> lock(mutex_);
  bool waited = false;
  for (;;) {
    if (!enabled_) {
      lock.unlock();
      return solver();
    }
    auto it = entries_.begin();
    for (; it != entries_.end() && !(*it)->matches(key); ++it) {
    }
    if (it == entries_.end()) break;  // nobody has it: solve it here
    const std::shared_ptr<Entry> e = *it;
    if (e->done) {
      entries_.splice(entries_.begin(), entries_, it);  // most recently used
      ++stats_.hits;
      if (waited) ++stats_.waits;
      if (reused) *reused = true;
      return e->result;
    }
    // Another thread is solving the same problem: wait for it, still answering our cancel.
    waited = true;
    finished_.wait_for(lock, std::chrono::milliseconds(20));
    if (control && control->shouldStop()) {
      SinkhornResult r;
      r.status = SinkhornStatus::Cancelled;
      r.message = "cancelled while the same problem was being solved for another measure";
      return r;
    }
  }

  auto e = std::make_shared<Entry>();
  e->hash = key.hash;
  e->symmetric = key.symmetric;
  e->options = key.options;
  e->x = *key.x;
  e->a = *key.a;
  if (!key.symmetric) {
    e->y = *key.y;
    e->b = *key.b;
  }
  entries_.push_front(e);
  ++stats_.misses;
  const std::uint64_t generation = generation_;
  lock.unlock();

  SinkhornResult r;
  try {
    r = solver();
  } catch (...) {
    lock.lock();
    entries_.remove(e);
    finished_.notify_all();
    throw;
  }

  lock.lock();
  if (worthKeeping(r) && generation == generation_ && enabled_) {
    e->result = r;
    e->bytes = bytesOf(e->x, e->a) + bytesOf(e->y, e->b) + std::size_t(r.f.size() + r.g.size()) * sizeof(double);
    e->done = true;
    evictLocked();
  } else {
    entries_.remove(e);  // waiters find nothing and solve it themselves
  }
  finished_.notify_all();
  return r;
}

SinkhornResult SinkhornCache::solve(const Eigen::MatrixX2d& x, const Eigen::VectorXd& a, const Eigen::MatrixX2d& y,
                                    const Eigen::VectorXd& b, const SinkhornOptions& options,
                                    const RunControl* control, const SinkhornStart* start,
                                    kernel::RowWorkers* workers, bool* reused) {
  return through(Key(x, a, &y, &b, options),
                 [&] { return solveSinkhorn(x, a, y, b, options, control, start, workers); }, control, reused);
}

SinkhornResult SinkhornCache::solveSymmetric(const Eigen::MatrixX2d& x, const Eigen::VectorXd& a,
                                             const SinkhornOptions& options, const RunControl* control,
                                             const Eigen::VectorXd* startF, kernel::RowWorkers* workers,
                                             bool* reused) {
  return through(Key(x, a, nullptr, nullptr, options),
                 [&] { return solveSinkhornSymmetric(x, a, options, control, startF, workers); }, control, reused);
}

}  // namespace barrow
