#include "kernel/median_grid.h"

#include <algorithm>
#include <cmath>
#include <cstdint>
#include <deque>
#include <limits>
#include <mutex>
#include <vector>

#include "kernel/pair_grid.h"

namespace barrow {

namespace {

using Count = std::int64_t;
constexpr int kBuckets = 1 << 12;  // 32 KiB of counts: the histogram stays in L1
constexpr double kOccupancy = 2.0;  // points per cell: fewer pairs straddle the bracket, more cells to count

// Which cell offsets (|dx|, |dy|) lie wholly below lo2 and which not wholly beyond hi2, per |dy|:
// |dx| <= below[dy]: every pair is < lo2; |dx| <= reach[dy]: some pair may be <= hi2. Rows
// after the last entry are wholly beyond. `margin` absorbs rounding in the cell assignment.
struct OffsetTable {
  std::vector<int> below, reach;
};

OffsetTable classify(double s, double margin, double lo2, double hi2, int maxDx, int maxDy) {
  OffsetTable t;
  auto sq = [](double v) { return v * v; };
  for (int dy = 0; dy <= maxDy; ++dy) {
    int b = -1;
    while (b < maxDx && sq(s * std::hypot(b + 2.0, dy + 1.0) + margin) < lo2 * (1 - 1e-12)) ++b;
    int r = -1;
    while (r < maxDx &&
           sq(std::max(0.0, s * std::hypot(double(std::max(r, 0)), double(std::max(dy - 1, 0))) - margin)) <=
               hi2 * (1 + 1e-12))
      ++r;
    if (r < 0) break;
    t.below.push_back(b);
    t.reach.push_back(r);
  }
  return t;
}

// What one pass learns. In histogram mode, the pairs in [lo2, hi2] are histogrammed; in collect
// mode, pairs whose bucket is below `first` count as below and those in [first, last] are kept.
struct PassSpec {
  double lo2 = 0, hi2 = 0, scale = 0;
  int first = 0, last = kBuckets - 1;
  bool collect = false;
  int bucket(double d2) const { return std::min(kBuckets - 1, int((d2 - lo2) * scale)); }
};

struct PassAcc {
  Count ordered = 0;  // ordered pairs counted wholesale (both orders, same point included)
  Count below = 0;    // unordered pairs visited and found below
  std::vector<double> bx, by;  // scratch: the points one cell is paired with
  std::vector<Count> hist;
  std::vector<double> kept;
  double minIn = std::numeric_limits<double>::infinity(), maxIn = -std::numeric_limits<double>::infinity();
};

class AccPool {  // one accumulator per running thread
 public:
  PassAcc& acquire(std::size_t* slot, bool hist) {
    std::lock_guard<std::mutex> lock(m_);
    if (free_.empty()) {
      items_.emplace_back();
      if (hist) items_.back().hist.assign(kBuckets, 0);
      *slot = items_.size() - 1;
    } else {
      *slot = free_.back();
      free_.pop_back();
    }
    return items_[*slot];
  }
  void release(std::size_t slot) {
    std::lock_guard<std::mutex> lock(m_);
    free_.push_back(slot);
  }
  std::deque<PassAcc>& items() { return items_; }

 private:
  std::mutex m_;
  std::deque<PassAcc> items_;
  std::vector<std::size_t> free_;
};

struct PassResult {
  Count below = 0;  // unordered pairs below (d2 < lo2, or bucket < first in collect mode)
  std::vector<Count> hist;
  std::vector<double> kept;
  double minIn = 0, maxIn = 0;
  bool complete = true;
};

class GridRanks {
 public:
  GridRanks(const Eigen::MatrixX2d& p, int threads) : n_(p.rows()), threads_(threads) {
    const Eigen::Vector2d lo = p.colwise().minCoeff(), hi = p.colwise().maxCoeff();
    const double ex = hi.x() - lo.x(), ey = hi.y() - lo.y();
    // About kOccupancy points per cell on a filled box; never more than ~(1/kOccupancy + 4) n cells.
    double s = std::sqrt(ex * ey * kOccupancy / double(n_));
    s = std::max(s, std::max(ex, ey) / (2.0 * double(n_)));
    const int cols = int(std::floor(ex / s)) + 1, rows = int(std::floor(ey / s)) + 1;
    grid_.emplace(p, lo, s, cols, rows);
    margin_ = 1e-9 * (s + std::abs(lo.x()) + std::abs(lo.y()) + ex + ey);
    maxD2_ = (ex * ex + ey * ey) * (1 + 1e-9) + margin_;
  }

