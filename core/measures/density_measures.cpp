#include "measures/density_measures.h"

#include "density/density_estimates.h"
#include "density/density_settings.h"

namespace barrow {

std::vector<ParamSpec> densityParamSpecs() {
  using namespace density_key;
  std::vector<ParamSpec> specs(5);
  specs[0].key = kEstimator;
  specs[0].kind = ParamKind::Choice;
  specs[0].defaultValue = "hist";
  specs[0].choices = {"hist", "kde", "knn"};
  specs[0].help = "density estimator: hist (fixed grid), kde (Gaussian), knn (KL only, unweighted)";

  specs[1].key = kBin;
  specs[1].defaultValue = "auto";
  specs[1].choices = {"auto"};
  specs[1].min = 0;
  specs[1].minExclusive = true;
  specs[1].unit = "coordinate units";
  specs[1].help = "hist: square bin width, or auto = 3.504*sigma*N^(-1/4) on the pooled sample";

  specs[2].key = kOrigin;
  specs[2].kind = ParamKind::RealPair;
  specs[2].defaultValue = "auto";
  specs[2].choices = {"auto"};
  specs[2].unit = "coordinate units";
  specs[2].help = "hist: x,y of a grid corner (edges at origin + k*bin), or auto = pooled minimum "
                  "rounded down to a multiple of the bin";

  specs[3].key = kBandwidth;
  specs[3].kind = ParamKind::RealPair;
  specs[3].defaultValue = "scott";
  specs[3].choices = {"scott", "silverman"};
  specs[3].min = 0;
  specs[3].minExclusive = true;
  specs[3].unit = "coordinate units";
  specs[3].help = "kde: s or sx,sy, or a rule on the pooled sample: scott (sd*N^(-1/6)) or "
                  "silverman (min(sd, IQR/1.349)*N^(-1/6))";

  specs[4].key = kK;
  specs[4].kind = ParamKind::Integer;
  specs[4].defaultValue = "5";
  specs[4].min = 1;
  specs[4].max = 1000;
  specs[4].unit = "neighbours";
  specs[4].help = "knn: neighbour rank k (5: lower variance than 1 at a few hundred points)";
  return specs;
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
