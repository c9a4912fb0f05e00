#include "kernel/median_distance.h"
#include "kernel/median_grid.h"

#include <algorithm>
#include <bit>
#include <cmath>
#include <cstdint>
#include <deque>
#include <limits>
#include <mutex>
#include <optional>
#include <vector>

namespace barrow {

namespace {

using Index = Eigen::Index;
using Key = std::uint64_t;  // bit pattern of a squared distance (>= +0, so bits order like values)
constexpr Index kRowBlock = 64;
constexpr int kDigitBits = 16;
constexpr std::size_t kBuckets = std::size_t(1) << kDigitBits;

// Scratch buffers handed to whichever thread runs a block; at most one per running thread.
template <class T>
class ScratchPool {
 public:
  T& acquire(std::size_t* slot) {
    std::lock_guard<std::mutex> lock(mutex_);
    if (free_.empty()) {
      items_.emplace_back();
      *slot = items_.size() - 1;
    } else {
      *slot = free_.back();
      free_.pop_back();
    }
    return items_[*slot];
  }
  void release(std::size_t slot) {
    std::lock_guard<std::mutex> lock(mutex_);
    free_.push_back(slot);
  }
  std::deque<T>& items() { return items_; }

 private:
  std::mutex mutex_;
  std::deque<T> items_;  // a deque: growing it keeps references held by other threads valid
  std::vector<std::size_t> free_;
};

class PairKeys {
 public:
  PairKeys(const Eigen::MatrixX2d& p, int threads)
      : n_(p.rows()), x_(p.col(0).data(), p.col(0).data() + n_), y_(p.col(1).data(), p.col(1).data() + n_),
        threads_(threads) {}

  double pairCount() const { return 0.5 * double(n_) * double(n_ - 1); }

  // Runs visit(scratch, keys, count) for every row i with the keys of its pairs (i, j > i),
  // block by block on all cores. Rows are handed over whole so the visitors' loops vectorise.
  template <class T, class Visit>
  bool forAll(ScratchPool<T>& pool, const WorkSlice& slice, Visit&& visit) const {
    const int blocks = int((n_ + kRowBlock - 1) / kRowBlock);
    return runBlocks(
        blocks,
        [&](int b) {
          std::size_t slot = 0;
          T* scratch = &pool.acquire(&slot);
          std::vector<Key> row(static_cast<std::size_t>(n_));
          const Index r1 = std::min(n_, (b + 1) * kRowBlock);
          for (Index i = b * kRowBlock; i < r1; ++i) {
            const double xi = x_[std::size_t(i)], yi = y_[std::size_t(i)];
            const Index count = n_ - i - 1;
            const double* xs = x_.data() + i + 1;
            const double* ys = y_.data() + i + 1;
            for (Index t = 0; t < count; ++t) {
              const double dx = xi - xs[t], dy = yi - ys[t];
              row[std::size_t(t)] = std::bit_cast<Key>(dx * dx + dy * dy);
            }
            visit(*scratch, row.data(), count);
          }
          pool.release(slot);
        },
        slice, threads_);
  }

  // Squared distance of the t-th pair in a fixed pseudo-random order (for sampling).
  Key samplePair(std::uint64_t t) const {
    // SplitMix64 (Steele, Lea, Flood 2014) of t: deterministic, well spread.
    auto mix = [](std::uint64_t z) {
      z += 0x9E3779B97F4A7C15ull;
      z = (z ^ (z >> 30)) * 0xBF58476D1CE4E5B9ull;
      z = (z ^ (z >> 27)) * 0x94D049BB133111EBull;
      return z ^ (z >> 31);
    };
    const auto n = std::uint64_t(n_);
    const std::uint64_t i = mix(2 * t) % n;
    std::uint64_t j = mix(2 * t + 1) % (n - 1);
    if (j >= i) ++j;
    const double dx = x_[i] - x_[j], dy = y_[i] - y_[j];
    return std::bit_cast<Key>(dx * dx + dy * dy);
  }