  Count n() const { return n_; }
  double maxD2() const { return maxD2_; }

  PassResult pass(const PassSpec& spec, double classLo2, double classHi2, const WorkSlice& slice) const {
    const PairGrid& g = *grid_;
    const OffsetTable t = classify(g.cell(), margin_, classLo2, classHi2, g.cols() - 1, g.rows() - 1);
    AccPool pool;
    PassResult out;
    out.complete = runBlocks(
        g.rows(),
        [&](int cy) {
          std::size_t slot = 0;
          PassAcc& acc = pool.acquire(&slot, !spec.collect);
          row(spec, t, cy, acc);
          pool.release(slot);
        },
        slice, threads_);
    if (!out.complete) return out;
    Count ordered = 0;
    if (!spec.collect) out.hist.assign(kBuckets, 0);
    out.minIn = std::numeric_limits<double>::infinity();
    out.maxIn = -out.minIn;
    for (auto& a : pool.items()) {
      ordered += a.ordered;
      out.below += a.below;
      if (!spec.collect)
        for (int b = 0; b < kBuckets; ++b) out.hist[std::size_t(b)] += a.hist[std::size_t(b)];
      out.kept.insert(out.kept.end(), a.kept.begin(), a.kept.end());
      out.minIn = std::min(out.minIn, a.minIn);
      out.maxIn = std::max(out.maxIn, a.maxIn);
    }
    // Wholesale counts are ordered and, when offset 0 is wholesale, include each point with itself.
    const bool selfCounted = !t.below.empty() && t.below[0] >= 0;
    out.below += (ordered - (selfCounted ? Count(n_) : 0)) / 2;
    return out;
  }

 private:
  // Row cy against the rows within reach, offset by offset (dy outer, cx inner, so the cell
  // starts and points of the other row are read in order).
  void row(const PassSpec& spec, const OffsetTable& t, int cy, PassAcc& acc) const {
    const PairGrid& g = *grid_;
    const int depth = int(t.below.size());
    if (depth == 0) return;
    for (int dy = -(depth - 1); dy < depth; ++dy) {  // wholesale: both directions, ordered pairs
      const int ry = cy + dy, a = t.below[std::size_t(std::abs(dy))];
      if (ry < 0 || ry >= g.rows() || a < 0) continue;
      for (int cx = 0; cx < g.cols(); ++cx)
        if (const Count nc = g.count(cx, cy); nc > 0) acc.ordered += nc * (g.rowEnd(cx + a, ry) - g.rowBegin(cx - a, ry));
    }
    const double* xs = g.x();
    const double* ys = g.y();
    // Straddling offsets, one direction only: the points they reach are gathered once per cell
    // so that each of the cell's points meets them in one long loop.
    for (int cx = 0; cx < g.cols(); ++cx) {
      const Count c0 = g.begin(cx, cy), c1 = g.end(cx, cy);
      if (c0 == c1) continue;
      acc.bx.clear();
      acc.by.clear();
      auto gather = [&](Count j0, Count j1) {
        acc.bx.insert(acc.bx.end(), xs + j0, xs + std::max(j0, j1));
        acc.by.insert(acc.by.end(), ys + j0, ys + std::max(j0, j1));
      };
      for (int dy = 0; dy < depth && cy + dy < g.rows(); ++dy) {
        const int a = t.below[std::size_t(dy)], r = t.reach[std::size_t(dy)], ry = cy + dy;
        if (dy == 0) {
          const int a0 = std::max(a + 1, 1);
          if (a0 <= r) gather(g.rowBegin(cx + a0, cy), g.rowEnd(cx + r, cy));
        } else if (a < 0) {
          gather(g.rowBegin(cx - r, ry), g.rowEnd(cx + r, ry));
        } else if (a < r) {
          gather(g.rowBegin(cx - r, ry), g.rowEnd(cx - a - 1, ry));
          gather(g.rowBegin(cx + a + 1, ry), g.rowEnd(cx + r, ry));
        }
      }
      const Count m = Count(acc.bx.size());
      for (Count k = c0; k < c1; ++k) {
        if (t.below[0] < 0) visit(spec, xs[k], ys[k], xs, ys, k + 1, c1, acc);  // same cell, j > k
        visit(spec, xs[k], ys[k], acc.bx.data(), acc.by.data(), 0, m, acc);
      }
    }
  }

