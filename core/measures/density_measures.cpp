#include "measures/density_measures.h"

#include "density/density_estimates.h"
#include "density/density_settings.h"

namespace barrow {

std::vector<ParamSpec> densityParamSpecs() {
  using namespace density_key;
  return {
      {.key = kEstimator,
       .kind = ParamKind::Choice,
       .defaultValue = "hist",
       .choices = {"hist", "kde", "knn"},
       .unit = "",
       .help = "density estimator: hist (fixed grid), kde (Gaussian), knn (KL only, unweighted)"},
      {.key = kBin,
       .defaultValue = "auto",
       .min = 0,
       .minExclusive = true,
       .choices = {"auto"},
       .unit = "coordinate units",
       .help = "hist: square bin width, or auto = 3.504*sigma*N^(-1/4) on the pooled sample"},
      {.key = kOrigin,
       .kind = ParamKind::RealPair,
       .defaultValue = "auto",
       .choices = {"auto"},
       .unit = "coordinate units",
       .help = "hist: x,y of a grid corner (edges at origin + k*bin), or auto = pooled minimum "
               "rounded down to a multiple of the bin"},
      {.key = kBandwidth,
       .kind = ParamKind::RealPair,
       .defaultValue = "scott",
       .min = 0,
       .minExclusive = true,
       .choices = {"scott", "silverman"},
       .unit = "coordinate units",
       .help = "kde: s or sx,sy, or a rule on the pooled sample: scott (sd*N^(-1/6)) or "
               "silverman (min(sd, IQR/1.349)*N^(-1/6))"},
      {.key = kK,
       .kind = ParamKind::Integer,
       .defaultValue = "5",
       .min = 1,
       .max = 1000,
       .choices = {},
       .unit = "neighbours",
       .help = "knn: neighbour rank k (5: lower variance than 1 at a few hundred points)"},
  };
}

namespace {

struct Naming {
  const char* id;
  const char* name;
  const char* formula;
};

const Naming& naming(DivergenceKind kind) {
  static const Naming table[] = {
      {"kl_ab", "KL(A||B)", "sum p ln(p/q), p from A, q from B (nats; +inf when q = 0 < p)"},
      {"kl_ba", "KL(B||A)", "sum q ln(q/p), p from A, q from B (nats; +inf when p = 0 < q)"},
      {"js", "Jensen-Shannon", "1/2 KL(p||m) + 1/2 KL(q||m), m = (p+q)/2 (nats, <= ln 2)"},
      {"tv", "Total variation", "1/2 sum |p - q| (in [0, 1])"},
      {"hellinger", "Hellinger", "sqrt(1/2 sum (sqrt p - sqrt q)^2) (in [0, 1])"},
  };
  return table[static_cast<int>(kind)];
}

}  // namespace

std::string DensityMeasure::id() const { return naming(kind_).id; }
std::string DensityMeasure::displayName() const { return naming(kind_).name; }
std::string DensityMeasure::formula() const { return naming(kind_).formula; }

Result DensityMeasure::evaluate(const Cloud& a, const Cloud& b, const EvalContext& ctx) const {
  const DensitySettings s = readDensitySettings(ctx.params);
  switch (s.estimator) {
    case DensityEstimator::Histogram: return histogramEstimate(a, b, kind_, s, ctx);
    case DensityEstimator::Kde: return kdeEstimate(a, b, kind_, s, ctx);
    case DensityEstimator::Knn: return knnEstimate(a, b, kind_, s, ctx);
  }
  return Result::invalid("density.estimator: unknown estimator");
}

ParamSet DensityMeasure::freeze(const Cloud& a, const Cloud& b, const ParamSet& resolved) const {
  return freezeDensitySettings(a, b, resolved);
}

}  // namespace barrow
