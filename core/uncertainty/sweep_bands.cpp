#include "uncertainty/sweep_bands.h"

#include <algorithm>
#include <cmath>
#include <memory>

#include "families/family_map.h"
#include "measures/evaluate.h"
#include "measures/registry.h"
#include "uncertainty/replicate_loop.h"
#include "uncertainty/replicate_stats.h"
#include "uncertainty/weighted_draw.h"

namespace barrow {

std::optional<std::string> checkSweepBandRequest(const SweepBandRequest& req) {
  if (auto e = checkCount("the number of resamples", req.resamples, kMaxResamples)) return e;
  return checkLevel(req.level);
}

std::optional<std::string> addSweepBands(const Cloud& a, const Cloud& b, SweepResult& r, const SweepBandRequest& req,
                                         const RunControl* control) {
  if (auto e = checkSweepBandRequest(req)) return e;
  if (r.theta.empty()) return std::string("the sweep has no θ values");
  std::vector<const Measure*> measures;
  for (const auto& s : r.series) {
    const Measure* m = MeasureRegistry::instance().find(s.id);
    if (!m) return "no registered measure '" + s.id + "' to resample";
    measures.push_back(m);
  }
  const FamilyMap family(a, b, r.settings);
  if (auto e = family.error()) return *e;

  // A_θ for every θ once, with its sampler (shared read-only by every replicate).
  const std::size_t T = r.theta.size(), M = measures.size(), B = std::size_t(req.resamples);
  std::vector<Cloud> path;
  std::vector<WeightedSampler> samplers;
  path.reserve(T);
  for (double t : r.theta) path.push_back(family.at(t));
  for (const Cloud& c : path) samplers.emplace_back(c);
  const WeightedSampler drawB(b);
  // Every resample of A_θ has |A| points, whatever the number of points A_θ carries
  // (interpolate: one per plan entry; mix: A's and B's).
  const Eigen::Index nA = a.size();

  // values[(m·T + t)·B + rep]
  std::vector<double> values(M * T * B, NAN);
  const bool complete = runReplicates(req.resamples, req.threads, control, [&](int rep, const RunControl* inner) {
    ReplicateRng rng(req.seed, std::uint64_t(rep));
    std::vector<double> u(static_cast<std::size_t>(nA));
    for (double& x : u) x = rng.uniform();
    const Cloud rb = drawSample(b, drawB, int(b.size()), rng);
    std::vector<std::shared_ptr<WarmState>> warm(M);
    for (std::size_t t = 0; t < T; ++t) {
      Eigen::MatrixX2d pts(nA, 2);
      for (Eigen::Index k = 0; k < nA; ++k) pts.row(k) = path[t].points.row(samplers[t].at(u[std::size_t(k)]));
      const Cloud ra(a.name, std::move(pts));
      for (std::size_t m = 0; m < M; ++m) {
        EvalRequest er;
        er.params = r.series[m].frozen;
        er.control = inner;
        er.warm = req.warmStart ? &warm[m] : nullptr;
        const Result res = evaluateMeasure(*measures[m], ra, rb, er);
        if (res.usable()) values[(m * T + t) * B + std::size_t(rep)] = res.value;
      }
    }
  });
  if (!complete || (control && control->cancel && control->cancel->load())) return std::nullopt;

  for (std::size_t m = 0; m < M; ++m) {
    SweepSeries& s = r.series[m];
    s.low.assign(T, NAN);
    s.high.assign(T, NAN);
    for (std::size_t t = 0; t < T; ++t) {
      std::vector<double> good;
      for (std::size_t rep = 0; rep < B; ++rep)
        if (const double v = values[(m * T + t) * B + rep]; !std::isnan(v)) good.push_back(v);
      if (good.empty()) continue;
      std::sort(good.begin(), good.end());
      const Interval iv = resampleInterval(good, s.value[t], req.level, IntervalKind::Percentile);
      s.low[t] = iv.low;
      s.high[t] = iv.high;
    }
  }
  r.bandResamples = req.resamples;
  r.bandLevel = req.level;
  r.bandSeed = req.seed;
  return std::nullopt;
}

}  // namespace barrow
