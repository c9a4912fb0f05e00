#include "transport/sinkhorn_truncated.h"

#include <algorithm>
#include <cmath>
#include <limits>
#include <numeric>
#include <sstream>

#include "base/cpu_features.h"
#include "transport/kernel_pass.h"
#include "transport/kernel_pass_simd.h"
#include "transport/sinkhorn_relaxation.h"

namespace barrow {

namespace {

constexpr double kInf = std::numeric_limits<double>::infinity();
using kernel::kSumHigh;
using kernel::kSumLow;
using kernel::useAvx2;

double costOf(int p, double d2) { return p == 2 ? d2 : std::sqrt(d2); }

// Σ_k exp(h[idx_k] − cost_k·inv − s) over one compressed row.
double sparseSumScalar(const int* idx, const double* cost, int count, const double* h, double inv, double s) {
  double acc = 0.0;
  for (int k = 0; k < count; ++k) acc += kernel::expScalar(h[idx[k]] - cost[k] * inv - s);
  return acc;
}

#ifdef BARROW_X86_SIMD
BARROW_AVX2_FN double sparseSumAvx2(const int* idx, const double* cost, int count, const double* h, double inv,
                                    double s) {
  const __m256d iv = _mm256_set1_pd(inv), sv = _mm256_set1_pd(s);
  __m256d acc = _mm256_setzero_pd();
  int k = 0;
  for (; k + 4 <= count; k += 4) {
    const __m128i j = _mm_loadu_si128(reinterpret_cast<const __m128i*>(idx + k));
    const __m256d hv = _mm256_i32gather_pd(h, j, 8);
    const __m256d t = _mm256_sub_pd(_mm256_fnmadd_pd(_mm256_loadu_pd(cost + k), iv, hv), sv);
    acc = _mm256_add_pd(acc, kernel::exp4(t));
  }
  double rest = 0.0;
  for (; k < count; ++k) rest += kernel::expScalar(h[idx[k]] - cost[k] * inv - s);
  return kernel::hsum4(acc) + rest;
}
#endif

// Row log-sum-exp over a compressed (CSR) pattern; see TruncatedKernel::rowLogSumExp.
void csrLogSumExp(const std::vector<long long>& start, const std::vector<int>& idx, const std::vector<double>& cost,
                  const std::vector<double>& h, double epsilon, const double* guess, double* out, double* ratio,
                  kernel::RowWorkers& workers) {
  const int rows = int(start.size()) - 1;
  const double inv = 1.0 / epsilon;
  const bool avx = useAvx2();
  const long long perRow = rows > 0 ? (long long)idx.size() / rows + 1 : 1;
  const int grain = int(std::clamp<long long>(32768 / perRow, 1, 4096));
  workers.run(rows, rows * perRow < 40000 ? std::max(1, rows) : grain, [&](int begin, int end) {
    for (int i = begin; i < end; ++i) {
      const int* ix = idx.data() + start[i];
      const double* c = cost.data() + start[i];
      const int count = int(start[i + 1] - start[i]);
      auto sum = [&](double s) {
#ifdef BARROW_X86_SIMD
        if (avx) return sparseSumAvx2(ix, c, count, h.data(), inv, s);
#endif
        return sparseSumScalar(ix, c, count, h.data(), inv, s);
      };
      const double g = guess ? guess[i] : 0.0;
      double s = std::isfinite(g) ? sum(g) : 0.0;
      if (s >= kSumLow && s <= kSumHigh) {
        out[i] = g + std::log(s);
        if (ratio) ratio[i] = s;
        continue;
      }
      double mx = -kInf;
      for (int k = 0; k < count; ++k) mx = std::max(mx, h[ix[k]] - c[k] * inv);
      out[i] = std::isfinite(mx) ? mx + std::log(sum(mx)) : -kInf;
      if (ratio) ratio[i] = std::isfinite(g) ? std::exp(out[i] - g) : kInf;
    }
  });
}

// Exact c-transform of one point q against all points z with weights w and potentials v:
// −ε log Σ_k w_k exp((v_k − |q − z_k|^p)/ε), by its maximum.
double exactTransform(double qx, double qy, const Eigen::MatrixX2d& z, const Eigen::VectorXd& w,
                      const Eigen::VectorXd& v, double epsilon, int p) {
  double mx = -kInf;
  std::vector<double> t(z.rows());
  for (Eigen::Index k = 0; k < z.rows(); ++k) {
    const double dx = qx - z(k, 0), dy = qy - z(k, 1);
    t[k] = w(k) > 0 ? std::log(w(k)) + (v(k) - costOf(p, dx * dx + dy * dy)) / epsilon : -kInf;
    mx = std::max(mx, t[k]);
  }
  double s = 0.0;
  for (double e : t) s += std::exp(e - mx);
  return -epsilon * (mx + std::log(s));
}

}  // namespace

TruncatedKernel::TruncatedKernel(const Eigen::MatrixX2d& x, const Eigen::VectorXd& a, const Eigen::MatrixX2d& y,
                                 const Eigen::VectorXd& b, int p)
    : x_(x), y_(y), a_(a), b_(b), p_(p), treeY_(y) {}

void TruncatedKernel::queryRows(const std::vector<int>& rows, const Eigen::VectorXd& f, const Eigen::VectorXd& g,
                                double bound, std::vector<std::vector<std::pair<int, double>>>& lists,
                                kernel::RowWorkers& workers) const {
  const std::vector<double> maxG = treeY_.nodeMaxima(g);
  const auto& nodes = treeY_.nodes();
  const auto& order = treeY_.order();
  workers.run(int(rows.size()), 64, [&](int begin, int end) {
    std::vector<int> stack;
    for (int r = begin; r < end; ++r) {
      const int i = rows[r];
      const double qx = x_(i, 0), qy = x_(i, 1);
      const double t = bound - f(i);  // keep j with g_j − c_ij ≥ t
      auto& list = lists[i];
      list.clear();
      stack.assign(1, 0);
      while (!stack.empty()) {
        const int k = stack.back();
        stack.pop_back();
        const BoxTree::Node& node = nodes[k];
        if (maxG[k] - costOf(p_, BoxTree::boxDistance2(node, qx, qy)) < t) continue;
        if (node.left >= 0) {
          stack.push_back(node.left);
          stack.push_back(node.right);
          continue;
        }
        for (int s = node.begin; s < node.end; ++s) {
          const int j = order[s];
          const double dx = qx - y_(j, 0), dy = qy - y_(j, 1);
          const double c = costOf(p_, dx * dx + dy * dy);
          if (g(j) - c >= t) list.emplace_back(j, c);
        }
      }
      std::sort(list.begin(), list.end());
    }
  });
}

void TruncatedKernel::build(Eigen::VectorXd& f, Eigen::VectorXd& g, double epsilon, double theta,
                            kernel::RowWorkers& workers) {
  const int n = int(x_.rows()), m = int(y_.rows());
  const double bound = -theta * epsilon;
  std::vector<std::vector<std::pair<int, double>>> lists(n);
  std::vector<int> all(n);
  std::iota(all.begin(), all.end(), 0);
  queryRows(all, f, g, bound, lists, workers);
  auto carries = [&](const std::vector<std::pair<int, double>>& l) {
    return std::any_of(l.begin(), l.end(), [&](const auto& e) { return b_(e.first) > 0; });
  };
  // Rows without a pair of positive column weight: exact c-transform, then ask again.
  std::vector<int> empty;
  for (int i = 0; i < n; ++i)
    if (!carries(lists[i])) empty.push_back(i);
  for (int i : empty) f(i) = exactTransform(x_(i, 0), x_(i, 1), y_, b_, g, epsilon, p_);
  if (!empty.empty()) queryRows(empty, f, g, bound, lists, workers);
  // Columns likewise; their g only rises, so no row empties, but every row is asked again.
  std::vector<char> hit(m, 0);
  for (int i = 0; i < n; ++i)
    if (a_(i) > 0)
      for (const auto& e : lists[i]) hit[e.first] = 1;
  bool fixed = false;
  for (int j = 0; j < m; ++j)
    if (!hit[j]) {
      g(j) = exactTransform(y_(j, 0), y_(j, 1), x_, a_, f, epsilon, p_);
      fixed = true;
    }
  if (fixed) queryRows(all, f, g, bound, lists, workers);

  rowStart_.assign(n + 1, 0);
  for (int i = 0; i < n; ++i) rowStart_[i + 1] = rowStart_[i] + (long long)lists[i].size();
  rowCol_.resize(rowStart_[n]);
  rowCost_.resize(rowStart_[n]);
  std::vector<long long> count(m + 1, 0);
  keptWeight_ = 0.0;
  for (int i = 0; i < n; ++i) {
    double rowB = 0.0;
    long long k = rowStart_[i];
    for (const auto& e : lists[i]) {
      rowCol_[k] = e.first;
      rowCost_[k++] = e.second;
      ++count[e.first + 1];
      rowB += b_(e.first);
    }
    keptWeight_ += a_(i) * rowB;
    std::vector<std::pair<int, double>>().swap(lists[i]);
  }
  colStart_.assign(m + 1, 0);
  for (int j = 0; j < m; ++j) colStart_[j + 1] = colStart_[j] + count[j + 1];
  colRow_.resize(rowCol_.size());
  colCost_.resize(rowCol_.size());
  std::vector<long long> fill(colStart_.begin(), colStart_.end() - 1);
  for (int i = 0; i < n; ++i)
    for (long long k = rowStart_[i]; k < rowStart_[i + 1]; ++k) {
      const long long at = fill[rowCol_[k]]++;
      colRow_[at] = i;
      colCost_[at] = rowCost_[k];
    }
  f0_ = f;
  g0_ = g;
  eps0_ = epsilon;
  theta_ = theta;
}

double TruncatedKernel::drift(const Eigen::VectorXd& f, const Eigen::VectorXd& g, double epsilon) const {
  double df = -kInf, dg = -kInf;
  for (Eigen::Index i = 0; i < f.size(); ++i)
    if (a_(i) > 0) df = std::max(df, f(i) - f0_(i));
  for (Eigen::Index j = 0; j < g.size(); ++j)
    if (b_(j) > 0) dg = std::max(dg, g(j) - g0_(j));
  return (df + dg) / epsilon;
}

double TruncatedKernel::neglectedBound(const Eigen::VectorXd& f, const Eigen::VectorXd& g, double epsilon) const {
  const double dropped = std::max(0.0, 1.0 - keptWeight_);
  if (dropped == 0.0) return 0.0;
  return dropped * std::exp(std::min(0.0, -theta_ * eps0_ / epsilon + drift(f, g, epsilon)));
}

bool TruncatedKernel::kept(int i, int j) const {
  return std::binary_search(rowCol_.begin() + rowStart_[i], rowCol_.begin() + rowStart_[i + 1], j);
}

void TruncatedKernel::rowLogSumExp(const std::vector<double>& h, double epsilon, const double* guess, double* out,
                                   double* ratio, kernel::RowWorkers& workers) const {
  csrLogSumExp(rowStart_, rowCol_, rowCost_, h, epsilon, guess, out, ratio, workers);
}

void TruncatedKernel::colLogSumExp(const std::vector<double>& h, double epsilon, const double* guess, double* out,
                                   kernel::RowWorkers& workers) const {
  csrLogSumExp(colStart_, colRow_, colCost_, h, epsilon, guess, out, nullptr, workers);
}

double truncationTheta(double tolerance) { return std::log(1e3 / tolerance) + kDriftLimit; }

double keptShareEstimate(const Eigen::MatrixX2d& x, const Eigen::MatrixX2d& y, int p, double epsilon, double theta) {
  const Eigen::RowVector2d lo = x.colwise().minCoeff().cwiseMin(y.colwise().minCoeff());
  const Eigen::RowVector2d hi = x.colwise().maxCoeff().cwiseMax(y.colwise().maxCoeff());
  const Eigen::RowVector2d side = hi - lo;
  const double radius = p == 2 ? std::sqrt(theta * epsilon) : theta * epsilon;
  // A disc against the box, each side at least the disc's diameter (thin clouds).
  const double area = std::max(side(0), 2 * radius) * std::max(side(1), 2 * radius);
  return area > 0 ? std::min(1.0, 3.14159265358979 * radius * radius / area) : 1.0;
}

namespace {

std::vector<double> logsOf(const Eigen::VectorXd& w) {
  std::vector<double> l(w.size());
  for (Eigen::Index i = 0; i < w.size(); ++i) l[i] = w(i) > 0 ? std::log(w(i)) : -kInf;
  return l;
}

// L1 error and mass of a marginal from ratios (marginal / weight).
void marginals(const Eigen::VectorXd& w, const double* ratio, double* error, double* mass) {
  *error = 0.0;
  *mass = 0.0;
  for (Eigen::Index i = 0; i < w.size(); ++i)
    if (w(i) > 0) {
      *error += w(i) * std::abs(ratio[i] - 1.0);
      *mass += w(i) * ratio[i];
    }
}

// Full-problem row ratios at (f, g) by one dense pass (kernel_pass.h).
std::vector<double> denseRatios(const Eigen::MatrixX2d& rows, const Eigen::VectorXd& f, const Eigen::MatrixX2d& cols,
                                const Eigen::VectorXd& wCols, const Eigen::VectorXd& g, double epsilon, int p,
                                kernel::RowWorkers& workers) {
  const double scale = kernel::scaleFor(p, epsilon);
  const kernel::ScaledPoints rs(rows, scale), cs(cols, scale);
  std::vector<double> h = kernel::paddedLogWeights(wCols);
  for (Eigen::Index j = 0; j < g.size(); ++j) h[j] += g(j) / epsilon;
  std::vector<double> guess(rows.rows()), out(rows.rows()), ratio(rows.rows());
  for (Eigen::Index i = 0; i < f.size(); ++i) guess[i] = -f(i) / epsilon;
  kernel::logSumExpRows(rs, cs, h, p, guess.data(), out.data(), ratio.data(), workers);
  return ratio;
}

std::string text(double v) {
  std::ostringstream s;
  s.precision(3);
  s << v;
  return s.str();
}

}  // namespace

SinkhornResult solveSinkhornTruncated(const Eigen::MatrixX2d& x, const Eigen::VectorXd& a, const Eigen::MatrixX2d& y,
                                      const Eigen::VectorXd& b, const SinkhornOptions& o, const RunControl* control,
                                      Eigen::VectorXd f, Eigen::VectorXd g, double startEpsilon, bool symmetric,
                                      kernel::RowWorkers& workers, double startOmega) {
  SinkhornResult r;
  const int n = int(x.rows()), m = int(y.rows());
  if (symmetric) g = f;
  const double theta = truncationTheta(o.tolerance);
  const std::vector<double> logA = logsOf(a), logB = logsOf(b);
  TruncatedKernel kernel(x, a, y, b, o.p);
  // ε·(1/factor)^k for k = K .. 0, K from startEpsilon (rounded: it is such a multiple).
  std::vector<double> eps;
  const int stages = startEpsilon > o.epsilon
                         ? int(std::lround(std::log(startEpsilon / o.epsilon) / -std::log(o.scalingFactor)))
                         : 0;
  for (int k = stages; k >= 0; --k) eps.push_back(o.epsilon * std::pow(1.0 / o.scalingFactor, k));
  r.stages = int(eps.size());
  r.truncated = true;

  std::vector<double> hB(m), hA(n), guessF(n), guessG(m), out(std::max(n, m)), ratio(n);
  SinkhornRelaxation relax;
  if (o.overRelaxation && eps.size() == 1) relax.startAt(startOmega);
  Eigen::VectorXd lastF, lastG;
  double mass = 1.0, e = o.epsilon, firstError = -1.0;
  bool converged = false, cancelled = false;
  int local = 0;  // iterations in this call
  for (int s = 0; s < int(eps.size()) && !converged && !cancelled; ++s) {
    e = eps[s];
    const bool last = s + 1 == int(eps.size());
    // Annealing stages stop at the loose stageTolerance: a smaller θ suffices there.
    const double th = last ? theta : std::min(theta, truncationTheta(o.stageTolerance));
    kernel.build(f, g, e, th, workers);
    if (symmetric) f = g = f.cwiseMax(g);  // a fix on either side is a fix of the one potential
    ++r.truncations;
    for (int stageIt = 0;; ++stageIt) {
      if (kernel.drift(f, g, e) > kDriftLimit) {
        kernel.build(f, g, e, th, workers);
        if (symmetric) f = g = f.cwiseMax(g);
        ++r.truncations;
      }
      r.keptPairs = std::max(r.keptPairs, kernel.pairs());
      for (int j = 0; j < m; ++j) hB[j] = g(j) / e + logB[j];
      for (int i = 0; i < n; ++i) guessF[i] = -f(i) / e;
      kernel.rowLogSumExp(hB, e, guessF.data(), out.data(), ratio.data(), workers);
      marginals(a, ratio.data(), &r.marginalError, &mass);
      const double dual = a.dot(f) + b.dot(g) - e * (mass - 1.0);
      if (last && !symmetric && !relax.accept(r.marginalError, dual)) {
        f = lastF;
        g = lastG;
        continue;
      }
      if (last && firstError < 0) firstError = r.marginalError;
      if (last && local > 0 && r.marginalError + kernel.neglectedBound(f, g, e) <= o.tolerance) {
        converged = true;
        break;
      }
      if (r.iterations >= o.maxIterations) break;
      if (control) {
        double progress = 0.2 * s / std::max(1, r.stages - 1);
        if (last && firstError > o.tolerance && r.marginalError > 0)
          progress = 0.2 + 0.8 * std::clamp(std::log(firstError / std::max(r.marginalError, o.tolerance)) /
                                                std::log(firstError / o.tolerance),
                                            0.0, 1.0);
        if (control->shouldStop(progress)) {
          cancelled = true;
          break;
        }
      }
      if (symmetric) {
        for (int i = 0; i < n; ++i) f(i) = 0.5 * (f(i) - e * out[i]);
        g = f;
      } else {
        const double w = last && o.overRelaxation ? relax.omega() : 1.0;
        if (w != 1.0) {
          lastF = f;
          lastG = g;
        }
        for (int i = 0; i < n; ++i) f(i) = (1.0 - w) * f(i) - w * e * out[i];
        for (int i = 0; i < n; ++i) hA[i] = f(i) / e + logA[i];
        for (int j = 0; j < m; ++j) guessG[j] = -g(j) / e;
        kernel.colLogSumExp(hA, e, guessG.data(), out.data(), workers);
        for (int j = 0; j < m; ++j) g(j) = (1.0 - w) * g(j) - w * e * out[j];
      }
      ++r.iterations;
      ++local;
      if (!last && (r.marginalError <= o.stageTolerance || stageIt + 1 >= o.stageIterations)) break;
    }
  }
  r.omega = relax.omega();
  r.neglectedBound = kernel.neglectedBound(f, g, e);
  // The full problem at the final (f, g): one dense pass each way where affordable, else
  // the bound (file comment).
  double value = a.dot(f) + b.dot(g) - e * (mass - 1.0);
  double fullError = r.marginalError + r.neglectedBound;
  if (!cancelled && double(n) * double(m) <= kDenseCheckPairs) {
    const std::vector<double> rowRatio = denseRatios(x, f, y, b, g, e, o.p, workers);
    double rowError = 0.0, fullMass = 0.0;
    marginals(a, rowRatio.data(), &rowError, &fullMass);
    fullError = rowError;  // rows, as the dense solver measures (sinkhorn_solver.h)
    if (std::isfinite(fullMass)) value = a.dot(f) + b.dot(g) - e * (fullMass - 1.0);
    r.fullCheck = true;
  }
  r.marginalError = fullError;
  r.value = value;
  r.f = std::move(f);
  if (symmetric) r.g.resize(0);
  else r.g = std::move(g);
  if (cancelled) {
    r.status = SinkhornStatus::Cancelled;
    r.message = "cancelled after " + std::to_string(r.iterations) + " iterations";
  } else if (converged && fullError <= o.tolerance) {
    r.status = SinkhornStatus::Converged;
    r.message.clear();
  } else {
    r.status = SinkhornStatus::MaxIterations;
    r.message = "not converged: marginal error " + text(fullError) + " > tolerance " + text(o.tolerance) +
                " after " + std::to_string(r.iterations) + " iterations" +
                (converged ? " (truncated kernel; the full-problem check disagrees)" : " (raise max_iterations or ε)");
  }
  return r;
}

}  // namespace barrow
