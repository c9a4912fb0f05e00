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
  if (o.neighbours < 0 || o.warmNeighbours < 0 || o.guidedArcs < 0) return "numbers of arcs per point must be >= 0";
  if (o.arcsPerRow < 1) return "arcs added per row must be >= 1";
  if (o.groupSize < 2) return "multiscale group size must be >= 2";
  if (o.coarsestSize < 1) return "coarsest level size must be >= 1";
  return {};
}

constexpr int kMinSourcesForTeam = 512;

// One problem solved to optimality by column generation, from a given start.
struct LevelOutcome {
  ExactOtStatus status = ExactOtStatus::Optimal;
  std::vector<FlowArc> basis;                    // final basis (zero flows included)
  std::vector<int> roots;                        // its component roots
  int arcs = 0;                                  // arcs the restricted problem held at the end
  Eigen::ArrayXd u, v;                           // tree potentials at the end
  std::vector<std::pair<int, int>> added;        // arcs found by pricing
  std::shared_ptr<SiteTree> sinks;               // tree over the sinks, for pricing
  std::shared_ptr<kernel::RowWorkers> team;      // pricing threads; null for small problems
  SourceMinima minima;                           // v^c and ties from the last pricing pass
                                                 // (final when the status is Optimal)
  long long pivots = 0, degenerate = 0;
  int rounds = 0;
};

// Sinks within this many tolerances of a source's minimum count as ties (plan uniqueness).
constexpr double kTieWindow = 4.0;

int arcId(const std::vector<std::pair<int, int>>& sorted, int i, int j) {
  return int(std::lower_bound(sorted.begin(), sorted.end(), std::make_pair(i, j)) - sorted.begin());
}

// Restricted problem on `pairs` (sorted, unique, containing the basis arcs), then pricing
// all pairs and adding violated arcs until none is left.
LevelOutcome solveLevel(const ExactProblem& pr, const std::vector<std::pair<int, int>>& pairs,
                        const std::vector<FlowArc>& start, const std::vector<int>& roots,
                        const ExactOtOptions& o, const RunControl* control, long long budget,
                        std::string* error, std::shared_ptr<kernel::RowWorkers> team = nullptr) {
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
  // Pricing is worth more than one core once there are a few chunks of sources per thread.
  if (pr.n() >= kMinSourcesForTeam)
    out.team = team ? std::move(team) : std::make_shared<kernel::RowWorkers>(threadBudget(control));
  out.u.resize(pr.n());
  out.v.resize(pr.m());
  out.minima.window = kTieWindow * tol;
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
    if (!priceAllPairs(pr, *out.sinks, out.u, out.v, tol, o.arcsPerRow, &violated, control, ns.progress(),
                       out.team.get(), &out.minima)) {
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
  out.arcs = ns.arcCount();
  std::vector<NetworkSimplex::BasisArc> final;
  ns.basis(&final, &out.roots);
  for (const auto& f : final) out.basis.push_back({ns.arcSource(f.arc), ns.arcSink(f.arc), f.flow});
  return out;
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
  std::shared_ptr<kernel::RowWorkers> team;  // made once here when the start can use it too
  const bool coarseFirst = o.multiscale && std::min(pr.n(), pr.m()) > o.coarsestSize;
  const RunControl coarseControl = control ? control->sub(0.0, 0.25) : RunControl{};
  const RunControl fineControl = control ? control->sub(coarseFirst ? 0.25 : 0.0, 1.0) : RunControl{};
  if (coarseFirst) {
    const CoarseProblem coarse = coarsen(pr, o.groupSize);
    const LevelOutcome c = solveCold(coarse.problem, o, control ? &coarseControl : nullptr, budget, error);
    if (!error->empty() || c.status == ExactOtStatus::Cancelled) return c;
    std::vector<std::pair<int, int>> plan;
    for (const auto& f : c.basis) plan.emplace_back(f.i, f.j);
    if (pr.n() >= kMinSourcesForTeam) team = std::make_shared<kernel::RowWorkers>(threadBudget(control));
    refineStart(pr, coarse, plan, c.u, o.guidedArcs, &pairs, &start, team.get());
    spent = c.pivots;
    degenerate = c.degenerate;
    rounds = c.rounds;
  } else {
    start = o.initial == InitialBasis::Greedy ? greedyBasis(pr, pairs) : northWestBasis(pr);
  }
  for (const auto& f : start) pairs.emplace_back(f.i, f.j);
  sortUnique(pairs);
  LevelOutcome out = solveLevel(pr, pairs, start, {}, o, control ? &fineControl : nullptr,
                                std::max(0LL, budget - spent), error, std::move(team));
  out.pivots += spent;
  out.degenerate += degenerate;
  out.rounds += rounds;
  return out;
}

// Potentials per input row: u becomes the c-transform of v, so u_i + v_j <= c_ij holds for
// every pair; rows of zero weight get the c-transform too (A against B's sinks, then B
// against all of A). `ties` counts, per active source, sinks within zeroTol of its minimum.
void fillPotentials(const Cloud& a, const Cloud& b, const ExactProblem& pr, const LevelOutcome& out, double zeroTol,
                    ExactOtResult* r, std::vector<int>* ties) {
  Eigen::ArrayXd u;
  if (out.status == ExactOtStatus::Optimal) {  // the last pricing pass found them for these v
    u = out.minima.u;
    *ties = out.minima.ties;
  } else {
    cTransformSources(pr, *out.sinks, out.v, zeroTol, &u, ties, out.team.get());
  }
  r->u.resize(a.size());
  r->v.resize(b.size());
  for (int i = 0; i < pr.n(); ++i) r->u(pr.rowA[std::size_t(i)]) = u(i);
  for (int j = 0; j < pr.m(); ++j) r->v(pr.rowB[std::size_t(j)]) = out.v(j);
  const auto massA = massesPerRow(pr, true, a.size()), massB = massesPerRow(pr, false, b.size());
  for (Eigen::Index i = 0; i < a.size(); ++i)
    if (massA[std::size_t(i)] == 0) r->u(i) = out.sinks->minScore(a.points(i, 0), a.points(i, 1));
  for (Eigen::Index j = 0; j < b.size(); ++j)
    if (massB[std::size_t(j)] == 0)
      r->v(j) = cTransformAt(b.points(j, 0), b.points(j, 1), a.points.col(0).array(), a.points.col(1).array(),
                             r->u.array(), pr.cost);
}

// The plan (nonzero flows), its cost, value and marginal error, the duality gap, and
// whether the plan is certainly unique: no arc off the basis has zero reduced cost.
void fillPlan(const Cloud& a, const Cloud& b, const ExactProblem& pr, const LevelOutcome& out,
              const std::vector<int>& ties, ExactOtResult* r) {
  std::vector<int> basicPerRow(std::size_t(pr.n()), 0);
  Eigen::VectorXd rowSum = Eigen::VectorXd::Zero(a.size()), colSum = Eigen::VectorXd::Zero(b.size());
  double cost = 0.0;
  for (const auto& f : out.basis) {
    ++basicPerRow[std::size_t(f.i)];
    if (f.flow == 0) continue;
    const double mass = double(f.flow) / double(pr.total);
    const int ri = pr.rowA[std::size_t(f.i)], rj = pr.rowB[std::size_t(f.j)];
    r->plan.push_back({ri, rj, mass});
    cost += mass * pr.c(f.i, f.j);
    rowSum(ri) += mass;
    colSum(rj) += mass;
  }
  r->cost = cost;
  r->value = pr.cost.root(cost);
  r->marginalError = std::max((rowSum - a.normalizedWeights()).cwiseAbs().maxCoeff(),
                              (colSum - b.normalizedWeights()).cwiseAbs().maxCoeff());
  r->dualGap = cost - (a.normalizedWeights().dot(r->u) + b.normalizedWeights().dot(r->v));
  if (out.status != ExactOtStatus::Optimal) return;
  bool unique = true;
  for (int i = 0; i < pr.n(); ++i) unique = unique && ties[std::size_t(i)] <= basicPerRow[std::size_t(i)];
  r->planUnique = unique;
}

}  // namespace

