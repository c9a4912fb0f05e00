#include "uncertainty/value_vs_size.h"

#include <algorithm>
#include <cmath>

#include "uncertainty/frozen_measure.h"
#include "uncertainty/replicate_loop.h"
#include "uncertainty/replicate_stats.h"
#include "uncertainty/weighted_draw.h"

namespace barrow {

std::vector<int> defaultSizeLadder(int largest) {
  std::vector<int> out;
  if (largest < 1) return out;
  const int smallest = std::min(25, largest);
  const int steps = 8;
  for (int k = 0; k < steps; ++k) {
    const double t = double(k) / double(steps - 1);
    const int n = int(std::lround(std::exp(std::log(double(smallest)) * (1.0 - t) + std::log(double(largest)) * t)));
    if (out.empty() || n > out.back()) out.push_back(n);
  }
  return out;
}

std::optional<std::string> checkSizesRequest(const SizesRequest& req, int smallest) {
  if (auto e = checkCount("the number of repeats", req.repeats, kMaxRepeats)) return e;
  if (req.measures.empty()) return std::string("no measures chosen");
  if (int(req.sizes.size()) > kMaxSizeSteps)
    return "at most " + std::to_string(kMaxSizeSteps) + " sizes, got " + std::to_string(req.sizes.size());
  for (int n : req.sizes)
    if (n < 1 || n > smallest)
      return "size " + std::to_string(n) + " is outside 1.." + std::to_string(smallest) +
             " (subsamples are at most the smaller cloud's size)";
  return std::nullopt;
}

SizesResult runValueVsSize(const Cloud& a, const Cloud& b, const SizesRequest& req, const RunControl* control) {
  SizesResult out;
  out.request = req;
  out.sizes = req.sizes.empty() ? defaultSizeLadder(int(std::min(a.size(), b.size()))) : req.sizes;
  const std::size_t S = out.sizes.size(), R = std::size_t(req.repeats);
  std::vector<FrozenMeasure> frozen;
  for (const Measure* m : req.measures) {
    frozen.emplace_back(*m, req.params, a, b);
    SizesRow row;
    row.id = m->id();
    row.settings = frozen.back().settings();
    row.values.assign(S, std::vector<double>(R, NAN));
    out.rows.push_back(std::move(row));
  }
  std::vector<std::string> reasons(out.rows.size() * S * R);

  const WeightedSampler drawA(a), drawB(b);
  const bool complete = runReplicates(int(S * R), req.threads, control, [&](int index, const RunControl* inner) {
    const std::size_t s = std::size_t(index) / R, r = std::size_t(index) % R;
    ReplicateRng rng(req.seed, std::uint64_t(index));
    const Cloud sa = drawSample(a, drawA, out.sizes[s], rng);
    const Cloud sb = drawSample(b, drawB, out.sizes[s], rng);
    for (std::size_t k = 0; k < frozen.size(); ++k) {
      const Result res = frozen[k].evaluate(sa, sb, inner);
      if (res.usable()) out.rows[k].values[s][r] = res.value;
      else reasons[(k * S + s) * R + r] = res.message;
    }
  });
  out.cancelled = !complete || (control && control->cancel && control->cancel->load());

  for (std::size_t k = 0; k < out.rows.size(); ++k) {
    SizesRow& row = out.rows[k];
    if (out.cancelled) continue;  // status stays Cancelled
    bool everySize = true;
    for (std::size_t s = 0; s < S; ++s) {
      std::vector<double> good;
      for (std::size_t r = 0; r < R; ++r) {
        const double v = row.values[s][r];
        if (!std::isnan(v)) good.push_back(v);
        else if (row.message.empty())
          row.message = "size " + std::to_string(out.sizes[s]) + ": " + reasons[(k * S + s) * R + r];
      }
      row.failed += int(R - good.size());
      everySize = everySize && !good.empty();
      row.mean.push_back(sampleMean(good));
      row.sd.push_back(sampleSd(good));
    }
    std::vector<double> x(out.sizes.begin(), out.sizes.end());
    row.slope = logLogSlope(x, row.mean);
    row.status = everySize ? Status::Ok : Status::InvalidInput;
  }
  return out;
}

}  // namespace barrow
