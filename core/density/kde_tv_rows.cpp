#include "density/kde_tv_rows.h"

#include <algorithm>
#include <atomic>
#include <cmath>
#include <limits>
#include <vector>

#include "density/gauss_kronrod.h"
#include "base/row_workers.h"

namespace barrow {

namespace {

constexpr double kInvSqrt2Pi = 0.398942280401432677939946059934;
constexpr double kMargin = 9.5;            // rows and nodes span the data ± 9.5 s: Φ(−9.5) ≈ 1e-21
constexpr double kNodesPerBandwidth = 4.0;  // crossing search spacing s_x/4
constexpr int kMaxNodes = 1 << 14;
constexpr double kRelativeTolerance = 1e-10;
constexpr int kMaxPanels = 8000;
constexpr double kNoise = 1e-13;  // |d| below this share of f_A + f_B is rounding: no sign
constexpr double kRootTolerance = 1e-12;  // of s_x
constexpr double kPhiSaturates = 8.5;     // Φ(±8.5) is 1 or 0 to 1e-17
constexpr double kHermiteDoubt = 1e-3;    // |d| below this share of Σ|c|φ: the cubic cannot tell

// The points of positive weight of A (c > 0) and B (c < 0, weights negated), sorted by y.
struct Points {
  std::vector<double> x, y, c;
  double xmin = 0, xmax = 0, ymin = 0, ymax = 0;
};

Points pointsOf(const Cloud& a, const Cloud& b) {
  struct P {
    double x, y, c;
  };
  std::vector<P> all;
  for (int side = 0; side < 2; ++side) {
    const Cloud& cl = side == 0 ? a : b;
    const Eigen::VectorXd w = cl.normalizedWeights();
    for (Eigen::Index i = 0; i < cl.size(); ++i)
      if (w(i) > 0) all.push_back({cl.points(i, 0), cl.points(i, 1), side == 0 ? w(i) : -w(i)});
  }
  std::sort(all.begin(), all.end(), [](const P& p, const P& q) { return p.y < q.y; });
  Points out;
  for (const P& p : all) {
    out.x.push_back(p.x);
    out.y.push_back(p.y);
    out.c.push_back(p.c);
  }
  if (!all.empty()) {
    out.xmin = *std::min_element(out.x.begin(), out.x.end());
    out.xmax = *std::max_element(out.x.begin(), out.x.end());
    out.ymin = out.y.front();
    out.ymax = out.y.back();
  }
  return out;
}

struct RowValue {
  double t = 0.0;  // ∫|f_A − f_B| dx
  double massA = 0.0, massB = 0.0;
  long long hidden = 0;
};

// One row's exact integral; scratch space for one thread.
class RowIntegrator {
 public:
  RowIntegrator(const Points& p, const Eigen::Vector2d& s, double window, const GridAxis& nodes)
      : p_(p), s_(s), window_(window), nodes_(nodes) {}

  RowValue at(double y) {
    RowValue r;
    ax_.clear();
    ac_.clear();
    const auto lo = std::lower_bound(p_.y.begin(), p_.y.end(), y - window_ * s_.y()) - p_.y.begin();
    const auto hi = std::upper_bound(p_.y.begin(), p_.y.end(), y + window_ * s_.y()) - p_.y.begin();
    for (auto i = lo; i < hi; ++i) {
      const double u = (y - p_.y[std::size_t(i)]) / s_.y();
      const double v = p_.c[std::size_t(i)] * std::exp(-0.5 * u * u) * kInvSqrt2Pi / s_.y();
      if (v == 0.0) continue;
      ax_.push_back(p_.x[std::size_t(i)]);
      ac_.push_back(v);
      (v > 0 ? r.massA : r.massB) += std::abs(v);
    }
    if (ax_.empty()) return r;
    fillNodes();
    roots_.clear();
    int last = -1, lastSign = 0;
    for (int k = 0; k < nodes_.count; ++k) {
      const int sg = signAt(k);
      if (sg == 0) continue;
      if (last >= 0) {
        if (sg != lastSign) {
          roots_.push_back(refine(nodes_.at(last), nodes_.at(k), lastSign, startInCell(last, k)));
        } else if (last == k - 1 && hiddenPairPossible(last, k, sg)) {
          // The slope turns toward zero inside the cell: find the turn exactly and look.
          const double turn = slopeZero(nodes_.at(last), nodes_.at(k), sg);
          double mag = 0.0;
          const double dt = value(turn, nullptr, &mag);
          if (sg * dt < -kNoise * mag) {
            roots_.push_back(refine(nodes_.at(last), turn, sg, 0.5 * (nodes_.at(last) + turn)));
            roots_.push_back(refine(turn, nodes_.at(k), -sg, 0.5 * (turn + nodes_.at(k))));
            ++r.hidden;
          }
        }
      }
      last = k;
      lastSign = sg;
    }
    double previous = 0.0;
    for (double root : roots_) {
      const double g = below(root);
      r.t += std::abs(g - previous);
      previous = g;
    }
    r.t += std::abs((r.massA - r.massB) - previous);
    return r;
  }

