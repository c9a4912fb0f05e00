#include "measures/chamfer_measure.h"

#include "kernel/support_points.h"
#include "measures/measure_outcome.h"
#include "spatial/nn_batch.h"

namespace barrow {

namespace {
constexpr const char* kSquared = "chamfer.squared";
}

std::vector<ParamSpec> ChamferMeasure::params() const {
  const ParamSpec squared{
      .key = kSquared,
      .kind = ParamKind::Boolean,
      .defaultValue = "false",
      .help = "true: use squared nearest-neighbour distances (value in squared coordinate units)"};
  return {squared};
}

std::string ChamferMeasure::unit(const ParamSet& resolved) const {
  return resolved.has(kSquared) && resolved.boolean(kSquared) ? lengthPower(2) : kUnitLength;
}

Result ChamferMeasure::evaluate(const Cloud& a, const Cloud& b, const EvalContext& ctx) const {
  const SupportPoints sa = supportOf(a), sb = supportOf(b);
  const bool squared = ctx.params.boolean(kSquared);
  const MutualNearest nn = mutualNearest(sa.points, sb.points, WorkSlice{ctx.control});
  if (!nn.complete) return Result::cancelled(id() + ": cancelled");
  auto term = [squared](double d) { return squared ? d * d : d; };
  double ab = 0.0, ba = 0.0;
  for (Eigen::Index i = 0; i < sa.size(); ++i) ab += sa.weights(i) * term(nn.ab.distance[std::size_t(i)]);
  for (Eigen::Index j = 0; j < sb.size(); ++j) ba += sb.weights(j) * term(nn.ba.distance[std::size_t(j)]);
  Result r = Result::ok(ab + ba);
  r.details["squared"] = squared;
  r.details["form"] = "weighted mean nearest-neighbour distance A->B plus B->A (normalised weights)";
  r.details["a_to_b"] = ab;
  r.details["b_to_a"] = ba;
  r.details["zero_weight_points"] = "left out (neither queried nor matched)";
  return finiteOrInvalid(std::move(r), id());
}

std::optional<Eigen::MatrixX2d> ChamferMeasure::gradientA(const Cloud& a, const Cloud& b, const EvalContext& ctx,
                                                          const Result& r) const {
  if (r.status != Status::Ok) return std::nullopt;
  const SupportPoints sa = supportOf(a), sb = supportOf(b);
  const bool squared = ctx.params.boolean(kSquared);
  const MutualNearest nn = mutualNearest(sa.points, sb.points, WorkSlice{ctx.control});
  if (!nn.complete) return std::nullopt;
  // Gradient in x of |x - y| (0 at x = y) or |x - y|^2.
  auto slope = [squared](const Eigen::RowVector2d& v, double d) -> Eigen::RowVector2d {
    if (squared) return 2.0 * v;
    return d > 0 ? Eigen::RowVector2d(v / d) : Eigen::RowVector2d::Zero();
  };
  Eigen::MatrixX2d g = Eigen::MatrixX2d::Zero(sa.size(), 2);
  for (Eigen::Index i = 0; i < sa.size(); ++i) {
    const Eigen::Index j = nn.ab.index[std::size_t(i)];
    g.row(i) += sa.weights(i) * slope(sa.points.row(i) - sb.points.row(j), nn.ab.distance[std::size_t(i)]);
  }
  for (Eigen::Index j = 0; j < sb.size(); ++j) {
    const Eigen::Index i = nn.ba.index[std::size_t(j)];
    g.row(i) += sb.weights(j) * slope(sa.points.row(i) - sb.points.row(j), nn.ba.distance[std::size_t(j)]);
  }
  return toCloudRows(sa, a.size(), g);
}

}  // namespace barrow
