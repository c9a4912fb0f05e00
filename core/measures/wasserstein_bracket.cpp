#include "measures/wasserstein_bracket.h"

#include <algorithm>
#include <chrono>
#include <cmath>
#include <utility>
#include <vector>

#include "base/parallel_blocks.h"
#include "kernel/gaussian_fit.h"
#include "kernel/support_points.h"
#include "spatial/cloud_quantiser.h"
#include "spatial/offset_nearest.h"

namespace barrow {

namespace {
double since(std::chrono::steady_clock::time_point t0) {
  return std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count();
}
// f at every point of c (0 where the weight is 0), queried cell by cell so that each query
// starts from its neighbour's best site; blocks on the control's threads. False when stopped.
bool evaluateAt(const Cloud& c, const Quantisation& q, const OffsetNearest& f, double slack, const RunControl* control,
                Eigen::VectorXd& out) {
  constexpr int kBlock = 4096;
  out = Eigen::VectorXd::Zero(c.size());
  std::vector<Eigen::Index> order;
  for (Eigen::Index i = 0; i < c.size(); ++i)
    if (c.weights(i) > 0) order.push_back(i);
  std::stable_sort(order.begin(), order.end(), [&](Eigen::Index x, Eigen::Index y) {
    return q.cellOf[std::size_t(x)] < q.cellOf[std::size_t(y)];
  });
  const int blocks = int((order.size() + kBlock - 1) / kBlock);
  return runBlocks(blocks, [&](int k) {
    int hint = -1;
    const std::size_t end = std::min(order.size(), std::size_t(k + 1) * kBlock);
    for (std::size_t t = std::size_t(k) * kBlock; t < end; ++t) {
      const Eigen::Index i = order[t];
      out(i) = f(c.points(i, 0), c.points(i, 1), slack, &hint);
    }
  }, WorkSlice{control, 0.0, 1.0});
}

// Kantorovich duality, p = 1 (Kantorovich–Rubinstein; Villani 2003, Thm 1.14 (mem)):
// W1(A, B) ≥ Σ a_i φ(x_i) − Σ b_j φ(y_j) for every 1-Lipschitz φ. φ(z) = min_s (|z − m_s| − v_s),
// the c-transform of the quantised problem's potentials on QB, is 1-Lipschitz on the whole
// plane; evaluated at the original points it is far tighter than the triangle bound. φ is
// evaluated up to `slack` (offset_nearest.h: φ ≤ φ̃ ≤ φ + slack), so the slack is subtracted [D].
double dualLowW1(const Cloud& a, const Cloud& b, const Quantisation& qa, const Quantisation& qb,
                 const Eigen::VectorXd& v, double slack, const RunControl* control) {
  if (v.size() != qb.representatives.size() || !v.allFinite()) return 0.0;
  const OffsetNearest phi(qb.representatives.points, v, 1);
  Eigen::VectorXd fa, fb;
  if (!evaluateAt(a, qa, phi, slack, control, fa) || !evaluateAt(b, qb, phi, slack, control, fb)) return 0.0;
  return std::max(0.0, a.normalizedWeights().dot(fa) - b.normalizedWeights().dot(fb) - slack);
}

// Kantorovich duality, p = 2 (Villani 2003, Thm 1.3 (mem)): W2² ≥ Σ a_i u_i + Σ b_j ψ_j whenever
// u_i + ψ_j ≤ |x_i − y_j|² for every pair. ψ: the c-transform of the quantised potentials U on
// QA, evaluated at B's points (any numbers would do; a good ψ makes the bound tight). u: the
// c-transform of ψ over all of B's points, u_i = min_j (|x_i − y_j|² − ψ_j), which makes every
// pair feasible; computed up to `slack` (subtracted) [D]. Returns the bound on W2 (not squared).
double dualLowW2(const Cloud& a, const Cloud& b, const Quantisation& qa, const Quantisation& qb,
                 const Eigen::VectorXd& u, double slack, const RunControl* control) {
  if (u.size() != qa.representatives.size() || !u.allFinite()) return 0.0;
  Eigen::VectorXd psi, ua;
  if (!evaluateAt(b, qb, OffsetNearest(qa.representatives.points, u, 2), slack, control, psi)) return 0.0;
  Eigen::Index nb = 0;
  for (Eigen::Index j = 0; j < b.size(); ++j) nb += b.weights(j) > 0;
  Eigen::MatrixX2d sites(nb, 2);
  Eigen::VectorXd offsets(nb);
  for (Eigen::Index j = 0, k = 0; j < b.size(); ++j)
    if (b.weights(j) > 0) {
      sites.row(k) = b.points.row(j);
      offsets(k++) = psi(j);
    }
  if (!evaluateAt(a, qa, OffsetNearest(sites, offsets, 2), slack, control, ua)) return 0.0;
  const double cost = a.normalizedWeights().dot(ua) + b.normalizedWeights().dot(psi) - slack;
  return std::sqrt(std::max(0.0, cost));
}

}  // namespace

WassersteinBracket bracketWasserstein(const Cloud& a, const Cloud& b, int p, Eigen::Index representatives,
                                      const RunControl* control, std::shared_ptr<WarmState>* warm) {
  WassersteinBracket out;
  const auto t0 = std::chrono::steady_clock::now();
  const RunControl none;
  const RunControl& c = control ? *control : none;
  const RunControl partA = c.sub(0.0, 0.02), partB = c.sub(0.02, 0.04), solve = c.sub(0.04, 1.0);
  const Quantisation qa = quantiseCloud(a, representatives, &partA);
  const Quantisation qb = qa.cancelled ? Quantisation{} : quantiseCloud(b, representatives, &partB);
  if (qa.cancelled || qb.cancelled) {
    out.cancelled = true;
    return out;
  }
  out.representativesOfA = qa.representatives;
  out.representativesOfB = qb.representatives;
  out.errorA = qa.errorBound(p);
  out.errorB = qb.errorBound(p);
  out.quantiseSeconds = since(t0);

  const auto t1 = std::chrono::steady_clock::now();
  // Plain options, not exactOtOptionsFor: W1's optimal duals are not unique, and the bracket's
  // dual lower bound was measured (RESULTS-large-wp.md) with the duals these options give.
  ExactOtOptions o;
  o.p = p;
  out.quantised = solveExactOt(out.representativesOfA, out.representativesOfB, o, &solve, warm);
  out.solveSeconds = since(t1);
  if (out.quantised.status == ExactOtStatus::Cancelled) out.cancelled = true;
  if (out.quantised.status != ExactOtStatus::Optimal) return out;

  const double w = out.quantised.value;
  const auto t2 = std::chrono::steady_clock::now();
  out.triangleLow = std::max(0.0, w - out.errorA - out.errorB);
  out.meanLow = (a.mean() - b.mean()).norm();
  if (p == 2) {
    // Less 1e-6 of the larger spread: gaussian_fit.h drops near-zero eigenvalues, which may
    // raise the Gaussian distance by up to ~1e-7 of the larger standard deviation.
    const GaussianFit ga = fitGaussian(supportOf(a)), gb = fitGaussian(supportOf(b));
    const double spread = std::sqrt(std::max(ga.cov.trace(), gb.cov.trace()));
    out.gaussianLow = std::max(0.0, std::sqrt(std::max(0.0, gaussianW2Squared(ga, gb))) - 1e-6 * spread);
  }
  // The slack: a thousandth of the quantisation error (for p = 2 in cost units, times
  // eA + eB), small beside the bracket's width.
  const double slack = 1e-3 * (out.errorA + out.errorB);
  if (p == 1) out.dualLow = dualLowW1(a, b, qa, qb, out.quantised.v, slack, control);
  else out.dualLow = dualLowW2(a, b, qa, qb, out.quantised.u, slack * (out.errorA + out.errorB), control);
  if (control && control->shouldStop()) {
    out.cancelled = true;
    return out;
  }
  const double low = std::max({out.triangleLow, out.meanLow, out.gaussianLow, out.dualLow});
  out.lowRule = low == out.triangleLow ? "triangle"
                : low == out.dualLow   ? "dual"
                : low == out.meanLow   ? "means"
                                       : "gaussian";
  double high = 0.0;
  if (p == 1) {
    // Glued coupling: the mass π_rs spread over cell r of A and cell s of B, independently.
    // Its cost per pair of cells is E|X − Y| ≤ min(d + δ_r + δ_s, sqrt(d² + V_r + V_s)),
    // d = |m_r − m_s|, δ mean distance and V mean square distance to the cell's mean
    // (triangle inequality; Jensen) [D].
    const Eigen::MatrixX2d& ma = out.representativesOfA.points;
    const Eigen::MatrixX2d& mb = out.representativesOfB.points;
    for (const PlanEntry& e : out.quantised.plan) {
      const double d = (ma.row(e.i) - mb.row(e.j)).norm();
      const double viaMeans = d + qa.cellDistance(e.i) + qb.cellDistance(e.j);
      const double viaSquares = std::sqrt(d * d + qa.cellSquare(e.i) + qb.cellSquare(e.j));
      high += e.mass * std::min(viaMeans, viaSquares);
    }
    high = std::min(high, w + out.errorA + out.errorB);
  } else {
    high = std::sqrt(w * w + out.errorA * out.errorA + out.errorB * out.errorB);
  }
  out.boundSeconds = since(t2);
  out.low = std::max(0.0, low * (1.0 - kBracketRounding));
  out.high = high * (1.0 + kBracketRounding);
  return out;
}

}  // namespace barrow