 private:
  // d, ∂d/∂x and Σ|c|φ at the nodes, each point's kernel added over the nodes within the
  // window by the Gaussian's two-term recurrence (g_{k+1} = g_k ρ_k, ρ_{k+1} = ρ_k e^{−δ²}),
  // a multiplication per node instead of an exp.
  void fillNodes() {
    const int n = nodes_.count;
    d_.assign(std::size_t(n), 0.0);
    slope_.assign(std::size_t(n), 0.0);
    mag_.assign(std::size_t(n), 0.0);
    const double delta = nodes_.step / s_.x(), q = std::exp(-delta * delta);
    const double scale = kInvSqrt2Pi / s_.x();
    for (std::size_t i = 0; i < ax_.size(); ++i) {
      const double centre = (ax_[i] - nodes_.start) / nodes_.step;
      const int kc = std::clamp(int(std::lround(centre)), 0, n - 1);
      const int reach = int(std::ceil(window_ / delta)) + 1;
      const double c = ac_[i] * scale, m = std::abs(c);
      auto add = [&](int k, double g, double u) {
        d_[std::size_t(k)] += c * g;
        slope_[std::size_t(k)] -= c * g * u / s_.x();
        mag_[std::size_t(k)] += m * g;
      };
      const double u0 = (nodes_.at(kc) - ax_[i]) / s_.x();
      const double g0 = std::exp(-0.5 * u0 * u0);
      add(kc, g0, u0);
      double g = g0, rho = std::exp(-u0 * delta - 0.5 * delta * delta);
      for (int k = kc + 1; k < n && k <= kc + reach; ++k) {
        g *= rho;
        rho *= q;
        add(k, g, u0 + (k - kc) * delta);
      }
      g = g0;
      rho = std::exp(u0 * delta - 0.5 * delta * delta);
      for (int k = kc - 1; k >= 0 && k >= kc - reach; --k) {
        g *= rho;
        rho *= q;
        add(k, g, u0 + (k - kc) * delta);
      }
    }
  }

  int signAt(int k) const {
    const double v = d_[std::size_t(k)], noise = kNoise * mag_[std::size_t(k)];
    return v > noise ? 1 : v < -noise ? -1 : 0;
  }

  // Same sign sg at both ends, the slope heading toward zero at the left end and away at the
  // right, and the cubic Hermite interpolant dipping below a quarter of the smaller end value:
  // worth an exact look for two crossings inside the cell.
  bool hiddenPairPossible(int l, int r, int sg) const {
    if (!(sg * slope_[std::size_t(l)] < 0 && sg * slope_[std::size_t(r)] > 0)) return false;
    const double h = nodes_.step, y0 = sg * d_[std::size_t(l)], y1 = sg * d_[std::size_t(r)];
    const double m0 = sg * slope_[std::size_t(l)] * h, m1 = sg * slope_[std::size_t(r)] * h;
    double lowest = std::min(y0, y1);
    for (int j = 1; j < 16; ++j) {
      const double t = j / 16.0, t2 = t * t, t3 = t2 * t;
      const double v = (2 * t3 - 3 * t2 + 1) * y0 + (t3 - 2 * t2 + t) * m0 + (-2 * t3 + 3 * t2) * y1 + (t3 - t2) * m1;
      lowest = std::min(lowest, v);
    }
    // The interpolant's error, about h^4/384 of the fourth derivative (1e-5 of the kernel sum at
    // 4 nodes per bandwidth), can hide a dip where f_A ~ f_B: there look exactly regardless.
    const double scale = std::max(mag_[std::size_t(l)], mag_[std::size_t(r)]);
    return lowest < 0.25 * std::min(y0, y1) || std::min(y0, y1) < kHermiteDoubt * scale;
  }

