#include "density/kde_bandwidth.h"

#include <algorithm>
#include <cmath>
#include <sstream>

namespace barrow {

Bandwidth ruleBandwidth(const PooledStats& stats, BandwidthRule rule) {
  Bandwidth b;
  const double factor = std::pow(stats.effectiveSize, -1.0 / 6.0);
  Eigen::Vector2d spread = stats.sd;
  if (rule == BandwidthRule::Silverman)
    for (int k = 0; k < 2; ++k)
      if (stats.iqr(k) > 0) spread(k) = std::min(stats.sd(k), stats.iqr(k) / 1.349);
  b.s = spread * factor;
  std::ostringstream r;
  r.precision(6);
  if (rule == BandwidthRule::Scott)
    r << "scott: s_k = sd_k*N^(-1/6) on the pooled sample, sd = (" << stats.sd.x() << ", "
      << stats.sd.y() << ")";
  else
    r << "silverman: s_k = min(sd_k, IQR_k/1.349)*N^(-1/6) on the pooled sample, sd = ("
      << stats.sd.x() << ", " << stats.sd.y() << "), IQR = (" << stats.iqr.x() << ", "
      << stats.iqr.y() << ")";
  r << ", N = " << stats.effectiveSize;
  b.rule = r.str();

  const double big = b.s.maxCoeff();
  std::ostringstream note;
  note.precision(6);
  if (!(big > 0)) {
    b.s = Eigen::Vector2d::Ones();
    note << "every point of A and B coincides, so the rule gives 0; bandwidth set to 1 "
            "(the KDEs are identical at any bandwidth)";
  } else {
    for (int k = 0; k < 2; ++k) {
      const double floor = kBandwidthFloorRatio * big;
      if (b.s(k) >= floor) continue;
      note << (note.tellp() > 0 ? "; " : "") << "s_" << (k == 0 ? 'x' : 'y') << " = " << b.s(k)
           << " from the rule (the pooled points are "
           << (b.s(k) == 0 ? "collinear" : "nearly collinear") << " along that axis) raised to the floor "
           << kBandwidthFloorRatio << "*s_" << (k == 0 ? 'y' : 'x') << " = " << floor;
      b.s(k) = floor;
    }
  }
  b.note = note.str();
  return b;
}

}  // namespace barrow
