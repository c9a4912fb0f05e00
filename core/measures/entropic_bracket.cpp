#include "measures/entropic_bracket.h"

#include <algorithm>
#include <chrono>
#include <cmath>
#include <list>
#include <mutex>

#include "base/parallel_blocks.h"
#include "spatial/cloud_quantiser.h"
#include "transport/entropic_bounds.h"
#include "transport/sinkhorn_coarse.h"

namespace barrow {

namespace {

RunControl part(const RunControl* c, double lo, double hi) { return c ? c->sub(lo, hi) : RunControl{}; }

bool stopped(const RunControl* c) { return c && c->cancel && c->cancel->load(std::memory_order_relaxed); }

// p = 1: the lifted coupling's cost on block (r, s) is E|x − y| over x in cell r and y in cell
// s drawn independently, at most d_rs + Δ_rs with Δ_rs = min(m_r + m_s, sqrt(d_rs² + V_r + V_s)
// − d_rs) (triangle inequality; Jensen's inequality on E|x − y|² = d² + V_r + V_s) [D]. Priced
// on the rounded plan P' + E: Σ P'_rs Δ_rs over all blocks, plus δ · max Δ for E.
double jensenLiftW1(const Quantisation& qa, const Quantisation& qb, const EntropicRoundedBound& up, double epsilon,
                    const RunControl* control) {
  const Cloud& ra = qa.representatives;
  const Cloud& rb = qb.representatives;
  const Eigen::Index n = ra.size(), m = rb.size();
  const Eigen::VectorXd& f = up.rowPotential;
  const Eigen::VectorXd& g = up.colPotential;
  constexpr int kRows = 64;
  const int blocks = int((n + kRows - 1) / kRows);
  std::vector<double> part(std::size_t(blocks), 0.0);
  const bool done = runBlocks(blocks, [&](int k) {
    double sum = 0.0;
    for (Eigen::Index i = Eigen::Index(k) * kRows; i < std::min(n, Eigen::Index(k + 1) * kRows); ++i) {
      if (!(ra.weights(i) > 0)) continue;
      for (Eigen::Index j = 0; j < m; ++j) {
        if (!(rb.weights(j) > 0)) continue;
        const double d = (ra.points.row(i) - rb.points.row(j)).norm();
        const double mass = ra.weights(i) * rb.weights(j) * std::exp((f(i) + g(j) - d) / epsilon);
        if (mass == 0.0) continue;
        const double jensen = std::sqrt(d * d + qa.cellSquare(i) + qb.cellSquare(j)) - d;
        sum += mass * std::min(qa.cellDistance(i) + qb.cellDistance(j), jensen);
      }
    }
    part[std::size_t(k)] = sum;
  }, WorkSlice{control, 0.0, 1.0});
  if (!done) return NAN;
  double total = 0.0;
  for (double v : part) total += v;
  const double widest = qa.cellDistance.maxCoeff() + qb.cellDistance.maxCoeff();
  return total + up.deficit * widest;
}

EntropicBracket cancelledBracket() {
  EntropicBracket r;
  r.cancelled = true;
  r.message = "cancelled";
  return r;
}

}  // namespace

EntropicBracket bracketEntropic(const Cloud& a, const Cloud& b, bool self, const SinkhornOptions& o,
                                Eigen::Index representatives, const RunControl* control,
                                kernel::RowWorkers& workers) {
  const auto t0 = std::chrono::steady_clock::now();
  const Cloud& bb = self ? a : b;
  const RunControl qc = part(control, 0.0, 0.05);
  const Quantisation qa = quantiseCloud(a, representatives, control ? &qc : nullptr);
  if (qa.cancelled) return cancelledBracket();
  Quantisation qbOwn;
  if (!self) {
    qbOwn = quantiseCloud(b, representatives, control ? &qc : nullptr);
    if (qbOwn.cancelled) return cancelledBracket();
  }
  const Quantisation& qb = self ? qa : qbOwn;
  const Cloud& ra = qa.representatives;
  const Cloud& rb = qb.representatives;

  EntropicBracket r;
  r.representativesA = ra.size();
  r.representativesB = rb.size();
  r.errorA = o.p == 2 ? qa.cost2 : qa.cost1;
  r.errorB = o.p == 2 ? qb.cost2 : qb.cost1;
  r.lift = r.errorA + r.errorB;

  // The quantised problem, solved as any problem of that size would be.
  const RunControl sc = part(control, 0.05, 0.45);
  SinkhornResult s = self ? solveSinkhornSymmetric(ra.points, ra.weights, o, control ? &sc : nullptr, nullptr, &workers)
                          : solveSinkhorn(ra.points, ra.weights, rb.points, rb.weights, o, control ? &sc : nullptr,
                                          nullptr, &workers);
  if (s.status == SinkhornStatus::Cancelled) return cancelledBracket();
  if (s.status == SinkhornStatus::InvalidInput || !s.f.allFinite() || (!self && !s.g.allFinite())) {
    r.message = "the solve between the representatives failed: " + s.message;
    return r;
  }
  const Eigen::VectorXd& sf = s.f;
  const Eigen::VectorXd& sg = self ? s.f : s.g;
  r.quantisedValue = s.value;
  const std::atomic<bool>* stop = control ? control->cancel : nullptr;
  const EntropicRoundedBound up =
      entropicRoundedBound(ra.points, ra.weights, rb.points, rb.weights, sf, sg, o.epsilon, o.p, workers, stop);
  if (stopped(control)) return cancelledBracket();
  if (!up.complete) {
    r.message = "the rounded coupling's bound between the representatives is not finite";
    return r;
  }
  r.quantisedHigh = up.high;
  if (o.p == 1) {
    const RunControl jc = part(control, 0.45, 0.5);
    const double jensen = jensenLiftW1(qa, qb, up, o.epsilon, control ? &jc : nullptr);
    if (stopped(control)) return cancelledBracket();
    if (std::isfinite(jensen)) r.lift = std::min(r.lift, jensen);
  }
  r.high = up.high + r.lift;

  // Potentials on every point: c-transforms of the quantised ones; then one pass for low.
  if (control && control->shouldStop(0.5)) return cancelledBracket();
  const Eigen::VectorXd wa = a.normalizedWeights(), wb = bb.normalizedWeights();
  // Each point's own representative's potential is close to its carried one: the stabiliser.
  const auto nearOf = [](const Quantisation& q, const Eigen::VectorXd& v) {
    Eigen::VectorXd near(Eigen::Index(q.cellOf.size()));
    for (std::size_t i = 0; i < q.cellOf.size(); ++i)
      near(Eigen::Index(i)) = q.cellOf[i] >= 0 ? v(q.cellOf[i]) : NAN;
    return near;
  };
  const Eigen::VectorXd nearA = nearOf(qa, sf);
  const Eigen::VectorXd f =
      extendPotential(a.points, CoarseCloud{rb.points, rb.weights}, sg, o.epsilon, o.p, workers, stop, &nearA);
  if (stopped(control)) return cancelledBracket();
  const Eigen::VectorXd nearB = self ? nearA : nearOf(qb, sg);
  const Eigen::VectorXd g = self ? f
                                 : extendPotential(bb.points, CoarseCloud{ra.points, ra.weights}, sf, o.epsilon, o.p,
                                                   workers, stop, &nearB);
  if (stopped(control)) return cancelledBracket();
  if (!f.allFinite() || !g.allFinite()) {
    r.message = "the potentials carried to every point are not finite";
    return r;
  }
  if (control && control->shouldStop(0.55)) return cancelledBracket();
  const EntropicDualBound down = entropicDualBound(a.points, wa, bb.points, wb, f, g, o.epsilon, o.p, workers, stop);
  if (stopped(control)) return cancelledBracket();
  if (!down.complete) {
    r.message = "the dual bound on all points is not finite";
    return r;
  }
  r.low = std::min(down.low, r.high);  // equal only when both are at rounding level apart
  s.f.resize(0);
  s.g.resize(0);
  r.quantised = std::move(s);
  r.usable = true;
  r.seconds = std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count();
  if (control) control->shouldStop(1.0);  // the result is complete whatever the answer
  return r;
}

namespace {

bool sameCloud(const Cloud& x, const Cloud& y) {
  return x.points.rows() == y.points.rows() && x.weights.size() == y.weights.size() && x.points == y.points &&
         x.weights == y.weights;
}

struct Kept {
  Cloud a, b;  // b empty for a self term
  bool self = false;
  SinkhornOptions options;
  Eigen::Index representatives = 0;
  EntropicBracket result;
};

constexpr std::size_t kKept = 4;  // O(n + m) each: a sweep's A–B and both self terms fit

std::mutex keptMutex;
std::list<Kept> kept;  // most recent first

}  // namespace

void clearEntropicBrackets() {
  const std::lock_guard<std::mutex> lock(keptMutex);
  kept.clear();
}

EntropicBracket bracketEntropicShared(const Cloud& a, const Cloud& b, bool self, const SinkhornOptions& o,
                                      Eigen::Index representatives, const RunControl* control,
                                      kernel::RowWorkers& workers) {
  {
    const std::lock_guard<std::mutex> lock(keptMutex);
    for (auto it = kept.begin(); it != kept.end(); ++it)
      if (it->self == self && it->representatives == representatives && sameSinkhornOptions(it->options, o) &&
          sameCloud(it->a, a) && (self || sameCloud(it->b, b))) {
        kept.splice(kept.begin(), kept, it);
        return kept.front().result;
      }
  }
  EntropicBracket r = bracketEntropic(a, b, self, o, representatives, control, workers);
  if (r.usable) {
    const std::lock_guard<std::mutex> lock(keptMutex);
    kept.push_front(Kept{a, self ? Cloud{} : b, self, o, representatives, r});
    if (kept.size() > kKept) kept.pop_back();
  }
  return r;
}

void addBracketDetails(nlohmann::json& d, const std::string& prefix, const EntropicBracket& e) {
  d[prefix + "rule"] =
      "quantise each cloud (greedy k-d cells, representative at the cell mean), solve OT_eps between the "
      "representatives; high = a feasible coupling's objective (rounded quantised plan spread over the cells), "
      "low = the dual objective on all points at the quantised potentials carried to every point";
  d[prefix + "high_rule"] = "rounded-coupling bound between the representatives + lift (p = 2: eA^2 + eB^2; "
                            "p = 1: per block of cells min(mean distances, sqrt(d^2 + mean squares) - d), priced on "
                            "the rounded plan)";
  d[prefix + "low_rule"] = "weak duality: <a,f> + <b,g> at the carried f and g = its c-transform on all points "
                           "(one pass over all pairs)";
  d[prefix + "representatives_a"] = e.representativesA;
  d[prefix + "representatives_b"] = e.representativesB;
  d[prefix + "quantised_value"] = e.quantisedValue;
  d[prefix + "quantised_high"] = e.quantisedHigh;
  d[prefix + "lift"] = e.lift;
  d[prefix + "quantised_iterations"] = e.quantised.iterations;
  d[prefix + "quantised_marginal_error"] = e.quantised.marginalError;
  d[prefix + "bracket_seconds"] = e.seconds;
}

}  // namespace barrow
