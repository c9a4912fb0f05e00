// Summaries of replicate values: quantiles, the two bootstrap intervals, the spread, and the
// log–log slope of a value-versus-size curve.
#pragma once

#include <vector>

namespace barrow {

/// Which resampling interval to report. Percentile is the default: it stays inside the
/// measure's range (a distance's interval never goes below 0) and does not change when the
/// measure is reported through a monotone map (W2 or W2²). Basic reflects the resample
/// quantiles about the value (2·value − q), which corrects a shifted resample distribution
/// to first order but can leave the measure's range. Efron & Tibshirani (1993), ch. 13;
/// Davison & Hinkley (1997), §5.2 and eq. 5.6.
enum class IntervalKind { Percentile, Basic };

const char* intervalKindName(IntervalKind k);  // "percentile", "basic"

struct Interval {
  double low = 0.0;
  double high = 0.0;
};

/// The q-quantile (q in [0,1]) of ascending `sorted` (non-empty, +inf allowed) by linear
/// interpolation between order statistics: Hyndman & Fan (1996) definition 7, numpy's default.
double sortedQuantile(const std::vector<double>& sorted, double q);

/// The central `level` interval of the replicate values (ascending, non-empty), as `kind`
/// defines it around `value` (the estimate on the original data).
Interval resampleInterval(const std::vector<double>& sorted, double value, double level, IntervalKind kind);

/// Sample standard deviation (divisor k − 1); NaN with fewer than 2 values or any infinite one.
double sampleSd(const std::vector<double>& values);
double sampleMean(const std::vector<double>& values);

/// Least-squares slope of log(y) against log(x) over the pairs with x > 0 and finite y > 0;
/// NaN when fewer than two such pairs (or all x equal).
double logLogSlope(const std::vector<double>& x, const std::vector<double>& y);

}  // namespace barrow
