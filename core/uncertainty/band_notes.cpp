#include "uncertainty/band_notes.h"

#include <algorithm>
#include <cmath>

#include "sweep/finding_text.h"

namespace barrow {

namespace {

// Index k with theta[k] <= t < theta[k+1] (clamped so that k + 1 is valid).
std::size_t leftOf(const std::vector<double>& theta, double t) {
  const auto it = std::upper_bound(theta.begin(), theta.end(), t);
  const std::size_t k = it == theta.begin() ? 0 : std::size_t(it - theta.begin()) - 1;
  return std::min(k, theta.size() - 2);
}

double width(const SweepSeries& s, std::size_t k) { return s.high[k] - s.low[k]; }

}  // namespace

BandReading readAgainstBands(const Finding& f, const std::vector<double>& theta, const SweepSeries& s) {
  BandReading out;
  if (theta.size() < 2 || s.low.size() != theta.size() || s.high.size() != theta.size()) return out;
  double lo = INFINITY, hi = -INFINITY;
  for (double v : s.value)
    if (std::isfinite(v)) lo = std::min(lo, v), hi = std::max(hi, v);
  const double range = hi > lo ? hi - lo : 0.0;

  for (const Jump& j : f.jumps) {
    JumpAgainstBand r;
    r.theta = j.theta;
    r.size = j.size;
    const std::size_t k = leftOf(theta, j.theta);
    r.spreadLeft = width(s, k);
    r.spreadRight = width(s, k + 1);
    r.beyondSpread = std::abs(j.size) > r.spreadLeft && std::abs(j.size) > r.spreadRight;  // NaN → false
    std::string text = f.id + ": jump of " + shortNumber(std::abs(j.size)) + " at θ = " + shortNumber(j.theta) +
                       ", resample spread " + shortNumber(r.spreadLeft) + " before and " + shortNumber(r.spreadRight) +
                       " after: ";
    text += r.beyondSpread ? "larger than the sample-to-sample variation on both sides"
                           : "not larger than the sample-to-sample variation on both sides; it may be sample noise";
    out.notes.push_back(text);
    out.jumps.push_back(r);
  }
  for (const auto& [from, to] : f.flat) {
    FlatAgainstBand r;
    r.from = from;
    r.to = to;
    double lmin = INFINITY, lmax = -INFINITY, hmin = INFINITY, hmax = -INFINITY;
    for (std::size_t k = 0; k < theta.size(); ++k) {
      if (theta[k] < from || theta[k] > to) continue;
      lmin = std::min(lmin, s.low[k]), lmax = std::max(lmax, s.low[k]);
      hmin = std::min(hmin, s.high[k]), hmax = std::max(hmax, s.high[k]);
    }
    r.bandMove = std::max(lmax - lmin, hmax - hmin);
    r.survives = std::isfinite(r.bandMove) && r.bandMove <= 0.01 * range;
    std::string text = f.id + ": flat for θ in [" + shortNumber(from) + ", " + shortNumber(to) + "]; the resample band ";
    text += r.survives ? "stays flat there too (moves by " + shortNumber(r.bandMove) + "): the flatness survives resampling"
                       : "moves by " + shortNumber(r.bandMove) + " over it: the flatness does not survive resampling";
    out.notes.push_back(text);
    out.flat.push_back(r);
  }
  return out;
}

}  // namespace barrow
