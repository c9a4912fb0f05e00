// The Gaussian KDE estimator (declared in density_estimates.h).
#include <sstream>

#include "density/kde_integral.h"
#include "density/kde_pair.h"
#include "density/kde_tv_rows.h"
#include "density/pooled_stats.h"
#include "measures/density_estimates.h"

namespace barrow {

namespace {

// Error estimates above this share of the value (plus a small absolute part) mean the node
// budget forced a grid too coarse for the bandwidth: the number is reported as not converged.
constexpr double kRelativeTolerance = 1e-2;
constexpr double kAbsoluteTolerance = 1e-6;

// Extent of the points of positive weight of both clouds, per axis.
Eigen::Vector2d pooledSpan(const Cloud& a, const Cloud& b) {
  const PooledStats s = pooledStats(a, b);
  return s.max - s.min;
}

}  // namespace

Result kdeEstimate(const Cloud& a, const Cloud& b, DivergenceKind kind, const DensitySettings& s,
                   const EvalContext& ctx) {
  nlohmann::json d = {{"estimator", "kde"}};
  Bandwidth bw;
  if (s.bandwidth) {
    bw.s = *s.bandwidth;
    bw.rule = "given";
  } else {
    bw = ruleBandwidth(pooledStats(a, b), s.rule);
  }
  d["bandwidth"] = {bw.s.x(), bw.s.y()};
  d["bandwidth_rule"] = bw.rule;
  if (!bw.note.empty()) d["bandwidth_note"] = bw.note;

  const KdeGridOptions opt;
  // Below a hundredth of a node per bandwidth the grid cannot see the kernels at all.
  const Eigen::Vector2d span = pooledSpan(a, b);
  const double needed = (span.x() / bw.s.x() + 2 * opt.margin) * (span.y() / bw.s.y() + 2 * opt.margin);
  if (!(needed * 1e-4 <= double(opt.maxCells))) {
    std::ostringstream m;
    m.precision(3);
    m << "density.bandwidth (" << bw.s.x() << ", " << bw.s.y() << ") is too small for clouds spanning ("
      << span.x() << ", " << span.y() << "): within its budget of " << opt.maxCells
      << " nodes the integration grid would get fewer than 0.01 nodes per bandwidth";
    return Result::invalid(m.str());
  }
  // TV integrates the exact KDEs row by row (kde_tv_rows.h) and needs no node grid; the other
  // divergences integrate on the grid of both densities.
  KdePairGrid pair;
  KdeIntegral in;
  KdeTvStats tv;
  bool cancelled = false;
  if (kind == DivergenceKind::Tv) {
    in = kdeTotalVariation(a, b, bw.s, opt.window, ctx.control, &cancelled, &tv);
  } else {
    const ExactLogs exact{kind == DivergenceKind::KlBA, kind == DivergenceKind::KlAB};
    pair = evaluateKdePair(a, b, bw.s, opt, exact, ctx.control);
    cancelled = pair.cancelled;
    if (!cancelled) in = integrateKdeDivergence(pair, kind);
  }
  if (cancelled) {
    Result r = Result::cancelled();
    r.details = std::move(d);
    return r;
  }
  const KdeGrid& g = pair.grid;
  if (kind == DivergenceKind::Tv) {
    d["integration"] = "x exact between the crossings of f_A and f_B (Newton-refined), y by adaptive "
                       "Gauss-Kronrod 7/15; error estimate = sum |K15 - G7| over the panels + outside-mass "
                       "tail (an estimate)";
    d["tv_panels"] = tv.panels;
    d["tv_rows"] = tv.rows;
    d["tv_hidden_crossing_pairs"] = tv.hiddenPairs;
    d["nodes_per_bandwidth"] = tv.nodesPerBandwidth;
    if (tv.panelLimitHit) d["tv_panel_limit_hit"] = true;
  } else {
    d["grid_size"] = {g.x.count, g.y.count};
    d["grid_step"] = {g.x.step, g.y.step};
    d["grid_origin"] = {g.x.start, g.y.start};
    d["nodes_per_bandwidth"] = g.nodesPerBandwidth;
    d["integration"] = "rectangle rule on the grid nodes; error estimate (not a bound) = |I(h) - I(2h)| + "
                       "outside-mass tail";
    d["exact_nodes"] = pair.exactNodes;
  }
  d["error_estimate"] = in.errorEstimate;
  d["coarse_value"] = in.coarseValue;
  d["mass_on_grid"] = {in.massA, in.massB};

  Result r = Result::ok(in.value);
  std::string note = bw.note;
  if (in.errorEstimate > kAbsoluteTolerance + kRelativeTolerance * std::abs(in.value)) {
    r.status = Status::NotConverged;
    std::ostringstream m;
    m.precision(3);
    m << "integration error estimate " << in.errorEstimate << " is large: ";
    if (kind == DivergenceKind::Tv)
      m << "the row integration stopped at its budget of " << tv.panels << " panels";
    else
      m << "the grid (" << g.x.count << " x " << g.y.count << " nodes, " << g.nodesPerBandwidth
        << " per bandwidth) is too coarse";
    m << " for bandwidth (" << bw.s.x() << ", " << bw.s.y() << ") over this extent; use a larger density.bandwidth";
    note = note.empty() ? m.str() : m.str() + "; " + note;
  }
  r.message = note;
  r.details = std::move(d);
  return r;
}

}  // namespace barrow
