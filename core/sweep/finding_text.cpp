#include "sweep/finding_text.h"

#include <algorithm>
#include <cmath>
#include <cstdio>

namespace barrow {

std::string shortNumber(double v) {
  if (std::isnan(v)) return "n/a";
  if (std::isinf(v)) return v > 0 ? "+∞" : "−∞";
  if (v == 0) return "0";
  char buf[32];
  std::snprintf(buf, sizeof buf, "%.3g", v);
  return buf;
}

namespace {

std::string signedNumber(double v) { return (v > 0 ? "+" : "") + shortNumber(v); }

std::string jumpText(const Jump& j) {
  if (std::isinf(j.size)) return (j.size > 0 ? "to +∞ at θ = " : "from +∞ at θ = ") + shortNumber(j.theta);
  return "by " + signedNumber(j.size) + " at θ = " + shortNumber(j.theta);
}

std::string extentText(const FlatFacts& s, const FindingFacts& facts) {
  const bool fromStart = s.from <= facts.thetaLow, toEnd = s.to >= facts.thetaHigh;
  if (fromStart && toEnd) return "over the whole sweep";
  if (toEnd) return "for θ ≥ " + shortNumber(s.from);
  if (fromStart) return "for θ ≤ " + shortNumber(s.to);
  return "for θ in [" + shortNumber(s.from) + ", " + shortNumber(s.to) + "]";
}

std::string flatWhat(const FlatFacts& s, const FindingFacts& facts) {
  if (std::isinf(s.low)) return "is +∞";
  if (s.high - s.low <= facts.constantTolerance) return "is constant at " + shortNumber(s.low);
  if (std::isinf(s.high)) return "is flat or +∞";
  // Slopes below the threshold throughout, yet the values differ: they change by steps only.
  return "is piecewise constant (" + shortNumber(s.low) + " to " + shortNumber(s.high) + ")";
}

// A value shown against the measure's own spread over the sweep: three significant digits,
// plus as many as it takes for differences of that spread to show (a minimum of 1.2003 in a
// sweep that only reaches 1.2033 is not "1.2").
std::string numberAgainst(double v, double spread) {
  if (!std::isfinite(v) || v == 0 || !(spread > 0) || !std::isfinite(spread)) return shortNumber(v);
  const int extra = std::clamp(int(std::ceil(std::log10(std::abs(v) / spread))), 0, 6);
  char buf[40];
  std::snprintf(buf, sizeof buf, "%.*g", 3 + extra, v);
  return buf;
}

std::string bestText(const FindingFacts& facts) {
  const auto [lo, hi] = facts.best;
  if (lo == hi) return "its best θ = " + shortNumber(lo);
  return "its minimum " + numberAgainst(facts.lowest, facts.range) + " (θ in [" + shortNumber(lo) + ", " +
         shortNumber(hi) + "])";
}

}  // namespace

std::string describeFinding(const Finding& f, const FindingFacts& facts) {
  if (facts.failed == facts.samples)
    return f.id + " failed at every θ" + (facts.failure.empty() ? std::string() : ": " + facts.failure);
  if (facts.constant)
    return f.id + " is constant at " + shortNumber(facts.lowest) +
           " over the whole sweep: it cannot tell the θ values apart and gives no gradient";

  if (facts.infiniteEverywhere)
    return f.id + " is +∞ at every θ of the sweep" +
           (facts.failed > 0 ? " that did not fail" : std::string()) + ": it gives no gradient anywhere";

  std::string s = f.id;
  if (f.jumps.empty() && f.unresolved.empty()) {
    s += " is continuous";
    if (!facts.refined) s += " on this grid";
  } else if (f.jumps.empty()) {
    s += " has no confirmed jump";
  } else {
    s += " jumps ";
    // The largest jumps first when there are many; the rest are counted.
    std::vector<Jump> listed = f.jumps;
    const std::size_t shown = std::min<std::size_t>(listed.size(), 3);
    if (listed.size() > shown) {
      std::stable_sort(listed.begin(), listed.end(),
                       [](const Jump& x, const Jump& y) { return std::abs(x.size) > std::abs(y.size); });
      listed.resize(shown);
      std::sort(listed.begin(), listed.end(), [](const Jump& x, const Jump& y) { return x.theta < y.theta; });
    }
    for (std::size_t k = 0; k < shown; ++k)
      s += (k == 0 ? "" : k + 1 == shown && shown == f.jumps.size() ? " and " : ", ") + jumpText(listed[k]);
    if (f.jumps.size() > shown) s += ", plus " + std::to_string(f.jumps.size() - shown) + " smaller jumps";
    s += " (each confirmed by bisection to Δθ ≤ " + shortNumber(f.resolution) + ")";
  }
  if (!f.unresolved.empty()) {
    s += "; unresolved at θ ≈ ";
    const std::size_t shown = std::min<std::size_t>(f.unresolved.size(), 3);
    for (std::size_t k = 0; k < shown; ++k) s += (k ? ", " : "") + shortNumber(f.unresolved[k].theta);
    if (f.unresolved.size() > shown) s += " and " + std::to_string(f.unresolved.size() - shown) + " more";
    s += facts.refined ? " (steep steps the refinement budget ran out before resolving to Δθ ≤ " +
                             shortNumber(f.resolution) + ": jump or steep slope, not decided)"
                       : " (steep steps on the grid; without refinement a jump cannot be told from a steep slope)";
  }
  const std::size_t flatShown = std::min<std::size_t>(facts.flat.size(), 2);
  for (std::size_t k = 0; k < flatShown; ++k) {
    const std::string what = flatWhat(facts.flat[k], facts);
    s += k == 0 ? "; it " + what : what == flatWhat(facts.flat[k - 1], facts) ? " and" : " and " + what;
    s += " " + extentText(facts.flat[k], facts);
  }
  if (facts.flat.size() > flatShown)
    s += " and on " + std::to_string(facts.flat.size() - flatShown) + " more stretch" +
         (facts.flat.size() - flatShown > 1 ? "es" : "");
  if (!facts.flat.empty()) s += ": no gradient there";
  if (std::isfinite(f.lipschitz))
    s += "; slope at most " + shortNumber(f.lipschitz) + (f.jumps.empty() && f.unresolved.empty() ? "" : " off the jumps");
  if (std::isnan(facts.best.first)) s += "; it is +∞ at every θ that did not fail";
  else if (f.monotone) s += "; it grows with distance from " + bestText(facts);
  else s += "; it does not grow steadily away from " + bestText(facts);
  if (facts.failed > 0)
    s += " (failed at " + std::to_string(facts.failed) + " of " + std::to_string(facts.samples) + " θ values" +
         (facts.failure.empty() ? std::string() : ": " + facts.failure) + ")";
  return s;
}

}  // namespace barrow
