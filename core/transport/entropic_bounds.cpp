#include "transport/entropic_bounds.h"

#include <cmath>
#include <limits>
#include <vector>

#include "transport/kernel_pass.h"

namespace barrow {

namespace {

using kernel::ScaledPoints;

constexpr double kUnitRoundoff = std::numeric_limits<double>::epsilon() / 2;

// Rounding allowance for sums over n + m entries of the given magnitude (Higham 2002, Sec. 4.2).
double allowance(Eigen::Index n, Eigen::Index m, double magnitude) {
  return 8.0 * double(n + m) * kUnitRoundoff * magnitude;
}

// Row pass: out_i = log Σ_j w_j exp((q_j − C_ij)/ε) with ratio_i = exp(out_i + f_i/ε), the
// row sum of the Gibbs plan of (f, q) divided by the row weight.
bool rowPass(const ScaledPoints& rows, const ScaledPoints& cols, const std::vector<double>& logW,
             const Eigen::VectorXd& f, const Eigen::VectorXd& q, double e, int p, std::vector<double>& out,
             std::vector<double>& ratio, kernel::RowWorkers& workers, const std::atomic<bool>* stop) {
  std::vector<double> h(logW.size()), guess(std::size_t(f.size()));
  for (std::size_t j = 0; j < h.size(); ++j) h[j] = logW[j] + (j < std::size_t(q.size()) ? q(Eigen::Index(j)) / e : 0.0);
  for (Eigen::Index i = 0; i < f.size(); ++i) guess[std::size_t(i)] = -f(i) / e;
  out.assign(std::size_t(f.size()), 0.0);
  ratio.assign(std::size_t(f.size()), 0.0);
  kernel::logSumExpRows(rows, cols, h, p, guess.data(), out.data(), ratio.data(), workers, stop);
  return !(stop && stop->load(std::memory_order_relaxed));
}

// Σ w log(w / ref) over the entries with w > 0 (w and ref on the same support rules: ref > 0
// wherever w > 0).
double klOf(const Eigen::VectorXd& w, const Eigen::VectorXd& ref) {
  double s = 0.0;
  for (Eigen::Index i = 0; i < w.size(); ++i)
    if (w(i) > 0 && ref(i) > 0) s += w(i) * std::log(w(i) / ref(i));
  return s;
}

// ⟨C, e hᵀ⟩ / |h| for C = |x − y|^p: exact by moments about a centre for p = 2, bounded by
// |x − y| ≤ |x − c| + |y − c| for p = 1.
double productCost(const Eigen::MatrixX2d& x, const Eigen::VectorXd& e, const Eigen::MatrixX2d& y,
                   const Eigen::VectorXd& h, int p) {
  const double he = h.sum(), ee = e.sum();
  if (!(he > 0) || !(ee > 0)) return 0.0;
  const Eigen::RowVector2d c = 0.5 * (x.colwise().mean() + y.colwise().mean());
  const Eigen::MatrixX2d xc = x.rowwise() - c, yc = y.rowwise() - c;
  if (p == 2) {
    const Eigen::RowVector2d mx = e.transpose() * xc, my = h.transpose() * yc;
    const double sx = e.dot(xc.rowwise().squaredNorm()), sy = h.dot(yc.rowwise().squaredNorm());
    return std::max(0.0, sx + (ee / he) * sy - 2.0 * mx.dot(my) / he);
  }
  return e.dot(xc.rowwise().norm()) + (ee / he) * h.dot(yc.rowwise().norm());
}

}  // namespace

EntropicDualBound entropicDualBound(const Eigen::MatrixX2d& x, const Eigen::VectorXd& a, const Eigen::MatrixX2d& y,
                                    const Eigen::VectorXd& b, const Eigen::VectorXd& f, const Eigen::VectorXd& g,
                                    double epsilon, int p, kernel::RowWorkers& workers,
                                    const std::atomic<bool>* stop) {
  EntropicDualBound r;
  const double scale = kernel::scaleFor(p, epsilon);
  const ScaledPoints xs(x, scale), ys(y, scale);
  std::vector<double> out, ratio;
  // g' = the c-transform of f: the columns of the Gibbs plan of (f, g') sum to b exactly, so
  // its mass is 1 and the dual objective is <a,f> + <b,g'>.
  if (!rowPass(ys, xs, kernel::paddedLogWeights(a), g, f, epsilon, p, out, ratio, workers, stop)) return r;
  Eigen::VectorXd best(y.rows());
  for (Eigen::Index j = 0; j < y.rows(); ++j) best(j) = b(j) > 0 ? -epsilon * out[std::size_t(j)] : 0.0;
  if (!best.allFinite()) return r;
  const double magnitude = a.dot(f.cwiseAbs()) + b.dot(best.cwiseAbs()) + epsilon;
  r.low = a.dot(f) + b.dot(best) - allowance(x.rows(), y.rows(), magnitude);
  r.complete = std::isfinite(r.low);
  return r;
}

EntropicRoundedBound entropicRoundedBound(const Eigen::MatrixX2d& x, const Eigen::VectorXd& a,
                                          const Eigen::MatrixX2d& y, const Eigen::VectorXd& b,
                                          const Eigen::VectorXd& f, const Eigen::VectorXd& gIn, double epsilon, int p,
                                          kernel::RowWorkers& workers, const std::atomic<bool>* stop) {
  EntropicRoundedBound r;
  const double e = epsilon;
  const double scale = kernel::scaleFor(p, e);
  const ScaledPoints xs(x, scale), ys(y, scale);
  const std::vector<double> logA = kernel::paddedLogWeights(a), logB = kernel::paddedLogWeights(b);
  const Eigen::Index n = x.rows(), m = y.rows();
  std::vector<double> out, ratio;
  // 1. g ← the c-transform of f: the Gibbs plan's columns are exact.
  if (!rowPass(ys, xs, logA, gIn, f, e, p, out, ratio, workers, stop)) return r;
  Eigen::VectorXd g(m);
  for (Eigen::Index j = 0; j < m; ++j) g(j) = -e * out[std::size_t(j)];
  if (!g.allFinite()) return r;
  // 2. Row sums r_i = a_i ratio_i; the dual bound at (f, g) on the way.
  if (!rowPass(xs, ys, logB, f, g, e, p, out, ratio, workers, stop)) return r;
  // Scaling the rows down to a_i: f' = f + ε log s = min(f, f − ε log ratio), in log form so
  // that a row sum far off its weight (ratio overflowing) still gives finite numbers.
  Eigen::VectorXd fs(n), rho(n), deficitA(n);
  double mass = 0.0;
  for (Eigen::Index i = 0; i < n; ++i) {
    const double logRatio = a(i) > 0 ? out[std::size_t(i)] + f(i) / e : 0.0;
    mass += a(i) * std::exp(logRatio);
    fs(i) = f(i) - e * std::max(0.0, logRatio);
    rho(i) = a(i) * std::exp(std::min(0.0, logRatio));
    deficitA(i) = std::max(0.0, a(i) - rho(i));
  }
  const double magnitude = a.dot(f.cwiseAbs()) + b.dot(g.cwiseAbs()) + e;
  r.low = a.dot(f) + b.dot(g) - e * (mass - 1.0) - allowance(n, m, magnitude + e * mass);
  // 3. Column sums κ_j of P' = diag(s) P.
  if (!rowPass(ys, xs, logA, g, fs, e, p, out, ratio, workers, stop)) return r;
  Eigen::VectorXd kappa(m), deficitB(m);
  for (Eigen::Index j = 0; j < m; ++j) {
    kappa(j) = b(j) > 0 ? b(j) * ratio[std::size_t(j)] : 0.0;
    deficitB(j) = std::max(0.0, b(j) - kappa(j));
  }
  const double delta = deficitA.sum(), deltaB = deficitB.sum();
  double high = rho.dot(fs) + kappa.dot(g);
  if (delta > 0 && deltaB > 0) {
    high += productCost(x, deficitA, y, deficitB, p);
    if (delta < 1.0) high -= e * (1.0 - delta) * std::log1p(-delta);
    high += e * delta * (klOf(deficitA / delta, a) + klOf(deficitB / deltaB, b));
  }
  const double highMagnitude = rho.dot(fs.cwiseAbs()) + kappa.dot(g.cwiseAbs()) + magnitude;
  r.high = high + allowance(n, m, highMagnitude);
  r.deficit = delta;
  r.rowPotential = std::move(fs);
  r.colPotential = std::move(g);
  r.complete = std::isfinite(r.high);  // low may be −inf when a row sum overflowed
  return r;
}

}  // namespace barrow
