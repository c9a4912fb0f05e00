#include "uncertainty/replicate_stats.h"

#include <algorithm>
#include <cmath>

namespace barrow {

const char* intervalKindName(IntervalKind k) { return k == IntervalKind::Basic ? "basic" : "percentile"; }

double sortedQuantile(const std::vector<double>& sorted, double q) {
  const double h = (double(sorted.size()) - 1.0) * std::clamp(q, 0.0, 1.0);
  const std::size_t lo = std::size_t(std::floor(h));
  const std::size_t hi = std::min(lo + 1, sorted.size() - 1);
  const double a = sorted[lo], b = sorted[hi];
  if (a == b || h == double(lo)) return a;  // also keeps inf − inf out of the interpolation
  if (std::isinf(b)) return b;
  return a + (h - double(lo)) * (b - a);
}

Interval resampleInterval(const std::vector<double>& sorted, double value, double level, IntervalKind kind) {
  const double alpha = 1.0 - level;
  const double qLow = sortedQuantile(sorted, alpha / 2.0);
  const double qHigh = sortedQuantile(sorted, 1.0 - alpha / 2.0);
  if (kind == IntervalKind::Percentile) return {qLow, qHigh};
  return {2.0 * value - qHigh, 2.0 * value - qLow};
}

double sampleMean(const std::vector<double>& values) {
  if (values.empty()) return NAN;
  double s = 0.0;
  for (double v : values) s += v;
  return s / double(values.size());
}

double sampleSd(const std::vector<double>& values) {
  if (values.size() < 2) return NAN;
  for (double v : values)
    if (!std::isfinite(v)) return NAN;
  const double mean = sampleMean(values);
  double ss = 0.0;
  for (double v : values) ss += (v - mean) * (v - mean);
  return std::sqrt(ss / double(values.size() - 1));
}

double logLogSlope(const std::vector<double>& x, const std::vector<double>& y) {
  std::vector<double> lx, ly;
  for (std::size_t i = 0; i < x.size() && i < y.size(); ++i)
    if (x[i] > 0.0 && std::isfinite(y[i]) && y[i] > 0.0) {
      lx.push_back(std::log(x[i]));
      ly.push_back(std::log(y[i]));
    }
  if (lx.size() < 2) return NAN;
  const double mx = sampleMean(lx), my = sampleMean(ly);
  double sxy = 0.0, sxx = 0.0;
  for (std::size_t i = 0; i < lx.size(); ++i) {
    sxy += (lx[i] - mx) * (ly[i] - my);
    sxx += (lx[i] - mx) * (lx[i] - mx);
  }
  return sxx > 0.0 ? sxy / sxx : NAN;
}

}  // namespace barrow
