// The histogram estimator (declared in density_estimates.h).
#include <cmath>
#include <sstream>

#include "density/discrete_divergence.h"
#include "density/histogram_grid.h"
#include "density/pooled_stats.h"
#include "measures/density_estimates.h"

namespace barrow {

Result histogramEstimate(const Cloud& a, const Cloud& b, DivergenceKind kind, const DensitySettings& s,
                         const EvalContext& ctx) {
  if (ctx.shouldStop(0.0)) return Result::cancelled();
  HistogramGrid grid;
  nlohmann::json d = {{"estimator", "hist"}};
  std::optional<PooledStats> stats;
  if (!s.bin || !s.origin) stats = pooledStats(a, b);
  grid.bin = s.bin ? *s.bin : autoBinWidth(*stats);
  d["bin"] = grid.bin;
  if (s.bin) {
    d["bin_rule"] = "given";
  } else {
    std::ostringstream rule;
    rule.precision(6);
    rule << "auto: Scott's bivariate rule 3.504*sigma*N^(-1/4) on the pooled sample, sigma = rms of the"
         << " per-axis sds = " << std::sqrt(0.5 * stats->sd.squaredNorm()) << ", N = " << stats->effectiveSize;
    d["bin_rule"] = rule.str();
  }
  grid.origin = s.origin ? *s.origin : autoOrigin(*stats, grid.bin);
  d["origin"] = {grid.origin.x(), grid.origin.y()};
  d["origin_rule"] = s.origin ? "given" : "auto: the pooled minimum per axis";

  const BinnedMasses bins = binMasses(a, b, grid);
  if (!bins.error.empty()) return Result::invalid(bins.error);
  d["bins_a"] = bins.binsA;
  d["bins_b"] = bins.binsB;
  d["bins_occupied"] = bins.p.size();
  d["grid_span"] = {bins.hiX - bins.loX + 1, bins.hiY - bins.loY + 1};

  Result r = Result::ok(discreteDivergence(kind, bins.p, bins.q));
  if (isKl(kind)) {
    const bool ab = kind == DivergenceKind::KlAB;
    const DiscreteKl kl = ab ? discreteKl(bins.p, bins.q) : discreteKl(bins.q, bins.p);
    d["empty_bins"] = kl.emptyCells;
    d["unmatched_mass"] = kl.unmatchedMass;
    if (kl.emptyCells > 0) {
      std::ostringstream m;
      m.precision(4);
      m << divergenceLabel(kind) << " = +inf: " << kl.emptyCells << " of the " << (ab ? bins.binsA : bins.binsB)
        << " bins holding mass of " << (ab ? "A" : "B") << " hold no mass of " << (ab ? "B" : "A") << " ("
        << kl.unmatchedMass << " of " << (ab ? "A" : "B") << "'s mass lies there; bin " << grid.bin << ")";
      r.message = m.str();
    }
  }
  r.details = std::move(d);
  return r;
}

}  // namespace barrow