ExactOtOptions exactOtOptionsFor(double p) {
  ExactOtOptions o;
  o.p = p;
  if (p == 1.0) {
    o.guidedArcs = 24;
    o.arcsPerRow = 16;
  }
  return o;
}

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

  // Warm start when the stored basis fits (same sizes, weights and cost), else cold.
  LevelOutcome out;
  std::string error;
  const auto* ws = warm && *warm ? dynamic_cast<const ExactWarmState*>(warm->get()) : nullptr;
  std::vector<FlowArc> basis;
  std::vector<int> roots;
  std::vector<std::pair<int, int>> pairs;
  if (ws && unpackWarmState(*ws, pr, a.size(), b.size(), &basis, &roots, &pairs)) {
    const auto near = nearestNeighbourArcs(pr, options.warmNeighbours);
    pairs.insert(pairs.end(), near.begin(), near.end());
    for (const auto& f : basis) pairs.emplace_back(f.i, f.j);
    sortUnique(pairs);
    out = solveLevel(pr, pairs, basis, roots, options, control, options.maxPivots, &error);
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
  r.arcs = out.arcs;
  if (r.status == ExactOtStatus::Cancelled) return finish("cancelled");

  std::vector<int> ties;
  fillPotentials(a, b, pr, out, kTieWindow * tol, &r, &ties);
  fillPlan(a, b, pr, out, ties, &r);
  if (r.status == ExactOtStatus::IterationLimit)
    return finish("pivot limit of " + std::to_string(options.maxPivots) + " reached before optimality");
  if (warm) *warm = packWarmState(pr, a.size(), b.size(), out.basis, out.roots, out.added);
  return finish({});
}

}  // namespace barrow
