#include "measures/density_measures.h"

#include "density/density_settings.h"
#include "measures/density_estimates.h"

namespace barrow {

std::vector<ParamSpec> densityParamSpecs() {
  using namespace density_key;
  return {
      {.key = kEstimator,
       .kind = ParamKind::Choice,
       .defaultValue = "hist",
       .choices = {"hist", "kde", "knn"},
       .unit = "",
       .help = "density estimator: hist (fixed grid), kde (Gaussian), knn (KL only, unweighted). The "
               "automatic rules below use the pooled sample: the 50/50 mixture of the two normalised "
               "clouds (point i of A weighs a_i/2, point j of B b_j/2; zero weights left out), its "
               "per-axis weighted sd with ddof = 0 (population form), and its effective size "
               "N = 1/sum w^2 (Kish; uniform n + m points give 4nm/(n+m), e.g. 50 + 20 -> 57.14)"},
      {.key = kBin,
       .defaultValue = "auto",
       .min = 0,
       .minExclusive = true,
       .choices = {"auto"},
       .unit = "coordinate units",
       .help = "hist: square bin width, or auto = 3.504*sigma*N^(-1/4) (Scott's bivariate rule), "
               "sigma = sqrt((sd_x^2 + sd_y^2)/2) of the pooled sample; 1 when every point coincides"},
      {.key = kOrigin,
       .kind = ParamKind::RealPair,
       .defaultValue = "auto",
       .choices = {"auto"},
       .unit = "coordinate units",
       .help = "hist: x,y of a grid corner (edges at origin + k*bin), or auto = the pooled minimum "
               "per axis (the lowest bin's lower edge passes through the lowest point)"},
      {.key = kBandwidth,
       .kind = ParamKind::RealPair,
       .defaultValue = "scott",
       .min = 0,
       .minExclusive = true,
       .choices = {"scott", "silverman"},
       .unit = "coordinate units",
       .help = "kde: s or sx,sy, or a rule per axis on the pooled sample: scott s = sd*N^(-1/6); "
               "silverman s = min(sd, IQR/1.349)*N^(-1/6) (sd where IQR = 0), IQR = Q(0.75) - Q(0.25) "
               "with the linear-interpolation quantile (numpy.quantile's default for equal weights; "
               "weighted: the k-th sorted value sits at the centre of its share of the cumulative "
               "weight, rescaled so the first is at 0 and the last at 1); an axis below 0.1 x the "
               "other is raised to it; 1 when every point coincides"},
      {.key = kK,
       .kind = ParamKind::Integer,
       .defaultValue = "5",
       .min = 1,
       .max = 1000,
       .choices = {},
       .unit = "neighbours",
       .help = "knn: neighbour rank k (5: lower variance than 1 at a few hundred points). KL only; "
               "each cloud's positive weights must be equal (relative spread <= 1e-9), otherwise the "
               "result is invalid input (zero-weight points are dropped); coincident points are not "
               "neighbours (rho_k, nu_k are the k-th positive distances, the skipped ties counted in "
               "the details); needs k+1 points in the first cloud and k in the second"},
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

std::string DensityMeasure::unit(const ParamSet&) const {
  switch (kind_) {
    case DivergenceKind::Tv: return kUnitProbability;
    case DivergenceKind::Hellinger: return kUnitDimensionless;
    default: return kUnitNats;
  }
}

std::string DensityMeasure::unitRule() const {
  switch (kind_) {
    case DivergenceKind::Tv:
      return "probability: half the L1 distance of two probability laws, the largest difference of the "
             "masses they give one set (in [0, 1])";
    case DivergenceKind::Hellinger:
      return "dimensionless: sqrt of an integral of (sqrt p - sqrt q)^2, in which the densities' "
             "length^-2 cancels against the area (in [0, 1])";
    default:
      return "nats: natural logarithms of ratios of densities (their length^-2 cancels); divide by ln 2 "
             "for bits";
  }
}

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