 private:
  Index n_;
  std::vector<double> x_, y_;
  int threads_;
};

struct Histogram {
  std::vector<std::uint64_t> count = std::vector<std::uint64_t>(kBuckets, 0);
};

bool hasPrefix(Key key, Key prefix, int prefixBits) {
  return prefixBits == 0 || (key >> (64 - prefixBits)) == prefix;
}

// The key of rank r (0-based, ascending), and what the search learnt about its neighbours.
struct RankSearch {
  Key key = 0;
  std::uint64_t countAtMost = 0;  // keys <= key (known exactly)
  bool haveNext = false;          // smallest key > key, when the final buffer showed it
  Key next = 0;
  int passes = 0;
  bool complete = true;
};

// Finishes a search: `cand` holds every key of ranks [below, below + cand.size()).
void selectAmong(std::vector<Key>& cand, std::uint64_t below, std::uint64_t r, RankSearch& out) {
  const auto pos = std::size_t(r - below);
  std::nth_element(cand.begin(), cand.begin() + std::ptrdiff_t(pos), cand.end());
  out.key = cand[pos];
  out.countAtMost = below + pos + 1;
  for (std::size_t t = pos + 1; t < cand.size(); ++t) {
    if (cand[t] == out.key) ++out.countAtMost;
    else if (!out.haveNext || cand[t] < out.next) { out.haveNext = true; out.next = cand[t]; }
  }
}

// Streamed radix selection of the key of rank r over all pairs.
RankSearch selectRank(const PairKeys& keys, std::uint64_t r, std::size_t candidateLimit,
                      const WorkSlice& slice) {
  RankSearch out;
  Key prefix = 0;
  int prefixBits = 0;
  std::uint64_t below = 0;  // keys smaller than every key with the current prefix
  std::uint64_t inPrefix = std::uint64_t(keys.pairCount());
  auto passSlice = [&](int pass) { return slice.sub(pass / 4.0, std::min(1.0, (pass + 1) / 4.0)); };

  while (prefixBits < 64 && inPrefix > candidateLimit) {
    const int shift = 64 - prefixBits - kDigitBits;
    ScratchPool<Histogram> pool;
    out.complete = keys.forAll(pool, passSlice(out.passes), [&](Histogram& h, const Key* row, Index count) {
      for (Index t = 0; t < count; ++t)
        if (hasPrefix(row[t], prefix, prefixBits)) ++h.count[std::size_t((row[t] >> shift) & (kBuckets - 1))];
    });
    ++out.passes;
    if (!out.complete) return out;
    std::vector<std::uint64_t> total(kBuckets, 0);
    for (const auto& h : pool.items())
      for (std::size_t d = 0; d < kBuckets; ++d) total[d] += h.count[d];
    std::size_t digit = 0;
    while (below + total[digit] <= r) below += total[digit++];
    prefix = (prefix << kDigitBits) | Key(digit);
    prefixBits += kDigitBits;
    inPrefix = total[digit];
  }
  if (prefixBits == 64) {  // every key in the bucket is the same value
    out.key = prefix;
    out.countAtMost = below + inPrefix;
    return out;
  }
  ScratchPool<std::vector<Key>> pool;
  out.complete = keys.forAll(pool, passSlice(out.passes), [&](std::vector<Key>& buf, const Key* row, Index count) {
    for (Index t = 0; t < count; ++t)
      if (hasPrefix(row[t], prefix, prefixBits)) buf.push_back(row[t]);
  });
  ++out.passes;
  if (!out.complete) return out;
  std::vector<Key> cand;
  cand.reserve(std::size_t(inPrefix));
  for (auto& buf : pool.items()) cand.insert(cand.end(), buf.begin(), buf.end());
  selectAmong(cand, below, r, out);
  return out;
}

// One pass instead of several: a deterministic sample of pairs brackets rank r between two
// sample quantiles (5 standard deviations of the sample quantile either side), and the pass
// counts the keys below the bracket and collects those inside it. nullopt when the bracket
// misses rank r or would hold more than candidateLimit keys (then use selectRank).
std::optional<RankSearch> selectRankInBracket(const PairKeys& keys, std::uint64_t r, std::size_t candidateLimit,
                                              const WorkSlice& slice) {
  // Bracket +-5 sd of the sample quantile wide: it holds a share ~5/sqrt(S) of the pairs, so
  // the sample S is sized to keep that under half the candidate limit (capped at 2^23).
  const double m = keys.pairCount(), p = double(r) / m;
  const double wanted = std::pow(12.0 * m / double(candidateLimit), 2.0);  // 20 % margin
  const auto kSample = std::size_t(std::clamp(wanted, 65536.0, 8388608.0));
  const double halfWidth = 5.0 * std::sqrt(p * (1 - p) * double(kSample)) + 1;  // in sample ranks
  if (2.0 * halfWidth / double(kSample) * m > 0.5 * double(candidateLimit)) return std::nullopt;
  std::vector<Key> sample(kSample);
  for (std::size_t t = 0; t < kSample; ++t) sample[t] = keys.samplePair(t);
  const double centre = p * double(kSample);
  const auto loIdx = std::size_t(std::max(0.0, centre - halfWidth));
  const auto hiIdx = std::size_t(std::min(double(kSample - 1), centre + halfWidth));
  std::nth_element(sample.begin(), sample.begin() + std::ptrdiff_t(loIdx), sample.end());
  const Key lo = sample[loIdx];
  std::nth_element(sample.begin() + std::ptrdiff_t(loIdx), sample.begin() + std::ptrdiff_t(hiIdx), sample.end());
  const Key width = sample[hiIdx] - lo;  // keys k with lo <= k <= hi are those with k - lo <= width

  struct Slot {
    std::uint64_t below = 0;
    std::vector<Key> inside;
  };
  ScratchPool<Slot> pool;
  RankSearch out;
  out.complete = keys.forAll(pool, slice, [&](Slot& s, const Key* row, Index count) {
    std::uint64_t below = 0;
    for (Index t = 0; t < count; ++t) below += row[t] < lo;
    s.below += below;
    if (s.inside.size() > candidateLimit) return;  // overflowing: the check below rejects it
    for (Index t = 0; t < count; ++t)
      if (row[t] - lo <= width) s.inside.push_back(row[t]);
  });
  out.passes = 1;
  if (!out.complete) return out;
  std::uint64_t below = 0;
  std::size_t inside = 0;
  for (const auto& s : pool.items()) below += s.below, inside += s.inside.size();
  if (inside > candidateLimit || below > r || below + inside <= r) return std::nullopt;
  std::vector<Key> cand;
  cand.reserve(inside);
  for (auto& s : pool.items()) cand.insert(cand.end(), s.inside.begin(), s.inside.end());
  selectAmong(cand, below, r, out);
  return out;
}

double distanceOf(Key key) { return std::sqrt(std::bit_cast<double>(key)); }

MedianDistance direct(const Eigen::MatrixX2d& p) {
  const Index n = p.rows();
  std::vector<double> d2;
  d2.reserve(std::size_t(n) * std::size_t(n - 1) / 2);
  for (Index i = 0; i < n; ++i)
    for (Index j = i + 1; j < n; ++j) {
      const double dx = p(i, 0) - p(j, 0), dy = p(i, 1) - p(j, 1);
      d2.push_back(dx * dx + dy * dy);
    }
  const std::size_t m = d2.size(), lo = (m - 1) / 2;
  std::nth_element(d2.begin(), d2.begin() + std::ptrdiff_t(lo), d2.end());
  double a = std::sqrt(d2[lo]), b = a;
  if (m % 2 == 0) b = std::sqrt(*std::min_element(d2.begin() + std::ptrdiff_t(lo) + 1, d2.end()));
  MedianDistance out;
  out.value = 0.5 * (a + b);
  out.pairs = double(m);
  out.passes = 1;
  out.method = "exact: all " + std::to_string(m) + " pairwise distances sorted";
  return out;
}

}  // namespace

MedianDistance medianPairwiseDistance(const Eigen::MatrixX2d& points, const WorkSlice& slice,
                                      const MedianDistanceOptions& options) {
  if (points.rows() <= options.directLimit) return direct(points);
  if (options.cellGrid)
    if (auto g = medianByCellGrid(points, slice, options)) return *g;
  const PairKeys keys(points, options.threads);
  const auto m = std::uint64_t(keys.pairCount());
  const std::uint64_t lo = (m - 1) / 2, hi = m / 2;
  MedianDistance out;
  out.pairs = double(m);
  const std::size_t limit = std::max<std::size_t>(options.candidateLimit, 1);
  std::optional<RankSearch> bracketed;
  if (options.sampleBracket && double(m) > double(limit)) bracketed = selectRankInBracket(keys, lo, limit, slice);
  const bool inBracket = bracketed.has_value();
  const RankSearch s = inBracket ? *bracketed : selectRank(keys, lo, limit, slice);
  out.passes = s.passes;
  out.complete = s.complete;
  if (!s.complete) return out;
  Key upper = s.key;  // key of rank hi
  if (hi != lo && s.countAtMost <= hi) {
    if (s.haveNext) {
      upper = s.next;
    } else {  // the median's bucket ended at rank lo: one more pass for the next larger key
      ScratchPool<Key> pool;
      out.complete = keys.forAll(pool, slice.sub(0.9, 1.0), [&](Key& best, const Key* row, Index count) {
        for (Index t = 0; t < count; ++t)
          if (row[t] > s.key && (best == 0 || row[t] < best)) best = row[t];
      });
      ++out.passes;
      if (!out.complete) return out;
      upper = std::numeric_limits<Key>::max();
      for (Key k : pool.items())
        if (k != 0) upper = std::min(upper, k);
    }
  }
  out.value = 0.5 * (distanceOf(s.key) + distanceOf(upper));
  out.method = std::string("exact: streamed ") + (inBracket ? "selection inside a sampled bracket" : "radix selection") +
               " over all " + std::to_string(m) + " pairwise distances (" + std::to_string(out.passes) + " passes)";
  return out;
}

}  // namespace barrow
