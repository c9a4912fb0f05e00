#include "measures/entropic_measure.h"

#include <algorithm>
#include <cmath>
#include <memory>
#include <optional>
#include <sstream>

#include "measures/entropic_bracket.h"
#include "transport/sinkhorn_cache.h"
#include "transport/sinkhorn_carry.h"
#include "transport/sinkhorn_plan.h"

namespace barrow {

namespace {

constexpr double kAutoFraction = 1.0 / 20.0;  // auto ε = (D/20)^p: a blur of 5 % of the extent

// Potentials kept between calls of a sweep (same sizes, same ε and p), with the points they
// were solved on so that they can be carried to the moved clouds (sinkhorn_carry.h).
struct EntropicWarm : WarmState {
  SolvedPotentials last;
  std::optional<SolvedPotentials> before;  // the solve one step earlier on the path
  double epsilon = 0.0;
  int p = 0;
};

}  // namespace

std::vector<ParamSpec> entropicParamSpecs(const std::string& group) {
  const ParamSpec eps{
      .key = group + ".epsilon",
      .kind = ParamKind::Real,
      .defaultValue = "auto",
      .min = 0.0,
      .minExclusive = true,
      .choices = {"auto"},
      .unit = "cost units",
      .help = "entropic regularisation ε, absolute in cost units (length^p); auto = (D/20)^p with D "
            "the joint diameter of A and B, frozen at a sweep's reference"};
  const ParamSpec p{
      .key = group + ".p",
      .kind = ParamKind::Integer,
      .defaultValue = "2",
      .min = 1,
      .max = 2,
      .help = "ground cost |x-y|^p: 1 or 2"};
  const ParamSpec iters{
      .key = group + ".max_iterations",
      .kind = ParamKind::Integer,
      .defaultValue = "10000",
      .min = 1,
      .max = 1e8,
      .unit = "iterations",
      .help = "Sinkhorn iteration budget (annealing included); beyond it the result is not-converged"};
  const ParamSpec tol{
      .key = group + ".tolerance",
      .kind = ParamKind::Real,
      .defaultValue = "1e-6",
      .min = 0.0,
      .max = 0.5,
      .minExclusive = true,
      .help = "stop when the L1 error of the plan's marginals (masses sum to 1) is below this; the "
            "value itself is typically accurate to far better"};
  const ParamSpec limit{
      .key = group + ".exact_limit",
      .kind = ParamKind::Integer,
      .defaultValue = std::to_string(kEntropicDefaultExactLimit),
      .min = 0,
      .max = 2000000000,
      .unit = "points",
      .help = "largest cloud (points of positive weight) solved in full; larger clouds get a certified "
              "bracket [low, high] (0: always bracket; a huge value: always the full solve)"};
  const ParamSpec reps{
      .key = group + ".representatives",
      .kind = ParamKind::Integer,
      .defaultValue = std::to_string(kEntropicDefaultRepresentatives),
      .min = 1,
      .max = 2000000000,
      .unit = "points",
      .help = "bracket mode: each cloud is quantised to this many representatives and the problem solved "
              "between them"};
  return {eps, p, iters, tol, limit, reps};
}

EntropicSettings readEntropicSettings(const std::string& group, const ParamSet& params, const Cloud& a,
                                      const Cloud& b) {
  EntropicSettings s;
  SinkhornOptions& o = s.options;
  if (params.has(group + ".p")) o.p = params.integer(group + ".p");
  if (params.has(group + ".max_iterations")) o.maxIterations = params.integer(group + ".max_iterations");
  if (params.has(group + ".tolerance")) o.tolerance = params.real(group + ".tolerance");
  s.exactLimit = params.has(group + ".exact_limit") ? params.integer(group + ".exact_limit")
                                                    : kEntropicDefaultExactLimit;
  s.representatives = params.has(group + ".representatives") ? params.integer(group + ".representatives")
                                                             : kEntropicDefaultRepresentatives;
  // The bounding box's diagonal, by hypot so that it is finite whenever the coordinates are.
  const Eigen::RowVector2d lo = a.points.colwise().minCoeff().cwiseMin(b.points.colwise().minCoeff());
  const Eigen::RowVector2d hi = a.points.colwise().maxCoeff().cwiseMax(b.points.colwise().maxCoeff());
  const double diagonal = std::hypot(hi(0) - lo(0), hi(1) - lo(1));
  s.costBound = std::pow(diagonal, o.p);
  if (!std::isfinite(s.costBound)) {
    std::ostringstream m;
    m.precision(3);
    m << group << ": the coordinates are too large for the cost |x - y|^" << o.p << " (clouds span about " << diagonal
      << ", so costs overflow double precision); rescale the data";
    s.error = m.str();
    return s;
  }
  s.diameter = jointDiameter(a, b);
  const std::string key = group + ".epsilon";
  s.automatic = !params.has(key) || params.isWord(key, "auto");
  if (s.automatic) {
    // All points in one place: every cost is 0 and OT_ε = 0 for any ε.
    o.epsilon = s.diameter > 0 ? std::pow(kAutoFraction * s.diameter, o.p) : 1.0;
  } else {
    o.epsilon = params.real(key);
  }
  s.error = checkSinkhornOptions(o);
  if (!s.error.empty()) s.error = group + ": " + s.error;
  return s;
}

ParamSet freezeEntropic(const std::string& group, const Cloud& a, const Cloud& b, const ParamSet& resolved) {
  ParamSet out = resolved;
  const EntropicSettings s = readEntropicSettings(group, resolved, a, b);
  if (s.automatic) out.setNumber(group + ".epsilon", s.options.epsilon);
  return out;
}

nlohmann::json entropicDetails(const EntropicSettings& s) {
  const SinkhornOptions& o = s.options;
  nlohmann::json d;
  d["epsilon"] = o.epsilon;
  d["epsilon_rule"] = s.automatic ? "auto: (D/20)^p" : "set";
  d["joint_diameter"] = s.diameter;
  if (s.diameter > 0) d["epsilon_relative"] = o.epsilon / std::pow(s.diameter, o.p);  // ε / D^p
  d["p"] = o.p;
  d["tolerance"] = o.tolerance;
  d["convention"] = "min <P,C> + eps*KL(P|a x b)";
  return d;
}

void addSolveDetails(nlohmann::json& d, const std::string& prefix, const SinkhornResult& r) {
  d[prefix + "iterations"] = r.iterations;
  d[prefix + "marginal_error"] = r.marginalError;
  d[prefix + "epsilon_steps"] = r.stages;
  d[prefix + "warm_start"] = r.warmStarted;
  d[prefix + "coarse_points"] = r.coarsePoints;  // 0: no coarse-to-fine start (sinkhorn_coarse.h)
  d[prefix + "coarse_iterations"] = r.coarseIterations;
  d[prefix + "truncated"] = r.truncated;  // truncated kernel (sinkhorn_truncated.h)
  if (r.truncated) {
    d[prefix + "kept_pairs"] = r.keptPairs;
    d[prefix + "neglected_mass_bound"] = r.neglectedBound;  // full plan's mass on dropped pairs, at most
    d[prefix + "full_check"] = r.fullCheck;  // final marginals and value measured on all pairs
  }
}

bool entropicBrackets(const EntropicSettings& s, const Cloud& a, const Cloud& b) {
  const auto positive = [](const Cloud& c) { return (c.weights.array() > 0).count(); };
  return std::max(positive(a), positive(b)) > s.exactLimit;
}

Result EntropicMeasure::evaluate(const Cloud& a, const Cloud& b, const EvalContext& ctx) const {
  const EntropicSettings s = readEntropicSettings("entropic", ctx.params, a, b);
  if (!s.error.empty()) return Result::invalid(s.error);
  if (entropicBrackets(s, a, b)) {
    kernel::RowWorkers team(ctx.threads());
    const EntropicBracket e = bracketEntropicShared(a, b, false, s.options, s.representatives, ctx.control, team);
    if (e.cancelled) return Result::cancelled();
    if (!e.usable) {
      Result r;
      r.status = Status::NotConverged;
      r.message = "bracket: " + e.message;
      return r;
    }
    Result r = Result::bracketed(e.low, e.high);
    r.iterations = e.quantised.iterations;
    r.details = entropicDetails(s);
    addBracketDetails(r.details, "", e);
    r.details["value_is"] = "midpoint of [low, high]";
    r.details["width"] = e.high - e.low;
    r.details["value_accuracy"] = 0.5 * (e.high - e.low);
    return r;
  }
  const SinkhornOptions& o = s.options;
  const Eigen::VectorXd wa = a.normalizedWeights(), wb = b.normalizedWeights();

  SinkhornStart start;
  Eigen::VectorXd f0, g0;
  const EntropicWarm* previous = nullptr;
  if (ctx.warm && *ctx.warm) {
    if (auto* w = dynamic_cast<EntropicWarm*>(ctx.warm->get()); w && w->p == o.p && w->epsilon == o.epsilon) {
      startFromPath(w->before ? &*w->before : nullptr, w->last, a.points, b.points, o.p, f0, g0);
      start.f = &f0;
      start.g = &g0;
      previous = w;
    }
  }
  kernel::RowWorkers team(ctx.threads());
  // Through the shared store: `sinkhorn` on the same clouds and settings needs this very solve.
  bool reused = false;
  SinkhornResult sr =
      SinkhornCache::shared().solve(a.points, wa, b.points, wb, o, ctx.control, &start, &team, &reused);
  if (sr.status == SinkhornStatus::InvalidInput) return Result::invalid("entropic: " + sr.message);

  Result r;
  r.status = sr.status == SinkhornStatus::Converged       ? Status::Ok
             : sr.status == SinkhornStatus::MaxIterations ? Status::NotConverged
                                                          : Status::Cancelled;
  r.value = sr.value;
  r.message = sr.message;
  r.iterations = reused ? 0 : sr.iterations;  // run by this call, as for `sinkhorn`
  r.details = entropicDetails(s);
  addSolveDetails(r.details, "", sr);
  r.details["reused"] = reused;  // the solve was found in the shared store (sinkhorn_cache.h)
  // An estimate of the value's absolute accuracy: marginal error × the largest cost [CP].
  r.details["value_accuracy"] = sr.marginalError * s.costBound;
  if (r.status == Status::Cancelled) return r;

  if (ctx.wantPlan) {
    EntropicPlan plan = entropicPlan(a.points, wa, b.points, wb, sr.f, sr.g, o.epsilon, o.p, 200000, 1e-12, &team);
    r.plan = std::move(plan.entries);
    r.details["plan_entries"] = r.plan.size();
    r.details["plan_mass_shown"] = plan.keptMass;
    r.details["plan_truncated"] = plan.truncated;
  }
  if (ctx.warm) {
    auto w = std::make_shared<EntropicWarm>();
    if (previous && previous->last.x.rows() == a.size() && previous->last.y.rows() == b.size())
      w->before = previous->last;
    w->last = {a.points, b.points, sr.f, sr.g};
    w->epsilon = o.epsilon;
    w->p = o.p;
    *ctx.warm = w;
  }
  r.u = std::move(sr.f);
  r.v = std::move(sr.g);
  return r;
}

std::optional<Eigen::MatrixX2d> EntropicMeasure::gradientA(const Cloud& a, const Cloud& b,
                                                           const EvalContext& ctx, const Result& r) const {
  const EntropicSettings s = readEntropicSettings("entropic", ctx.params, a, b);
  // A bracket carries no potentials of the full problem (and solving it is what it avoids).
  if (!s.error.empty() || !r.usable() || r.status == Status::Bracketed) return std::nullopt;
  const Eigen::VectorXd wa = a.normalizedWeights(), wb = b.normalizedWeights();
  kernel::RowWorkers team(ctx.threads());
  // Re-solve from r's potentials: one pass confirms them (or finishes them if r stopped short
  // of the tolerance), so the gradient always belongs to a solved problem.
  SinkhornStart start{&r.u, &r.v};
  bool reused = false;
  SinkhornResult sr =
      SinkhornCache::shared().solve(a.points, wa, b.points, wb, s.options, ctx.control, &start, &team, &reused);
  if (reused && sr.status != SinkhornStatus::Converged)  // a kept cold solve that ran out: go on from r
    sr = solveSinkhorn(a.points, wa, b.points, wb, s.options, ctx.control, &start, &team);
  if (!sr.usable()) return std::nullopt;
  return entropicGradient(a.points, wa, b.points, wb, sr.f, sr.g, s.options.epsilon, s.options.p, &team);
}

}  // namespace barrow
