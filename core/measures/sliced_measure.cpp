#include "measures/sliced_measure.h"

#include <atomic>
#include <cmath>
#include <mutex>

#include "base/row_workers.h"
#include "transport/ot_1d.h"
#include "measures/unit_scale.h"

namespace barrow {

namespace {

struct SlicedSettings {
  int directions = 64;
  int p = 2;
};

SlicedSettings readSettings(const ParamSet& params) {
  SlicedSettings s;
  if (params.has("sliced.directions")) s.directions = params.integer("sliced.directions");
  if (params.has("sliced.p")) s.p = params.integer("sliced.p");
  return s;
}

Eigen::Vector2d direction(int k, int count) {
  const double phi = (k + 0.5) * M_PI / count;
  return {std::cos(phi), std::sin(phi)};
}

// What one thread needs for one direction, kept from direction to direction: fresh buffers
// of 10^5 points per direction cost more in page faults and zero-filling than the sorts.
struct DirectionWorkspace {
  Ot1dSolver solver;
  Eigen::VectorXd pa, pb;             // the projections on the current direction
  std::vector<PlanEntry> coupling;    // gradientA only
  Eigen::VectorXd along;              // gradientA only
};

// Calls work(k, workspace, weightsA, weightsB) for every direction, with the projections on
// direction k in workspace.pa and .pb, spread over the cores in blocks between which the
// caller's thread polls `control`. Returns false when asked to stop.
// Each direction's value depends only on k, never on the thread that computed it.
template <class Work>
bool forEachDirection(const Cloud& a, const Cloud& b, int count, const RunControl* control, Work work) {
  const Eigen::VectorXd wa = a.normalizedWeights(), wb = b.normalizedWeights();
  const long long perDirection = a.size() + b.size();
  kernel::RowWorkers team(perDirection * count < 20000 ? 1 : threadBudget(control));
  // One workspace per chunk of a block: a block is split into team.threads() chunks, each run
  // once, and each chunk claims directions from a shared counter (a helper that wakes late
  // finds them taken, so a loaded machine costs no waiting).
  std::vector<DirectionWorkspace> spaces(std::size_t(team.threads()));
  const int block = std::max(team.threads() * 4, 16);
  for (int k0 = 0; k0 < count; k0 += block) {
    if (control && control->shouldStop(double(k0) / count)) return false;
    const int k1 = std::min(count, k0 + block);
    std::atomic<int> nextDirection{k0};
    team.run(team.threads(), 1, [&](int chunk, int) {
      DirectionWorkspace& ws = spaces[std::size_t(chunk)];
      for (int k = nextDirection++; k < k1; k = nextDirection++) {
        const Eigen::Vector2d t = direction(k, count);
        ws.pa.noalias() = a.points * t;
        ws.pb.noalias() = b.points * t;
        work(k, ws, wa, wb);
      }
    });
  }
  return true;
}

}  // namespace

std::vector<ParamSpec> SlicedMeasure::params() const {
  const ParamSpec k{
      .key = "sliced.directions",
      .kind = ParamKind::Integer,
      .defaultValue = "64",
      .min = 1,
      .max = 100000,
      .unit = "directions",
      .help = "number K of projection directions, at angles (k+1/2)pi/K in [0, pi)"};
  const ParamSpec p{
      .key = "sliced.p",
      .kind = ParamKind::Integer,
      .defaultValue = "2",
      .min = 1,
      .max = 2,
      .help = "2: sqrt of the mean W2^2 over directions; 1: the mean W1"};
  return {k, p};
}

Result SlicedMeasure::evaluate(const Cloud& a, const Cloud& b, const EvalContext& ctx) const {
  // All coordinates tiny or huge: evaluate at unit scale (measures/unit_scale.h); sliced W_p
  // is homogeneous of degree 1.
  if (auto r = evaluateAtUnitScale(*this, a, b, ctx))
    return *r;
  const SlicedSettings s = readSettings(ctx.params);
  std::vector<double> perDirection(s.directions);
  const bool done = forEachDirection(
      a, b, s.directions, ctx.control,
      [&](int k, DirectionWorkspace& ws, const Eigen::VectorXd& wa, const Eigen::VectorXd& wb) {
        perDirection[k] = ws.solver.solve(ws.pa.data(), wa.data(), int(ws.pa.size()), ws.pb.data(), wb.data(),
                                          int(ws.pb.size()), s.p);
      });
  if (!done) return Result::cancelled();
  double mean = 0.0;
  for (double v : perDirection) mean += v;  // in direction order: deterministic sum
  mean /= s.directions;
  Result r = Result::ok(s.p == 2 ? std::sqrt(mean) : mean);
  r.details = {{"directions", s.directions}, {"p", s.p}, {"angles", "(k+1/2)pi/K"}};
  return r;
}

std::optional<Eigen::MatrixX2d> SlicedMeasure::gradientA(const Cloud& a, const Cloud& b, const EvalContext& ctx,
                                                         const Result& r) const {
  const SlicedSettings s = readSettings(ctx.params);
  if (r.status != Status::Ok) return std::nullopt;
  Eigen::MatrixX2d grad = Eigen::MatrixX2d::Zero(a.size(), 2);
  if (s.p == 2 && !(r.value > 0)) return grad;
  std::mutex merge;
  const bool done = forEachDirection(
      a, b, s.directions, ctx.control,
      [&](int k, DirectionWorkspace& ws, const Eigen::VectorXd& wa, const Eigen::VectorXd& wb) {
        const Eigen::VectorXd &pa = ws.pa, &pb = ws.pb;
        ws.solver.solve(pa.data(), wa.data(), int(pa.size()), pb.data(), wb.data(), int(pb.size()), s.p, &ws.coupling);
        // Σ_j π_ij · ∂c/∂s_i along this direction, then times θ_k.
        ws.along.setZero(a.size());
        for (const PlanEntry& e : ws.coupling) {
          const double d = pa(e.i) - pb(e.j);
          ws.along(e.i) += e.mass * (s.p == 2 ? d : (d > 0) - (d < 0));
        }
        const Eigen::Vector2d t = direction(k, s.directions);
        std::lock_guard<std::mutex> lock(merge);
        grad.col(0) += ws.along * t(0);
        grad.col(1) += ws.along * t(1);
      });
  if (!done) return std::nullopt;
  // d/dx of (1/K)Σ W2² is (2/K)Σ..., and d sqrt(u) = du / (2 sqrt u): the 2s cancel.
  grad /= s.directions;
  if (s.p == 2) grad /= r.value;
  return grad;
}

}  // namespace barrow