  // Counts the pairs (xi, yi)-(j) below the bracket and files those inside it, j in [j0, j1).
  // Squared distances are formed in chunks (a loop that vectorises), then scanned.
  void visit(const PassSpec& spec, double xi, double yi, const double* xs, const double* ys, Count j0, Count j1,
             PassAcc& acc) const {
    constexpr Count kChunk = 64;
    double in[kChunk];  // the chunk's values inside the bracket, compacted without branches
    Count below = 0;
    double lo = acc.minIn, hi = acc.maxIn;
    for (Count c0 = j0; c0 < j1; c0 += kChunk) {
      const Count len = std::min(kChunk, j1 - c0);
      Count inside = 0;
      for (Count t = 0; t < len; ++t) {
        const double dx = xi - xs[c0 + t], dy = yi - ys[c0 + t];
        const double d2 = dx * dx + dy * dy;
        below += d2 < spec.lo2;
        in[inside] = d2;
        inside += (d2 >= spec.lo2) & (d2 <= spec.hi2);
      }
      for (Count t = 0; t < inside; ++t) {
        const double v = in[t];
        const int b = spec.bucket(v);
        if (spec.collect) {
          if (b < spec.first) ++below;
          else if (b <= spec.last) acc.kept.push_back(v);
        } else {
          ++acc.hist[std::size_t(b)];
          lo = std::min(lo, v);
          hi = std::max(hi, v);
        }
      }
    }
    acc.below += below;
    acc.minIn = lo;
    acc.maxIn = hi;
  }

