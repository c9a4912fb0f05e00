#include "transport/sinkhorn_solver.h"

#include <algorithm>
#include <cmath>
#include <memory>
#include <sstream>
#include <vector>

#include "transport/kernel_pass.h"
#include "transport/sinkhorn_coarse.h"
#include "transport/sinkhorn_relaxation.h"
#include "transport/sinkhorn_truncated.h"

namespace barrow {

namespace {

using kernel::RowWorkers;
using kernel::ScaledPoints;

std::string checkCloud(const char* name, const Eigen::MatrixX2d& x, const Eigen::VectorXd& w) {
  std::ostringstream s;
  if (x.rows() == 0) return std::string(name) + " has no points";
  if (w.size() != x.rows()) {
    s << name << " has " << x.rows() << " points but " << w.size() << " weights";
    return s.str();
  }
  if (!x.allFinite() || !w.allFinite()) return std::string(name) + " has a non-finite coordinate or weight";
  if (w.minCoeff() < 0) return std::string(name) + " has a negative weight";
  if (!(w.sum() > 0)) return std::string(name) + " has no mass (all weights are zero)";
  return {};
}

// ε values from the data's extent^p down to the target (the target alone without scaling).
std::vector<double> schedule(const SinkhornOptions& o, double extent) {
  std::vector<double> eps;
  if (o.epsilonScaling) {
    for (double e = std::pow(extent, o.p); e > o.epsilon; e *= o.scalingFactor) eps.push_back(e);
  }
  eps.push_back(o.epsilon);
  return eps;
}

// Side of the bounding box of both sets: an upper bound on the largest distance up to √2,
// all the annealing start needs.
double extentOf(const Eigen::MatrixX2d& x, const Eigen::MatrixX2d& y) {
  const Eigen::RowVector2d lo = x.colwise().minCoeff().cwiseMin(y.colwise().minCoeff());
  const Eigen::RowVector2d hi = x.colwise().maxCoeff().cwiseMax(y.colwise().maxCoeff());
  return (hi - lo).norm();
}

// From the row ratios (row marginal / a_i) of the current plan: the L1 marginal error and
// the plan's total mass. Zero-weight rows carry nothing.
void measureMarginals(const Eigen::VectorXd& a, const std::vector<double>& ratio, double* error, double* mass) {
  *error = 0.0;
  *mass = 0.0;
  for (Eigen::Index i = 0; i < a.size(); ++i)
    if (a(i) > 0) {
      *error += a(i) * std::abs(ratio[i] - 1.0);
      *mass += a(i) * ratio[i];
    }
}

// Fraction done for progress reports: annealing gets the first 20 %, the final stage the rest
// by how far the error has come down towards the tolerance (log scale).
double progressOf(int stage, int stages, double firstError, double error, double tolerance) {
  if (stage + 1 < stages) return 0.2 * stage / std::max(1, stages - 1);
  if (!(firstError > tolerance) || !std::isfinite(firstError)) return 0.2;
  const double t = std::log(firstError / std::max(error, tolerance)) / std::log(firstError / tolerance);
  return 0.2 + 0.8 * std::clamp(t, 0.0, 1.0);
}

// Stop tests shared by both solvers, made after each pass that measured the marginals.
struct LoopControl {
  const SinkhornOptions& o;
  const RunControl* control;
  SinkhornResult& r;
  double firstError = -1.0;
  double reported = 0.0;  // the largest fraction reported so far
  bool converged = false, cancelled = false;

