#include "density/histogram_grid.h"

#include <algorithm>
#include <cmath>
#include <sstream>
#include <tuple>
#include <vector>

namespace barrow {

double autoBinWidth(const PooledStats& s) {
  // rms of the two sd's; hypot so that sd near 1e200 does not overflow in the square.
  const double sigma = std::hypot(s.sd.x(), s.sd.y()) * std::sqrt(0.5);
  if (!(sigma > 0)) return 1.0;
  return 3.504 * sigma * std::pow(s.effectiveSize, -0.25);
}

Eigen::Vector2d autoOrigin(const PooledStats& s, double bin) {
  (void)bin;  // the grid hangs from the data, not from multiples of the bin counted from 0
  return s.min;
}

namespace {

struct Entry {
  long long ix, iy;
  double massA, massB;
};

}  // namespace

BinnedMasses binMasses(const Cloud& a, const Cloud& b, const HistogramGrid& grid) {
  BinnedMasses out;
  // Beyond 2^52 bins from the origin, neighbouring bins are no longer distinct doubles.
  constexpr double kMaxIndex = 4503599627370496.0;
  std::vector<Entry> entries;
  entries.reserve(std::size_t(a.size() + b.size()));
  for (int side = 0; side < 2; ++side) {
    const Cloud& c = side == 0 ? a : b;
    const Eigen::VectorXd w = c.normalizedWeights();
    for (Eigen::Index i = 0; i < c.size(); ++i) {
      if (!(w(i) > 0)) continue;
      const double fx = std::floor((c.points(i, 0) - grid.origin.x()) / grid.bin);
      const double fy = std::floor((c.points(i, 1) - grid.origin.y()) / grid.bin);
      if (!(std::abs(fx) < kMaxIndex && std::abs(fy) < kMaxIndex)) {
        std::ostringstream m;
        m.precision(6);
        m << (side == 0 ? "A" : "B") << ", row " << (i + 1) << ": the point lies more than 2^52 bins"
          << " from the grid origin (bin " << grid.bin << "); choose a larger density.bin";
        out.error = m.str();
        return out;
      }
      entries.push_back({(long long)fx, (long long)fy, side == 0 ? w(i) : 0.0, side == 1 ? w(i) : 0.0});
    }
  }
  std::sort(entries.begin(), entries.end(), [](const Entry& u, const Entry& v) {
    return std::tie(u.ix, u.iy) < std::tie(v.ix, v.iy);
  });
  std::vector<double> p, q;
  for (std::size_t t = 0; t < entries.size();) {
    const Entry& first = entries[t];
    double ma = 0.0, mb = 0.0;
    std::size_t u = t;
    for (; u < entries.size() && entries[u].ix == first.ix && entries[u].iy == first.iy; ++u) {
      ma += entries[u].massA;
      mb += entries[u].massB;
    }
    p.push_back(ma);
    q.push_back(mb);
    out.binsA += ma > 0;
    out.binsB += mb > 0;
    t = u;
  }
  if (!entries.empty()) {
    out.loX = out.hiX = entries.front().ix;
    out.loY = out.hiY = entries.front().iy;
    for (const Entry& e : entries) {
      out.loX = std::min(out.loX, e.ix);
      out.hiX = std::max(out.hiX, e.ix);
      out.loY = std::min(out.loY, e.iy);
      out.hiY = std::max(out.hiY, e.iy);
    }
  }
  out.p = Eigen::Map<Eigen::VectorXd>(p.data(), Eigen::Index(p.size()));
  out.q = Eigen::Map<Eigen::VectorXd>(q.data(), Eigen::Index(q.size()));
  return out;
}

}  // namespace barrow