  // Exact d(x) over the row's points; optionally ∂d/∂x and Σ|c|φ.
  double value(double x, double* slope, double* mag) const {
    double v = 0.0, sl = 0.0, m = 0.0;
    const double scale = kInvSqrt2Pi / s_.x();
    for (std::size_t i = 0; i < ax_.size(); ++i) {
      const double u = (x - ax_[i]) / s_.x();
      if (std::abs(u) > window_) continue;
      const double g = ac_[i] * std::exp(-0.5 * u * u) * scale;
      v += g;
      sl -= g * u / s_.x();
      m += std::abs(g);
    }
    if (slope) *slope = sl;
    if (mag) *mag = m;
    return v;
  }

  // G(x) = ∫_{−∞}^x d dx, exactly.
  double below(double x) const {
    double sum = 0.0;
    for (std::size_t i = 0; i < ax_.size(); ++i) {
      const double u = (x - ax_[i]) / s_.x();
      if (u > kPhiSaturates) sum += ac_[i];
      else if (u > -kPhiSaturates) sum += ac_[i] * 0.5 * std::erfc(-u * M_SQRT1_2);
    }
    return sum;
  }

  // How closely a crossing is located: 1e-12 s_x, or a few units in the last place of x when
  // the data sit far from the origin (coordinates near 1e6 are 1.2e-10 apart).
  double resolution(double x) const {
    return std::max(kRootTolerance * s_.x(), 4 * std::abs(x) * std::numeric_limits<double>::epsilon());
  }

  // A first guess for the crossing between nodes l < r (d of opposite signs there): the root
  // of the cubic Hermite interpolant from d and ∂d/∂x at adjacent nodes (error O(h⁴), so
  // Newton needs about two steps), else linear interpolation across the zero-sign nodes.
  double startInCell(int l, int r) const {
    const double y0 = d_[std::size_t(l)], y1 = d_[std::size_t(r)];
    const double xl = nodes_.at(l), xr = nodes_.at(r);
    if (r != l + 1) return xl + (xr - xl) * y0 / (y0 - y1);
    const double h = xr - xl, m0 = slope_[std::size_t(l)] * h, m1 = slope_[std::size_t(r)] * h;
    auto p = [&](double t) {
      const double t2 = t * t, t3 = t2 * t;
      return (2 * t3 - 3 * t2 + 1) * y0 + (t3 - 2 * t2 + t) * m0 + (-2 * t3 + 3 * t2) * y1 + (t3 - t2) * m1;
    };
    double a = 0.0, b = 1.0;
    for (int it = 0; it < 40; ++it) {  // the cubic changes sign on [0, 1]: bisect it
      const double mid = 0.5 * (a + b);
      if ((p(mid) > 0) == (y0 > 0)) a = mid;
      else b = mid;
    }
    return xl + h * 0.5 * (a + b);
  }

  // The crossing in (lo, hi), where d has sign sLo at lo and the other sign at hi, from the
  // guess x: Newton steps kept inside a shrinking bracket, bisection when a step would leave it.
  double refine(double lo, double hi, int sLo, double x) const {
    double slope = 0.0;
    if (!(x > lo && x < hi)) x = 0.5 * (lo + hi);
    const double tol = resolution(x);
    for (int it = 0; it < 100; ++it) {
      const double f = value(x, &slope, nullptr);
      if (f == 0.0) return x;
      if (sLo * f > 0) lo = x;
      else hi = x;
      double next = slope != 0.0 ? x - f / slope : 0.5 * (lo + hi);
      if (!(next > lo && next < hi)) next = 0.5 * (lo + hi);
      if (std::abs(next - x) <= tol || hi - lo <= tol) return next;
      x = next;
    }
    return x;
  }

  // Where ∂d/∂x changes sign in (lo, hi) (negative at lo and positive at hi after multiplying
  // by sg), by bisection on the exact slope.
  double slopeZero(double lo, double hi, int sg) const {
    double slope = 0.0;
    for (int it = 0; it < 60 && hi - lo > resolution(lo); ++it) {
      const double mid = 0.5 * (lo + hi);
      value(mid, &slope, nullptr);
      if (sg * slope < 0) lo = mid;
      else hi = mid;
    }
    return 0.5 * (lo + hi);
  }