  bool running() const { return !converged && !cancelled; }
  /// False when the loop must stop here (converged, out of budget, or asked to stop).
  /// `settled`: the other marginal is exact for the current weights, so the measured one
  /// decides convergence (false before the first half step of a solve: a warm start's g was
  /// made for other weights, and the row error alone cannot see that).
  bool proceed(int stage, bool last, bool settled = true) {
    if (last && firstError < 0) firstError = r.marginalError;
    if (last && settled && r.marginalError <= o.tolerance) converged = true;
    else if (r.iterations >= o.maxIterations) return false;
    else if (control) {
      // The error need not fall at every pass; the fraction shown never goes back.
      reported = std::max(reported, progressOf(stage, r.stages, firstError, r.marginalError, o.tolerance));
      if (control->shouldStop(reported)) cancelled = true;
    }
    return running();
  }
  /// After a pass given the cancel flag: false (and cancelled) when the flag cut it short,
  /// so its partly stale output is never used.
  bool passCompleted() {
    if (control && control->cancel && control->cancel->load(std::memory_order_relaxed)) cancelled = true;
    return running();
  }
  /// A check between the two half-steps of an iteration (each is a full pass over the pairs,
  /// ~0.1 s of one core at 10^4 + 10^4), so a cancel waits for one pass, not two.
  bool between() {
    if (control && control->shouldStop(reported)) cancelled = true;
    return running();
  }
  /// An annealing stage ends once loosely converged or after its few iterations.
  bool stageEnds(bool last, int stageIteration) const {
    return !last && (r.marginalError <= o.stageTolerance || stageIteration + 1 >= o.stageIterations);
  }
};

std::string errorText(double e) {
  std::ostringstream s;
  s.precision(3);
  s << e;
  return s.str();
}

// Finishes a result: status and message from how the loop ended.
void finish(SinkhornResult& r, bool converged, bool cancelled, const SinkhornOptions& o) {
  if (cancelled) {
    r.status = SinkhornStatus::Cancelled;
    r.message = "cancelled after " + std::to_string(r.iterations) + " iterations";
  } else if (converged) {
    r.status = SinkhornStatus::Converged;
    r.message.clear();
  } else {
    r.status = SinkhornStatus::MaxIterations;
    r.message = "not converged: marginal error " + errorText(r.marginalError) + " > tolerance " +
                errorText(o.tolerance) + " after " + std::to_string(r.iterations) +
                " iterations (raise max_iterations or ε)";
  }
}

// Owns a team when the caller gave none.
struct Team {
  std::unique_ptr<RowWorkers> own;
  RowWorkers* use;
  Team(RowWorkers* given, const RunControl* control) : use(given) {
    if (!use) {
      own = std::make_unique<RowWorkers>(threadBudget(control));
      use = own.get();
    }
  }
};

// The options of the coarse solve: the same problem settings, no coarse start of its own.
SinkhornOptions coarseOptions(const SinkhornOptions& o) {
  SinkhornOptions c = o;
  c.coarseGrid = 0;
  return c;
}

bool coarseApplies(const SinkhornOptions& o, int n, int m) { return o.coarseGrid > 0 && std::min(n, m) >= o.coarseFrom; }

// True when cells of the grids are fine enough for the kernel: their side at most twice its
// length scale ε^(1/p). Coarser summaries start the full clouds no better than the plain path
// (measured: up to 1.5× more iterations at a cell side of 7 ε^(1/p)).
bool coarseFineEnough(const SinkhornOptions& o, int side, const Eigen::MatrixX2d& x, const Eigen::MatrixX2d& y) {
  const double span = std::max((x.colwise().maxCoeff() - x.colwise().minCoeff()).maxCoeff(),
                               (y.colwise().maxCoeff() - y.colwise().minCoeff()).maxCoeff());
  const double length = o.p == 2 ? std::sqrt(o.epsilon) : o.epsilon;
  return span / side <= 2.0 * length;
}

// Grid side for clouds of at least `n` points: at most coarseGrid, and at least 4 points per
// cell on average, so that the coarse problem stays far smaller than the fine one.
int coarseSide(const SinkhornOptions& o, int n) {
  return std::max(1, std::min(o.coarseGrid, int(std::sqrt(n / 4.0))));
}

// The ε at which the truncated solver takes over (sinkhorn_truncated.h): the largest
// ε·(1/factor)^k, at most extent^p, whose estimated kept share is small; 0 when even the
// target ε keeps too many pairs (or truncation is off, or a cloud is small).
double truncatedFrom(const SinkhornOptions& o, const Eigen::MatrixX2d& x, const Eigen::MatrixX2d& y) {
  if (!o.truncation || std::min(x.rows(), y.rows()) < o.truncateFrom) return 0.0;
  const double theta = truncationTheta(o.tolerance);
  const double pairs = double(x.rows()) * double(y.rows());
  auto small = [&](double e) {
    const double share = keptShareEstimate(x, y, o.p, e, theta);
    return share <= kMaxKeptShare && share * pairs <= kMaxKeptPairs;
  };
  if (!small(o.epsilon)) return 0.0;
  const double top = std::pow(extentOf(x, y), o.p);
  double e = o.epsilon;
  while (e / o.scalingFactor <= top && small(e / o.scalingFactor)) e /= o.scalingFactor;
  return e;
}

// The ε for a coarse start of the truncated path: the smallest ε·(1/factor)^k at which the
// grid cells are fine enough for the kernel (coarseFineEnough), if it is at most `from`
// (else 0: no coarse start).
double coarseTruncationStart(const SinkhornOptions& o, const Eigen::MatrixX2d& x, const Eigen::MatrixX2d& y,
                             double from) {
  const int n = int(std::min(x.rows(), y.rows()));
  if (!coarseApplies(o, n, n)) return 0.0;
  const int side = coarseSide(o, n);
  double e = o.epsilon;
  for (int k = 0; k < 200 && !coarseFineEnough(SinkhornOptions{.epsilon = e, .p = o.p}, side, x, y); ++k)
    e /= o.scalingFactor;
  return e <= from * (1 + 1e-12) ? e : 0.0;
}

// The truncated path: potentials loosely solved at `from` by the dense solver (its coarse
// start included), or the warm start's at the target, then the truncated solver.
// Returns false (and leaves `out` alone) when the loose solve gave nothing to start from.
bool solveTruncatedPath(const Eigen::MatrixX2d& x, const Eigen::VectorXd& a, const Eigen::MatrixX2d& y,
                        const Eigen::VectorXd& b, const SinkhornOptions& o, const RunControl* control,
                        const Eigen::VectorXd* startF, const Eigen::VectorXd* startG, double from, bool symmetric,
                        RowWorkers& team, SinkhornResult& out) {
  SinkhornResult pre;
  double startOmega = 1.0;
  pre.iterations = 0;
  pre.stages = 0;
  Eigen::VectorXd f, g;
  if (startF) {
    f = *startF;
    g = startG ? *startG : *startF;
    from = o.epsilon;
  } else if (const double ec = coarseTruncationStart(o, x, y, from); ec > 0) {
    // Coarse start straight at ec: the grid summaries are solved there and their potentials
    // carried to every point (sinkhorn_coarse.h); no dense pass over the full clouds.
    const int side = coarseSide(o, int(std::min(x.rows(), y.rows())));
    const CoarseCloud cx = coarsenOnGrid(x, a, side);
    const CoarseCloud cy = symmetric ? cx : coarsenOnGrid(y, b, side);
    SinkhornOptions co = coarseOptions(o);
    co.epsilon = ec;
    co.truncation = false;
    const RunControl part = control ? control->sub(0.0, 0.2) : RunControl{};
    const SinkhornResult c = symmetric ? solveSinkhornSymmetric(cx.x, cx.w, co, control ? &part : nullptr, nullptr, &team)
                                       : solveSinkhorn(cx.x, cx.w, cy.x, cy.w, co, control ? &part : nullptr, nullptr, &team);
    if (c.status == SinkhornStatus::Cancelled) {
      out = SinkhornResult{};
      out.status = SinkhornStatus::Cancelled;
      out.message = "cancelled during the coarse start";
      out.f = Eigen::VectorXd::Zero(x.rows());  // sized for the caller's clouds, as the dense path
      if (!symmetric) out.g = Eigen::VectorXd::Zero(y.rows());
      return true;
    }
    if (!c.usable()) return false;
    f = extendPotential(x, cy, symmetric ? c.f : c.g, ec, o.p, team);
    g = symmetric ? f : extendPotential(y, cx, c.f, ec, o.p, team);
    if (!f.allFinite() || !g.allFinite()) return false;
    pre.coarseIterations = c.iterations;
    pre.coarsePoints = int(cx.x.rows() + (symmetric ? 0 : cy.x.rows()));
    from = ec;
    if (ec == o.epsilon) startOmega = c.omega;  // same ε: nearly the same rate
  } else {
    SinkhornOptions loose = o;
    loose.epsilon = from;
    loose.tolerance = std::max(o.tolerance, o.stageTolerance);
    loose.truncation = false;
    const RunControl part = control ? control->sub(0.0, 0.2) : RunControl{};
    pre = symmetric ? solveSinkhornSymmetric(x, a, loose, control ? &part : nullptr, nullptr, &team)
                    : solveSinkhorn(x, a, y, b, loose, control ? &part : nullptr, nullptr, &team);
    if (pre.status == SinkhornStatus::Cancelled) {
      out = pre;
      return true;
    }
    if (!pre.usable() || !pre.f.allFinite() || (!symmetric && !pre.g.allFinite())) return false;
    f = pre.f;
    g = symmetric ? pre.f : pre.g;
  }
  SinkhornOptions rest = o;
  rest.maxIterations = std::max(1, o.maxIterations - pre.iterations);
  const RunControl part = control ? control->sub(startF ? 0.0 : 0.2, 1.0) : RunControl{};
  out = solveSinkhornTruncated(x, a, y, b, rest, control ? &part : nullptr, std::move(f), std::move(g), from,
                               symmetric, team, startOmega);
  out.iterations += pre.iterations;
  out.stages += pre.stages;
  out.coarseIterations = pre.coarseIterations;
  out.coarsePoints = pre.coarsePoints;
  out.warmStarted = startF != nullptr;
  return true;
}

}  // namespace

bool sameSinkhornOptions(const SinkhornOptions& s, const SinkhornOptions& o) {
  return s.epsilon == o.epsilon && s.p == o.p && s.maxIterations == o.maxIterations && s.tolerance == o.tolerance &&
         s.epsilonScaling == o.epsilonScaling && s.scalingFactor == o.scalingFactor &&
         s.stageIterations == o.stageIterations && s.stageTolerance == o.stageTolerance &&
         s.overRelaxation == o.overRelaxation && s.coarseGrid == o.coarseGrid && s.coarseFrom == o.coarseFrom &&
         s.truncation == o.truncation && s.truncateFrom == o.truncateFrom;
}

std::string checkSinkhornOptions(const SinkhornOptions& o) {
  if (!(o.epsilon > 0) || !std::isfinite(o.epsilon)) return "epsilon must be a finite number > 0";
  if (o.p != 1 && o.p != 2) return "p must be 1 or 2";
  if (o.maxIterations < 1) return "max_iterations must be >= 1";
  if (!(o.tolerance > 0)) return "tolerance must be > 0";
  if (!(o.scalingFactor > 0 && o.scalingFactor < 1)) return "scaling factor must be in (0, 1)";
  if (o.stageIterations < 1) return "stage iterations must be >= 1";
  if (o.coarseGrid < 0) return "coarse grid must be >= 0";
  return {};
}

SinkhornResult solveSinkhorn(const Eigen::MatrixX2d& x, const Eigen::VectorXd& aIn,
                             const Eigen::MatrixX2d& y, const Eigen::VectorXd& bIn,
                             const SinkhornOptions& o, const RunControl* control,
                             const SinkhornStart* start, kernel::RowWorkers* workers) {
  SinkhornResult r;
  for (const std::string& e : {checkCloud("A", x, aIn), checkCloud("B", y, bIn), checkSinkhornOptions(o)}) {
    if (!e.empty()) {
      r.message = e;
      return r;
    }
  }
  const int n = int(x.rows()), m = int(y.rows());
  const Eigen::VectorXd a = aIn / aIn.sum(), b = bIn / bIn.sum();
  Team team(workers, control);
  if (n == m && x == y && a == b) {
    // One measure on both sides: the plan is near the identity and each matched pair's f/g
    // split is almost free, which alternating updates explore very slowly (measured: marginal
    // error ~1/k); the symmetric update has no split to find.
    Eigen::VectorXd mid;
    if (start && start->f && start->g && start->f->size() == n && start->g->size() == n)
      mid = 0.5 * (*start->f + *start->g);
    SinkhornResult same = solveSinkhornSymmetric(x, a, o, control, mid.size() ? &mid : nullptr, team.use);
    same.g = same.f;
    return same;
  }
  if (const double from = truncatedFrom(o, x, y); from > 0) {
    const bool warm = start && start->f && start->g && start->f->size() == n && start->g->size() == m &&
                      start->f->allFinite() && start->g->allFinite();
    if (solveTruncatedPath(x, a, y, b, o, control, warm ? start->f : nullptr, warm ? start->g : nullptr, from,
                           false, *team.use, r))
      return r;
  }
  const std::vector<double> logA = kernel::paddedLogWeights(a), logB = kernel::paddedLogWeights(b);

  r.f = Eigen::VectorXd::Zero(n);
  r.g = Eigen::VectorXd::Zero(m);
  r.warmStarted = start && start->f && start->g && start->f->size() == n && start->g->size() == m &&
                  start->f->allFinite() && start->g->allFinite();
  if (r.warmStarted) {
    r.f = *start->f;
    r.g = *start->g;
  }
  SinkhornOptions run = o;
  double coarseOmega = 1.0;
  if (!r.warmStarted && coarseApplies(o, n, m) && coarseFineEnough(o, coarseSide(o, std::min(n, m)), x, y)) {
    // Coarse-to-fine start (sinkhorn_coarse.h): the coarse solve anneals, the full clouds
    // start at the target ε from its potentials.
    const int side = coarseSide(o, std::min(n, m));
    const CoarseCloud cx = coarsenOnGrid(x, a, side), cy = coarsenOnGrid(y, b, side);
    const RunControl part = control ? control->sub(0.0, 0.2) : RunControl{};
    const SinkhornResult c =
        solveSinkhorn(cx.x, cx.w, cy.x, cy.w, coarseOptions(o), control ? &part : nullptr, nullptr, team.use);
    if (c.status == SinkhornStatus::Cancelled) {
      r.status = SinkhornStatus::Cancelled;
      r.message = "cancelled during the coarse start";
      return r;
    }
    r.coarseIterations = c.iterations;
    r.coarsePoints = int(cx.x.rows() + cy.x.rows());
    if (c.usable() && c.f.allFinite() && c.g.allFinite()) {
      r.f = extendPotential(x, cy, c.g, o.epsilon, o.p, *team.use);
      r.g = extendPotential(y, cx, c.f, o.epsilon, o.p, *team.use);
      run.epsilonScaling = false;
      coarseOmega = c.omega;
    }
    if (!r.f.allFinite() || !r.g.allFinite()) {
      r.f.setZero();
      r.g.setZero();
      run.epsilonScaling = o.epsilonScaling;
    }
  }
  if (r.warmStarted) run.epsilonScaling = false;
  const std::vector<double> eps = schedule(run, extentOf(x, y));
  r.stages = int(eps.size());

  std::vector<double> guessF(n), guessG(m), out(std::max(n, m)), ratio(n);
  LoopControl loop{o, control, r};
  const std::atomic<bool>* stopFlag = control ? control->cancel : nullptr;
  double mass = 1.0, e = eps.back();
  SinkhornRelaxation relax;
  if (o.overRelaxation) relax.startAt(coarseOmega);
  Eigen::VectorXd lastF, lastG;  // the state before the last (relaxed) update
  for (int s = 0; s < int(eps.size()) && loop.running(); ++s) {
    e = eps[s];
    const bool last = s + 1 == int(eps.size());
    const double scale = kernel::scaleFor(o.p, e);
    const ScaledPoints xs(x, scale), ys(y, scale);
    std::vector<double> hB(logB.size()), hA(logA.size());
    for (int stageIt = 0;; ++stageIt) {
      // f half-step; its row sums measure the current plan's row marginals.
      for (std::size_t j = 0; j < hB.size(); ++j) hB[j] = (j < std::size_t(m) ? r.g(j) / e : 0.0) + logB[j];
      for (int i = 0; i < n; ++i) guessF[i] = -r.f(i) / e;
      kernel::logSumExpRows(xs, ys, hB, o.p, guessF.data(), out.data(), ratio.data(), *team.use, stopFlag);
      if (!loop.passCompleted()) break;
      measureMarginals(a, ratio, &r.marginalError, &mass);
      if (last && !relax.accept(r.marginalError, a.dot(r.f) + b.dot(r.g) - e * (mass - 1.0))) {
        r.f = lastF;  // the relaxed step overshot: back to the state before it, plain steps on
        r.g = lastG;
        if (!loop.between()) break;
        continue;
      }
      if (!loop.proceed(s, last, r.iterations > 0)) break;
      const double w = last && o.overRelaxation ? relax.omega() : 1.0;
      if (w != 1.0) {
        lastF = r.f;
        lastG = r.g;
      }
      for (int i = 0; i < n; ++i) r.f(i) = (1.0 - w) * r.f(i) - w * e * out[i];
      if (!loop.between()) break;
      // g half-step: columns become exact (up to the relaxation).
      for (std::size_t i = 0; i < hA.size(); ++i) hA[i] = (i < std::size_t(n) ? r.f(i) / e : 0.0) + logA[i];
      for (int j = 0; j < m; ++j) guessG[j] = -r.g(j) / e;
      kernel::logSumExpRows(ys, xs, hA, o.p, guessG.data(), out.data(), nullptr, *team.use, stopFlag);
      if (!loop.passCompleted()) break;
      for (int j = 0; j < m; ++j) r.g(j) = (1.0 - w) * r.g(j) - w * e * out[j];
      ++r.iterations;
      if (loop.stageEnds(last, stageIt)) break;
    }
  }
  r.omega = relax.omega();
  // Dual objective at the current (f, g); the mass term vanishes when the columns are exact.
  r.value = a.dot(r.f) + b.dot(r.g) - (std::isfinite(mass) ? e * (mass - 1.0) : 0.0);
  finish(r, loop.converged, loop.cancelled, o);
  return r;
}

SinkhornResult solveSinkhornSymmetric(const Eigen::MatrixX2d& x, const Eigen::VectorXd& aIn,
                                      const SinkhornOptions& o, const RunControl* control,
                                      const Eigen::VectorXd* startF, kernel::RowWorkers* workers) {
  SinkhornResult r;
  for (const std::string& e : {checkCloud("cloud", x, aIn), checkSinkhornOptions(o)}) {
    if (!e.empty()) {
      r.message = e;
      return r;
    }
  }
  const int n = int(x.rows());
  const Eigen::VectorXd a = aIn / aIn.sum();
  const std::vector<double> logA = kernel::paddedLogWeights(a);
  Team team(workers, control);
  if (const double from = truncatedFrom(o, x, x); from > 0) {
    const bool warm = startF && startF->size() == n && startF->allFinite();
    if (solveTruncatedPath(x, a, x, a, o, control, warm ? startF : nullptr, nullptr, from, true, *team.use, r))
      return r;
  }

  r.f = Eigen::VectorXd::Zero(n);
  r.warmStarted = startF && startF->size() == n && startF->allFinite();
  if (r.warmStarted) r.f = *startF;
  SinkhornOptions run = o;
  if (!r.warmStarted && coarseApplies(o, n, n) && coarseFineEnough(o, coarseSide(o, n), x, x)) {
    const CoarseCloud cx = coarsenOnGrid(x, a, coarseSide(o, n));
    const RunControl part = control ? control->sub(0.0, 0.2) : RunControl{};
    const SinkhornResult c =
        solveSinkhornSymmetric(cx.x, cx.w, coarseOptions(o), control ? &part : nullptr, nullptr, team.use);
    if (c.status == SinkhornStatus::Cancelled) {
      r.status = SinkhornStatus::Cancelled;
      r.message = "cancelled during the coarse start";
      return r;
    }
    r.coarseIterations = c.iterations;
    r.coarsePoints = int(cx.x.rows());
    if (c.usable() && c.f.allFinite()) {
      r.f = extendPotential(x, cx, c.f, o.epsilon, o.p, *team.use);
      run.epsilonScaling = false;
    }
    if (!r.f.allFinite()) {
      r.f.setZero();
      run.epsilonScaling = o.epsilonScaling;
    }
  }
  if (r.warmStarted) run.epsilonScaling = false;
  const std::vector<double> eps = schedule(run, extentOf(x, x));
  r.stages = int(eps.size());

  std::vector<double> h(logA.size()), guess(n), out(n), ratio(n);
  LoopControl loop{o, control, r};
  double mass = 1.0, e = eps.back();
  for (int s = 0; s < int(eps.size()) && loop.running(); ++s) {
    e = eps[s];
    const bool last = s + 1 == int(eps.size());
    const ScaledPoints xs(x, kernel::scaleFor(o.p, e));
    for (int stageIt = 0;; ++stageIt) {
      for (std::size_t i = 0; i < h.size(); ++i) h[i] = (i < std::size_t(n) ? r.f(i) / e : 0.0) + logA[i];
      for (int i = 0; i < n; ++i) guess[i] = -r.f(i) / e;
      kernel::logSumExpRows(xs, xs, h, o.p, guess.data(), out.data(), ratio.data(), *team.use,
                            control ? control->cancel : nullptr);
      if (!loop.passCompleted()) break;
      measureMarginals(a, ratio, &r.marginalError, &mass);
      if (!loop.proceed(s, last)) break;
      // Averaged update: the plain one oscillates on the symmetric problem.
      for (int i = 0; i < n; ++i) r.f(i) = 0.5 * (r.f(i) - e * out[i]);
      ++r.iterations;
      if (loop.stageEnds(last, stageIt)) break;
    }
  }
  // Dual objective at (f, f): 2⟨a,f⟩ − ε(mass of the plan − 1), exact for the current f.
  r.value = 2.0 * a.dot(r.f) - (std::isfinite(mass) ? e * (mass - 1.0) : 0.0);
  finish(r, loop.converged, loop.cancelled, o);
  return r;
}

}  // namespace barrow