  Count n_;
  int threads_;
  std::optional<PairGrid> grid_;
  double margin_ = 0, maxD2_ = 0;
};

// Squared distances of a deterministic sample of pairs (SplitMix64 indices), for the bracket.
std::vector<double> samplePairs(const Eigen::MatrixX2d& p, std::size_t count) {
  auto mix = [](std::uint64_t z) {
    z += 0x9E3779B97F4A7C15ull;
    z = (z ^ (z >> 30)) * 0xBF58476D1CE4E5B9ull;
    z = (z ^ (z >> 27)) * 0x94D049BB133111EBull;
    return z ^ (z >> 31);
  };
  const auto n = std::uint64_t(p.rows());
  std::vector<double> out(count);
  for (std::size_t t = 0; t < count; ++t) {
    const std::uint64_t i = mix(2 * t) % n;
    std::uint64_t j = mix(2 * t + 1) % (n - 1);
    if (j >= i) ++j;
    const double dx = p(Eigen::Index(i), 0) - p(Eigen::Index(j), 0), dy = p(Eigen::Index(i), 1) - p(Eigen::Index(j), 1);
    out[t] = dx * dx + dy * dy;
  }
  return out;
}

double sampleQuantile(std::vector<double>& sample, double q) {
  const auto k = std::size_t(std::clamp(q, 0.0, 1.0) * double(sample.size() - 1));
  std::nth_element(sample.begin(), sample.begin() + std::ptrdiff_t(k), sample.end());
  return sample[k];
}

}  // namespace

std::optional<MedianDistance> medianByCellGrid(const Eigen::MatrixX2d& points, const WorkSlice& slice,
                                               const MedianDistanceOptions& options) {
  const Count n = points.rows();
  const Count m = n * (n - 1) / 2, rLo = (m - 1) / 2, rHi = m / 2;
  MedianDistance out;
  out.pairs = double(m);
  const Eigen::Vector2d extent = points.colwise().maxCoeff() - points.colwise().minCoeff();
  if (!(extent.x() > 0) && !(extent.y() > 0)) {  // all points coincide
    out.value = 0.0;
    out.method = "exact: all points coincide";
    return out;
  }
  const GridRanks ranks(points, options.threads);
  const auto limit = Count(std::max<std::size_t>(options.candidateLimit, 16));  // two middle values may differ

  // Bracket: +-z standard deviations of the sample quantile around the median's share.
  const auto sampleSize = std::size_t(std::clamp(double(m) / 1000.0, 65536.0, 2097152.0));
  std::vector<double> sample = samplePairs(points, sampleSize);
  const double sd = 0.5 / std::sqrt(double(sampleSize));
  double zLo = 5, zHi = 5;
  double lo2 = sampleQuantile(sample, 0.5 - zLo * sd), hi2 = sampleQuantile(sample, 0.5 + zHi * sd);
  constexpr int kMaxPasses = 16;
  bool done = false;
  for (int pass = 0; pass < kMaxPasses && !done; ++pass) {
    const WorkSlice part = slice.sub(std::min(0.9, pass * 0.3), std::min(1.0, pass * 0.3 + 0.3));
    PassSpec spec;
    spec.lo2 = lo2;
    spec.hi2 = hi2;
    spec.scale = hi2 > lo2 ? double(kBuckets) / (hi2 - lo2) : 0.0;
    if (!std::isfinite(spec.scale)) spec.scale = 0.0;
    const PassResult h = ranks.pass(spec, lo2, hi2, part);
    ++out.passes;
    if (!h.complete) {
      out.complete = false;
      return out;
    }
    Count inside = 0;
    for (Count c : h.hist) inside += c;
    if (h.below > rLo) {  // the bracket starts too high: widen it downwards
      zLo *= 4;
      lo2 = zLo * sd >= 0.5 ? 0.0 : sampleQuantile(sample, 0.5 - zLo * sd);
      continue;
    }
    if (h.below + inside <= rHi) {  // ends too low: widen upwards
      zHi *= 4;
      hi2 = zHi * sd >= 0.5 ? ranks.maxD2() : sampleQuantile(sample, 0.5 + zHi * sd);
      continue;
    }
    if (h.minIn == h.maxIn) {  // every value in the bracket is the same: both middle ranks hold it
      out.value = std::sqrt(h.minIn);
      done = true;
      continue;
    }
    Count cum = h.below;
    int first = 0;
    while (cum + h.hist[std::size_t(first)] <= rLo) cum += h.hist[std::size_t(first++)];
    const Count belowFirst = cum;
    int last = first;
    while (cum + h.hist[std::size_t(last)] <= rHi) cum += h.hist[std::size_t(last++)];
    Count held = 0;
    for (int b = first; b <= last; ++b) held += h.hist[std::size_t(b)];
    if (held > limit) {  // refine: a new bracket around the buckets that hold the ranks
      const double nlo = std::max(lo2, lo2 + (first - 1) / spec.scale);
      const double nhi = std::min(hi2, lo2 + (last + 2) / spec.scale);
      if (nlo == lo2 && nhi == hi2) return std::nullopt;
      lo2 = nlo;
      hi2 = nhi;
      continue;
    }
    spec.collect = true;
    spec.first = first;
    spec.last = last;
    const double classLo = first >= 1 ? std::max(lo2, lo2 + (first - 1) / spec.scale) : lo2;
    const double classHi = std::min(hi2, lo2 + (last + 2) / spec.scale);
    PassResult c = ranks.pass(spec, classLo, classHi, slice.sub(0.9, 1.0));
    ++out.passes;
    if (!c.complete) {
      out.complete = false;
      return out;
    }
    if (c.below != belowFirst || Count(c.kept.size()) != held) return std::nullopt;  // never expected
    auto& v = c.kept;
    const auto kLo = std::size_t(rLo - belowFirst), kHi = std::size_t(rHi - belowFirst);
    std::nth_element(v.begin(), v.begin() + std::ptrdiff_t(kLo), v.end());
    const double dLo = v[kLo];
    const double dHi = kHi == kLo ? dLo : *std::min_element(v.begin() + std::ptrdiff_t(kLo) + 1, v.end());
    out.value = 0.5 * (std::sqrt(dLo) + std::sqrt(dHi));
    done = true;
  }
  if (!done) return std::nullopt;
  out.method = "exact: cell-grid rank search (pairs below a sampled bracket counted by cell blocks, " +
               std::to_string(out.passes) + " passes) over " + std::to_string(m) + " pairwise distances";
  return out;
}

}  // namespace barrow
