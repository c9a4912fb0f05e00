#include "uncertainty/spread.h"

#include <algorithm>
#include <cmath>
#include <optional>

#include "uncertainty/frozen_measure.h"
#include "uncertainty/replicate_loop.h"
#include "uncertainty/weighted_draw.h"

namespace barrow {

std::optional<std::string> checkSpreadRequest(const SpreadRequest& req) {
  if (auto e = checkCount("the number of resamples", req.resamples, kMaxResamples)) return e;
  if (auto e = checkLevel(req.level)) return e;
  if (req.measures.empty()) return std::string("no measures chosen");
  return std::nullopt;
}

SpreadResult runSpread(const Cloud& a, const Cloud& b, const SpreadRequest& req, const RunControl* control) {
  SpreadResult out;
  out.request = req;
  std::vector<FrozenMeasure> frozen;
  for (const Measure* m : req.measures) {
    frozen.emplace_back(*m, req.params, a, b);
    SpreadRow row;
    row.id = m->id();
    row.settings = frozen.back().settings();
    const Result r = frozen.back().evaluate(a, b, control);
    row.status = r.status;
    if (r.usable()) row.value = r.value;
    if (!r.usable()) row.message = r.message;
    out.rows.push_back(std::move(row));
  }
  for (auto& row : out.rows) row.replicates.assign(std::size_t(req.resamples), NAN);
  std::vector<bool> usable;
  for (const auto& row : out.rows) usable.push_back(std::isfinite(row.value) || row.status == Status::Infinite);
  std::vector<std::string> reasons(out.rows.size() * std::size_t(req.resamples));

  const WeightedSampler drawA(a), drawB(b);
  const bool complete = runReplicates(req.resamples, req.threads, control, [&](int r, const RunControl* inner) {
    ReplicateRng rng(req.seed, std::uint64_t(r));
    const std::vector<int> rowsA = drawRows(drawA, int(a.size()), rng);
    const std::vector<int> rowsB = drawRows(drawB, int(b.size()), rng);
    const Cloud ra = sampleOfRows(a, rowsA), rb = sampleOfRows(b, rowsB);
    // The same resample with repeats merged, for measures of the empirical measure alone
    // (exact transport): the same value from a problem about 0.63 n on a side.
    std::optional<Cloud> ma, mb;
    for (std::size_t k = 0; k < frozen.size(); ++k) {
      if (!usable[k]) continue;  // the original value failed: its row says why
      const bool merge = frozen[k].measure().repeatsMayMerge();
      if (merge && !ma) ma = mergedSampleOfRows(a, rowsA), mb = mergedSampleOfRows(b, rowsB);
      const Result res = merge ? frozen[k].evaluate(*ma, *mb, inner) : frozen[k].evaluate(ra, rb, inner);
      if (res.usable()) out.rows[k].replicates[std::size_t(r)] = res.value;
      else reasons[k * std::size_t(req.resamples) + std::size_t(r)] = res.message;
    }
  });
  out.cancelled = !complete || (control && control->cancel && control->cancel->load());

  for (std::size_t k = 0; k < out.rows.size(); ++k) {
    SpreadRow& row = out.rows[k];
    if (out.cancelled) {
      row.status = Status::Cancelled;
      continue;
    }
    if (!usable[k]) continue;
    std::vector<double> good;
    for (int r = 0; r < req.resamples; ++r) {
      const double v = row.replicates[std::size_t(r)];
      if (!std::isnan(v)) good.push_back(v);
      else if (row.message.empty()) row.message = "resample " + std::to_string(r + 1) + ": " +
                                                  reasons[k * std::size_t(req.resamples) + std::size_t(r)];
    }
    row.failed = req.resamples - int(good.size());
    if (good.empty()) continue;
    row.sd = sampleSd(good);
    std::sort(good.begin(), good.end());
    const Interval iv = resampleInterval(good, row.value, req.level, req.interval);
    row.low = iv.low;
    row.high = iv.high;
  }
  return out;
}

}  // namespace barrow
