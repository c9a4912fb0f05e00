#include "measures/hausdorff_measure.h"

#include <algorithm>

#include "kernel/support_points.h"
#include "measures/measure_outcome.h"
#include "spatial/nn_batch.h"

namespace barrow {

namespace {

// The largest nearest-neighbour distance and the query that attains it (first on ties).
std::pair<double, Eigen::Index> farthest(const NearestBatch& nb) {
  const auto it = std::max_element(nb.distance.begin(), nb.distance.end());
  return {*it, Eigen::Index(it - nb.distance.begin())};
}

}  // namespace

Result HausdorffMeasure::evaluate(const Cloud& a, const Cloud& b, const EvalContext& ctx) const {
  const SupportPoints sa = supportOf(a), sb = supportOf(b);
  const MutualNearest nn = mutualNearest(sa.points, sb.points, WorkSlice{ctx.control});
  if (!nn.complete) return Result::cancelled(id() + ": cancelled");
  const auto [hab, i] = farthest(nn.ab);
  const auto [hba, j] = farthest(nn.ba);
  Result r = Result::ok(std::max(hab, hba));
  r.details["directed_a_to_b"] = hab;
  r.details["directed_b_to_a"] = hba;
  r.details["attained_at"] = hab >= hba ? nlohmann::json{{"a_row", sa.rows[std::size_t(i)]}}
                                        : nlohmann::json{{"b_row", sb.rows[std::size_t(j)]}};
  r.details["weights"] = "ignored; points of zero weight left out";
  return finiteOrInvalid(std::move(r), id());
}

std::optional<Eigen::MatrixX2d> HausdorffMeasure::gradientA(const Cloud& a, const Cloud& b, const EvalContext& ctx,
                                                            const Result& r) const {
  if (r.status != Status::Ok || !(r.value > 0)) return std::nullopt;
  const SupportPoints sa = supportOf(a), sb = supportOf(b);
  const MutualNearest nn = mutualNearest(sa.points, sb.points, WorkSlice{ctx.control});
  if (!nn.complete) return std::nullopt;
  const auto [hab, i] = farthest(nn.ab);
  const auto [hba, j] = farthest(nn.ba);
  // The attaining pair (x_ia, y_jb): A->B moves with x_i's nearest y, B->A with y_j's nearest x.
  const Eigen::Index ia = hab >= hba ? i : nn.ba.index[std::size_t(j)];
  const Eigen::Index jb = hab >= hba ? nn.ab.index[std::size_t(i)] : j;
  Eigen::MatrixX2d g = Eigen::MatrixX2d::Zero(sa.size(), 2);
  g.row(ia) = (sa.points.row(ia) - sb.points.row(jb)) / r.value;
  return toCloudRows(sa, a.size(), g);
}

}  // namespace barrow
