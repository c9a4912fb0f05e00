#include "transport/exact_ot.h"

#include <algorithm>
#include <chrono>
#include <cmath>

#include "transport/exact_candidates.h"
#include "transport/exact_initial_basis.h"
#include "transport/exact_multiscale.h"
#include "transport/exact_pricing.h"
#include "transport/exact_problem.h"
#include "transport/exact_site_tree.h"
#include "transport/exact_warm_state.h"
#include "transport/network_simplex.h"

namespace barrow {
namespace {

std::string checkOptions(const ExactOtOptions& o) {
  if (!std::isfinite(o.p) || o.p < 1.0) return "cost exponent p must be a finite number >= 1";
  if (!(o.tolerance > 0.0 && o.tolerance <= 1e-3)) return "tolerance must lie in (0, 1e-3]";
  if (o.maxPivots < 0) return "pivot limit must be >= 0";
  if (o.neighbours < 0 || o.warmNeighbours < 0) return "number of neighbours must be >= 0";
  if (o.arcsPerRow < 1) return "arcs added per row must be >= 1";
  if (o.groupSize < 2) return "multiscale group size must be >= 2";
  return {};
}

// One problem solved to optimality by column generation, from a given start.
struct LevelOutcome {
  ExactOtStatus status = ExactOtStatus::Optimal;
  std::vector<NetworkSimplex::BasisArc> basis;  // final basis (arc ids into `pairs`)
  std::vector<int> roots;
  std::vector<std::pair<int, int>> arcs;         // every arc the restricted problems held
  Eigen::ArrayXd u, v;                           // tree potentials at the end
  std::vector<std::pair<int, int>> added;        // arcs found by pricing
  std::shared_ptr<SiteTree> sinks;               // tree over the sinks, for pricing
  long long pivots = 0, degenerate = 0;
  int rounds = 0;
};

int arcId(const std::vector<std::pair<int, int>>& sorted, int i, int j) {
  return int(std::lower_bound(sorted.begin(), sorted.end(), std::make_pair(i, j)) - sorted.begin());
}

// Restricted problem on `pairs` (sorted, unique, containing the basis arcs), then pricing
// all pairs and adding violated arcs until none is left.
LevelOutcome solveLevel(const ExactProblem& pr, std::vector<std::pair<int, int>> pairs,
                        const std::vector<FlowArc>& start, const std::vector<int>& roots,
                        const ExactOtOptions& o, const RunControl* control, long long budget,
                        std::string* error) {
  LevelOutcome out;
  const double tol = o.tolerance * pr.scale();
  NetworkSimplex ns(pr.massA, pr.massB);
  for (const auto& [i, j] : pairs) ns.addArc(i, j, pr.c(i, j));
  std::vector<NetworkSimplex::BasisArc> ids;
  for (const auto& f : start) ids.push_back({arcId(pairs, f.i, f.j), f.flow});
  *error = ns.setBasis(ids, roots);
  if (!error->empty()) return out;

  std::vector<std::pair<int, int>> violated;
  out.sinks = std::make_shared<SiteTree>(pr.bx, pr.by, pr.cost);
  out.u.resize(pr.n());
  out.v.resize(pr.m());
  while (true) {
    const auto st = ns.run(tol, budget, control);
    if (st == NetworkSimplex::RunStatus::Cancelled) {
      out.status = ExactOtStatus::Cancelled;
      break;
    }
    for (int i = 0; i < pr.n(); ++i) out.u(i) = ns.u(i);
    for (int j = 0; j < pr.m(); ++j) out.v(j) = ns.v(j);
    if (st == NetworkSimplex::RunStatus::PivotLimit) {
      out.status = ExactOtStatus::IterationLimit;
      break;
    }
    violated.clear();
    if (!priceAllPairs(pr, *out.sinks, out.u, out.v, tol, o.arcsPerRow, &violated, control, ns.progress())) {
      out.status = ExactOtStatus::Cancelled;
      break;
    }
    ++out.rounds;
    if (violated.empty()) break;
    for (const auto& [i, j] : violated) ns.addArc(i, j, pr.c(i, j));
    out.added.insert(out.added.end(), violated.begin(), violated.end());
  }
  out.pivots = ns.pivots();
  out.degenerate = ns.degeneratePivots();
  ns.basis(&out.basis, &out.roots);
  pairs.insert(pairs.end(), out.added.begin(), out.added.end());
  out.arcs = std::move(pairs);
  return out;
}

// `outer` seen through a window: progress f is reported as lo + (hi − lo)·f, so that the
// levels of a coarse-to-fine solve report one rising fraction.
RunControl within(const RunControl& outer, double lo, double hi) {
  RunControl r;
  r.cancel = outer.cancel;
  if (outer.onProgress) r.onProgress = [&outer, lo, hi](double f) { return outer.onProgress(lo + (hi - lo) * f); };
  return r;
}

// A cold solve: the start comes from a coarse solve of grouped points when the problem is
// large enough for that to pay (it reports the first quarter of the progress), else from
// the greedy (or north-west) rule on neighbours.
LevelOutcome solveCold(const ExactProblem& pr, const ExactOtOptions& o, const RunControl* control,
                       long long budget, std::string* error) {
  auto pairs = nearestNeighbourArcs(pr, o.neighbours);
  std::vector<FlowArc> start;
  long long spent = 0, degenerate = 0;
  int rounds = 0;
  const bool coarseFirst = o.multiscale && std::min(pr.n(), pr.m()) > o.coarsestSize;
  const RunControl coarseControl = control ? within(*control, 0.0, 0.25) : RunControl{};
  const RunControl fineControl = control ? within(*control, coarseFirst ? 0.25 : 0.0, 1.0) : RunControl{};
  if (coarseFirst) {
    const CoarseProblem coarse = coarsen(pr, o.groupSize);
    const LevelOutcome c = solveCold(coarse.problem, o, control ? &coarseControl : nullptr, budget, error);
    if (!error->empty() || c.status == ExactOtStatus::Cancelled) return c;
    std::vector<std::pair<int, int>> plan;
    for (const auto& f : c.basis) plan.push_back(c.arcs[std::size_t(f.arc)]);
    refineStart(pr, coarse, plan, c.u, c.v, &pairs, &start);
    spent = c.pivots;
    degenerate = c.degenerate;
    rounds = c.rounds;
  } else {
    start = o.initial == InitialBasis::Greedy ? greedyBasis(pr, pairs) : northWestBasis(pr);
  }
  for (const auto& f : start) pairs.emplace_back(f.i, f.j);
  sortUnique(pairs);
  LevelOutcome out = solveLevel(pr, std::move(pairs), start, {}, o, control ? &fineControl : nullptr,
                                std::max(0LL, budget - spent), error);
  out.pivots += spent;
  out.degenerate += degenerate;
  out.rounds += rounds;
  return out;
}

std::vector<std::int64_t> perRow(const std::vector<std::int64_t>& mass, const std::vector<int>& rows, Eigen::Index size) {
  std::vector<std::int64_t> out(std::size_t(size), 0);
  for (std::size_t k = 0; k < rows.size(); ++k) out[std::size_t(rows[k])] = mass[k];
  return out;
}

std::vector<int> inverse(const std::vector<int>& rows, Eigen::Index size) {
  std::vector<int> out(std::size_t(size), -1);
  for (std::size_t k = 0; k < rows.size(); ++k) out[std::size_t(rows[k])] = int(k);
  return out;
}

// The warm state's basis in active indices; false if it does not fit this problem.
bool warmStart(const ExactWarmState& ws, const ExactProblem& pr, Eigen::Index n, Eigen::Index m,
               std::vector<FlowArc>* basis, std::vector<int>* roots, std::vector<std::pair<int, int>>* extra) {
  const auto toA = inverse(pr.rowA, n), toB = inverse(pr.rowB, m);
  auto fits = [&](int i, int j) {
    return i >= 0 && i < n && j >= 0 && j < m && toA[std::size_t(i)] >= 0 && toB[std::size_t(j)] >= 0;
  };
  if (ws.basisArcs.size() != ws.basisFlows.size()) return false;
  for (std::size_t k = 0; k < ws.basisArcs.size(); ++k) {
    const auto [i, j] = ws.basisArcs[k];
    if (!fits(i, j)) return false;
    basis->push_back({toA[std::size_t(i)], toB[std::size_t(j)], ws.basisFlows[k]});
  }
  for (int r : ws.roots) {
    const int node = r < 0 ? -1 : r < n ? toA[std::size_t(r)] : r - n < m ? toB[std::size_t(r - n)] : -1;
    if (node < 0) return false;
    roots->push_back(r < n ? node : pr.n() + node);
  }
  for (const auto& [i, j] : ws.addedArcs)
    if (fits(i, j)) extra->emplace_back(toA[std::size_t(i)], toB[std::size_t(j)]);
  return true;
}

}  // namespace

ExactOtResult solveExactOt(const Cloud& a, const Cloud& b, const ExactOtOptions& options,
                           const RunControl* control, std::shared_ptr<WarmState>* warm) {
  const auto startTime = std::chrono::steady_clock::now();
  ExactOtResult r;
  auto finish = [&](std::string message) -> ExactOtResult {
    r.message = std::move(message);
    r.seconds = std::chrono::duration<double>(std::chrono::steady_clock::now() - startTime).count();
    return std::move(r);
  };
  if (auto e = a.validate()) return finish("A: " + *e);
  if (auto e = b.validate()) return finish("B: " + *e);
  if (auto e = checkOptions(options); !e.empty()) return finish(e);

  const ExactProblem pr = makeExactProblem(a, b, options.p);
  if (!std::isfinite(pr.scale())) return finish("the points span too wide a range: costs overflow double precision");
  const double tol = options.tolerance * pr.scale();
  const auto massA = perRow(pr.massA, pr.rowA, a.size()), massB = perRow(pr.massB, pr.rowB, b.size());

  // Warm start when the stored basis fits (same sizes, weights and cost), else cold.
  LevelOutcome out;
  std::string error;
  const auto* ws = warm && *warm ? dynamic_cast<const ExactWarmState*>(warm->get()) : nullptr;
  std::vector<FlowArc> basis;
  std::vector<int> roots;
  std::vector<std::pair<int, int>> pairs;
  if (ws && ws->p == options.p && ws->massA == massA && ws->massB == massB &&
      warmStart(*ws, pr, a.size(), b.size(), &basis, &roots, &pairs)) {
    const auto near = nearestNeighbourArcs(pr, options.warmNeighbours);
    pairs.insert(pairs.end(), near.begin(), near.end());
    for (const auto& f : basis) pairs.emplace_back(f.i, f.j);
    sortUnique(pairs);
    out = solveLevel(pr, std::move(pairs), basis, roots, options, control, options.maxPivots, &error);
    r.warmStarted = error.empty();
  }
  if (!r.warmStarted) {
    error.clear();
    out = solveCold(pr, options, control, options.maxPivots, &error);
  }
  if (!error.empty()) return finish("internal error: starting basis rejected: " + error);
  r.status = out.status;
  r.pivots = out.pivots;
  r.degeneratePivots = out.degenerate;
  r.rounds = out.rounds;
  r.arcs = int(out.arcs.size());
  if (r.status == ExactOtStatus::Cancelled) return finish("cancelled");

  // Duals: u becomes the c-transform of v, so u_i + v_j <= c_ij holds for every pair; the
  // points of zero weight get the c-transform too (A against B, then B against all of A).
  std::vector<int> ties;
  Eigen::ArrayXd uActive;
  SiteTree& sinks = *out.sinks;
  cTransformSources(pr, sinks, out.v, 4.0 * tol, &uActive, &ties);
  r.u.resize(a.size());
  r.v.resize(b.size());
  for (int i = 0; i < pr.n(); ++i) r.u(pr.rowA[std::size_t(i)]) = uActive(i);
  for (int j = 0; j < pr.m(); ++j) r.v(pr.rowB[std::size_t(j)]) = out.v(j);
  for (Eigen::Index i = 0; i < a.size(); ++i)
    if (massA[std::size_t(i)] == 0) r.u(i) = sinks.minScore(a.points(i, 0), a.points(i, 1));
  for (Eigen::Index j = 0; j < b.size(); ++j)
    if (massB[std::size_t(j)] == 0)
      r.v(j) = cTransformAt(b.points(j, 0), b.points(j, 1), a.points.col(0).array(), a.points.col(1).array(),
                            r.u.array(), pr.cost);

  // The plan, its cost and its marginals; the plan is unique when no arc off the basis
  // has zero reduced cost (a sufficient condition).
  std::vector<int> basicPerRow(std::size_t(pr.n()), 0);
  Eigen::VectorXd rowSum = Eigen::VectorXd::Zero(a.size()), colSum = Eigen::VectorXd::Zero(b.size());
  double cost = 0.0;
  for (const auto& f : out.basis) {
    const auto [i, j] = out.arcs[std::size_t(f.arc)];
    ++basicPerRow[std::size_t(i)];
    if (f.flow == 0) continue;
    const double mass = double(f.flow) / double(pr.total);
    const int ri = pr.rowA[std::size_t(i)], rj = pr.rowB[std::size_t(j)];
    r.plan.push_back({ri, rj, mass});
    cost += mass * pr.c(i, j);
    rowSum(ri) += mass;
    colSum(rj) += mass;
  }
  r.cost = cost;
  r.value = pr.cost.root(cost);
  r.marginalError = std::max((rowSum - a.normalizedWeights()).cwiseAbs().maxCoeff(),
                             (colSum - b.normalizedWeights()).cwiseAbs().maxCoeff());
  r.dualGap = cost - (a.normalizedWeights().dot(r.u) + b.normalizedWeights().dot(r.v));
  bool unique = true;
  for (int i = 0; i < pr.n(); ++i) unique = unique && ties[std::size_t(i)] <= basicPerRow[std::size_t(i)];
  r.planUnique = unique;

  if (r.status == ExactOtStatus::IterationLimit)
    return finish("pivot limit of " + std::to_string(options.maxPivots) + " reached before optimality");
  if (warm) {
    auto next = std::make_shared<ExactWarmState>();
    next->p = options.p;
    next->massA = massA;
    next->massB = massB;
    for (const auto& f : out.basis) {
      const auto [i, j] = out.arcs[std::size_t(f.arc)];
      next->basisArcs.push_back({pr.rowA[std::size_t(i)], pr.rowB[std::size_t(j)]});
      next->basisFlows.push_back(f.flow);
    }
    for (int node : out.roots)
      next->roots.push_back(node < pr.n() ? pr.rowA[std::size_t(node)] : int(a.size()) + pr.rowB[std::size_t(node - pr.n())]);
    for (const auto& [i, j] : out.added) next->addedArcs.push_back({pr.rowA[std::size_t(i)], pr.rowB[std::size_t(j)]});
    *warm = std::move(next);
  }
  return finish({});
}

}  // namespace barrow
