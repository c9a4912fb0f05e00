#include "sweep/continuity.h"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <string>

#include "sweep/finding_text.h"

namespace barrow {

namespace {

struct Curve {
  const std::vector<double>& theta;
  const std::vector<double>& value;
  const std::vector<double>& slope;
  double low = INFINITY;    // smallest finite value
  double range = 0.0;       // of the finite values
  std::size_t valid = 0;    // samples that did not fail
  std::size_t infinite = 0;
};

std::vector<std::pair<double, double>> flatStretches(const Curve& c, const ContinuityOptions& o) {
  std::vector<std::pair<double, double>> out;
  if (c.valid == 0) return out;
  double first = INFINITY, last = -INFINITY;
  for (std::size_t k = 0; k < c.value.size(); ++k)
    if (!std::isnan(c.value[k])) first = std::min(first, c.theta[k]), last = std::max(last, c.theta[k]);
  const double slopeTol = o.flatSlope * c.range / std::max(last - first, 1e-300);
  // A stretch must also span minFlatPoints − 1 typical spacings, so that a few refinement
  // points packed between two small steps of a histogram are not called a stretch.
  std::vector<double> gaps;
  for (std::size_t k = 1; k < c.theta.size(); ++k) gaps.push_back(c.theta[k] - c.theta[k - 1]);
  double typical = 0.0;
  if (!gaps.empty()) {
    std::nth_element(gaps.begin(), gaps.begin() + std::ptrdiff_t(gaps.size() / 2), gaps.end());
    typical = gaps[gaps.size() / 2];
  }
  const double minExtent = (o.minFlatPoints - 1) * typical * (1 - 1e-9);
  const double minTol = o.nearMinimum * c.range;
  auto isFlat = [&](std::size_t k) {
    const double v = c.value[k];
    if (std::isinf(v)) return true;  // +∞ has no gradient either
    if (!std::isfinite(v) || !(v - c.low > minTol)) return false;
    return k < c.slope.size() && std::abs(c.slope[k]) <= slopeTol;
  };
  std::size_t k = 0;
  while (k < c.value.size()) {
    if (!isFlat(k)) {
      ++k;
      continue;
    }
    std::size_t e = k;
    while (e + 1 < c.value.size() && isFlat(e + 1)) ++e;
    if (int(e - k + 1) >= o.minFlatPoints && c.theta[e] - c.theta[k] >= minExtent)
      out.push_back({c.theta[k], c.theta[e]});
    k = e + 1;
  }
  return out;
}

// D may not fall below its running maximum (less the slack) walking away from the best θ.
// `best` gets the θ extent of the near-minimal plateau around the smallest value.
bool growsAwayFromBest(const Curve& c, double slack, std::pair<double, double>* best) {
  std::size_t arg = c.value.size();
  for (std::size_t k = 0; k < c.value.size(); ++k)
    if (std::isfinite(c.value[k]) && (arg == c.value.size() || c.value[k] < c.value[arg])) arg = k;
  if (arg == c.value.size()) return true;  // nothing finite: +∞ throughout
  auto at = [&](std::size_t k) { return !std::isnan(c.value[k]) && c.value[k] <= c.low + slack; };
  std::size_t lo = arg, hi = arg;  // the plateau of near-minimal values around the best θ
  while (lo > 0 && (std::isnan(c.value[lo - 1]) || at(lo - 1))) --lo;
  while (hi + 1 < c.value.size() && (std::isnan(c.value[hi + 1]) || at(hi + 1))) ++hi;
  while (std::isnan(c.value[lo])) ++lo;
  while (std::isnan(c.value[hi])) --hi;
  *best = {c.theta[lo], c.theta[hi]};
  double peak = c.low;
  for (std::size_t k = hi + 1; k < c.value.size(); ++k) {
    if (std::isnan(c.value[k])) continue;
    if (c.value[k] < peak - slack) return false;
    peak = std::max(peak, c.value[k]);
  }
  peak = c.low;
  for (std::size_t k = lo; k-- > 0;) {
    if (std::isnan(c.value[k])) continue;
    if (c.value[k] < peak - slack) return false;
    peak = std::max(peak, c.value[k]);
  }
  return true;
}

}  // namespace

Finding findContinuity(const std::vector<double>& theta, const SweepSeries& s, double resolution,
                       const ContinuityOptions& o) {
  Finding f;
  f.id = s.id;
  f.resolution = resolution > 0 ? resolution : 0.0;
  const bool refined = f.resolution > 0;
  Curve c{theta, s.value, s.slope};
  for (double v : s.value) {
    if (std::isnan(v)) continue;
    ++c.valid;
    if (std::isinf(v)) ++c.infinite;
    else c.low = std::min(c.low, v);
  }
  c.range = finiteRange(s.value);
  FindingFacts facts;
  facts.samples = s.value.size();
  facts.failed = s.value.size() - c.valid;
  facts.refined = refined;
  facts.failure = s.message;
  if (c.valid > 0 && c.infinite == c.valid) {
    f.continuous = true;
    f.monotone = true;
    f.lipschitz = NAN;
    f.flat = {{theta.front(), theta.back()}};
    facts.infiniteEverywhere = true;
    f.infiniteEverywhere = true;
    f.summary = describeFinding(f, facts);
    return f;
  }
  if (c.valid == 0) {
    f.continuous = false;
    f.monotone = false;
    f.lipschitz = NAN;
    f.summary = describeFinding(f, facts);
    return f;
  }

  const JumpTest test{f.resolution, o.jumpSafety, std::isfinite(s.accuracy) ? s.accuracy : 0.0};
  for (const JudgedStep& j : judgeSteps(theta, s.value, o.stepRule, test)) {
    const StepInterval& st = j.interval;
    const double width = theta[st.right] - theta[st.left];
    const Jump here{0.5 * (theta[st.left] + theta[st.right]), st.step, width};
    if (j.verdict == StepVerdict::Jump) f.jumps.push_back(here);
    else if (j.verdict == StepVerdict::Unresolved) f.unresolved.push_back(here);
    else if (std::isfinite(st.step)) f.lipschitz = std::max(f.lipschitz, std::abs(st.step) / width);
  }
  f.continuous = f.jumps.empty() && f.unresolved.empty();
  f.flat = flatStretches(c, o);
  // Constant, or varying by less than `constantShare` of its size (a rotation of a symmetric
  // shape): no θ is better than another, and the relative thresholds above would only judge noise.
  const double size = std::max(std::abs(c.low), std::abs(c.low + c.range));
  if (c.infinite == 0 && c.range <= o.constantShare * size) {
    f.flat = {{theta.front(), theta.back()}};
    f.jumps.clear();
    f.unresolved.clear();
    f.continuous = true;
    f.monotone = true;
    facts.constant = true;
    facts.lowest = c.low;
    f.summary = describeFinding(f, facts);
    return f;
  }
  facts.lowest = c.low;
  facts.range = c.range;
  facts.best = {NAN, NAN};
  f.monotone = growsAwayFromBest(c, o.monotoneSlack * c.range + 1e-12 * std::max(1.0, std::abs(c.low)),
                                 &facts.best);
  for (const auto& [lo, hi] : f.flat) {
    FlatFacts ff{lo, hi, INFINITY, -INFINITY};
    for (std::size_t k = 0; k < theta.size(); ++k)
      if (theta[k] >= lo && theta[k] <= hi && !std::isnan(s.value[k]))
        ff.low = std::min(ff.low, s.value[k]), ff.high = std::max(ff.high, s.value[k]);
    facts.flat.push_back(ff);
  }
  facts.thetaLow = theta.front();
  facts.thetaHigh = theta.back();
  facts.constantTolerance = std::max(o.monotoneSlack * c.range, 1e-12 * std::max(1.0, std::abs(c.low)));
  f.summary = describeFinding(f, facts);
  return f;
}

std::vector<Finding> findContinuity(const SweepResult& r, const ContinuityOptions& options) {
  std::vector<Finding> out;
  for (const SweepSeries& s : r.series)
    out.push_back(findContinuity(r.theta, s, r.refineTolerance, options));
  return out;
}

std::vector<Finding> findContinuity(const SweepResult& r) { return findContinuity(r, ContinuityOptions{}); }

}  // namespace barrow