  const Points& p_;
  Eigen::Vector2d s_;
  double window_;
  GridAxis nodes_;
  std::vector<double> ax_, ac_;             // the row's points: x and signed row weight
  std::vector<double> d_, slope_, mag_;     // at the nodes
  std::vector<double> roots_;
};

struct Panel {
  double lo = 0, hi = 0;
  KronrodSums t, massA, massB;
  double error() const { return std::abs(t.kronrod - t.gauss); }
};

}  // namespace

KdeIntegral kdeTotalVariation(const Cloud& a, const Cloud& b, const Eigen::Vector2d& s, double window,
                              const RunControl* ctl, bool* cancelled, KdeTvStats* stats) {
  *cancelled = false;
  KdeTvStats st;
  const Points pts = pointsOf(a, b);
  GridAxis nodes;
  nodes.start = pts.xmin - kMargin * s.x();
  const double span = (pts.xmax + kMargin * s.x()) - nodes.start;
  nodes.step = s.x() / kNodesPerBandwidth;
  nodes.count = int(std::min<double>(kMaxNodes, std::floor(span / nodes.step) + 1));
  if (nodes.count == kMaxNodes) nodes.step = span / (kMaxNodes - 1);
  st.nodesPerBandwidth = s.x() / nodes.step;
  const double ylo = pts.ymin - kMargin * s.y(), yhi = pts.ymax + kMargin * s.y();

  kernel::RowWorkers team(0);
  auto evaluate = [&](std::vector<Panel>& panels) {
    std::atomic<long long> hidden{0};
    team.run(int(panels.size()), 1, [&](int begin, int end) {
      RowIntegrator row(pts, s, window, nodes);
      long long found = 0;
      for (int k = begin; k < end; ++k) {
        Panel& p = panels[std::size_t(k)];
        const auto x = kronrodNodes(p.lo, p.hi);
        std::array<double, 15> t{}, ma{}, mb{};
        for (int j = 0; j < 15; ++j) {
          const RowValue v = row.at(x[std::size_t(j)]);
          t[std::size_t(j)] = v.t;
          ma[std::size_t(j)] = v.massA;
          mb[std::size_t(j)] = v.massB;
          found += v.hidden;
        }
        p.t = kronrodSums(p.lo, p.hi, t);
        p.massA = kronrodSums(p.lo, p.hi, ma);
        p.massB = kronrodSums(p.lo, p.hi, mb);
      }
      hidden += found;
    });
    st.rows += 15LL * (long long)panels.size();
    st.hiddenPairs += hidden.load();
  };

  std::vector<Panel> done, todo;
  const int initial = std::max(1, int(std::ceil((yhi - ylo) / (2.0 * s.y()))));
  for (int k = 0; k < initial; ++k)
    todo.push_back({ylo + (yhi - ylo) * k / initial, ylo + (yhi - ylo) * (k + 1) / initial, {}, {}, {}});
  for (int round = 0; !todo.empty(); ++round) {
    if (ctl && ctl->shouldStop(std::min(0.95, 0.1 * round))) {
      *cancelled = true;
      return {};
    }
    evaluate(todo);
    double value = 0.0, error = 0.0;
    for (const auto* list : {&done, &todo})
      for (const Panel& p : *list) {
        value += p.t.kronrod;
        error += p.error();
      }
    const double tolerance = kRelativeTolerance * std::max(value, 1e-3);
    std::vector<Panel> next;
    const bool roomToSplit = int(done.size() + 2 * todo.size()) <= kMaxPanels;
    for (const Panel& p : todo) {
      const bool fine = error <= tolerance || p.error() <= tolerance * (p.hi - p.lo) / (yhi - ylo);
      if (!fine && !roomToSplit) st.panelLimitHit = true;
      if (fine || !roomToSplit) {
        done.push_back(p);
      } else {
        const double mid = 0.5 * (p.lo + p.hi);
        next.push_back({p.lo, mid, {}, {}, {}});
        next.push_back({mid, p.hi, {}, {}, {}});
      }
    }
    todo = std::move(next);
  }

  double fine = 0.0, coarse = 0.0, error = 0.0, massA = 0.0, massB = 0.0;
  for (const Panel& p : done) {
    fine += p.t.kronrod;
    coarse += p.t.gauss;
    error += p.error();
    massA += p.massA.kronrod;
    massB += p.massB.kronrod;
  }
  st.panels = int(done.size());
  if (stats) *stats = st;
  KdeIntegral r;
  r.value = std::clamp(0.5 * fine, 0.0, 1.0);
  r.coarseValue = std::clamp(0.5 * coarse, 0.0, 1.0);
  r.massA = massA;
  r.massB = massB;
  // Rounding: the noise band around d = 0 (no sign there) and the sums over rows and points.
  r.errorEstimate = 0.5 * error + 0.5 * (std::abs(1 - massA) + std::abs(1 - massB)) + 4 * kNoise +
                    kRoundingAllowance * std::max(1.0, r.value);
  return r;
}

}  // namespace barrow
