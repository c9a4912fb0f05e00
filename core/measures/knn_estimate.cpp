// The k-nearest-neighbour estimator (declared in density_estimates.h).
#include <sstream>

#include "density/knn_kl.h"
#include "measures/density_estimates.h"

namespace barrow {

Result knnEstimate(const Cloud& a, const Cloud& b, DivergenceKind kind, const DensitySettings& s,
                   const EvalContext& ctx) {
  if (!isKl(kind))
    return Result::invalid(std::string(divergenceLabel(kind)) +
                           ": the kNN estimator applies to KL only (Wang, Kulkarni, Verdu 2009); "
                           "use density.estimator=hist or kde for js, tv and hellinger");
  const bool ab = kind == DivergenceKind::KlAB;
  const std::string nameP = ab ? "A" : "B", nameQ = ab ? "B" : "A";
  std::string why;
  const auto p = uniformSample(ab ? a : b, nameP, &why);
  if (!p) return Result::invalid(why);
  const auto q = uniformSample(ab ? b : a, nameQ, &why);
  if (!q) return Result::invalid(why);
  if (p->rows() < s.k + 1 || q->rows() < s.k) {
    std::ostringstream m;
    m << "kNN with k = " << s.k << " needs at least " << s.k + 1 << " points in " << nameP << " and " << s.k
      << " in " << nameQ << " (they have " << p->rows() << " and " << q->rows() << "); lower density.k";
    return Result::invalid(m.str());
  }
  const KnnKl est = knnKl(*p, *q, s.k, nameP, nameQ, ctx.control);
  if (est.cancelled) return Result::cancelled();
  if (!est.error.empty()) return Result::invalid(est.error);

  Result r = Result::ok(est.value);
  r.details = {{"estimator", "knn"},
               {"k", s.k},
               {"n", p->rows()},
               {"m", q->rows()},
               {"formula", "(2/n) sum ln(nu_k/rho_k) + ln(m/(n-1)) (Wang, Kulkarni, Verdu 2009)"},
               {"tie_rule", "coincident points are not neighbours: rho_k, nu_k are k-th positive distances"},
               {"ties_rho", est.tiesRho},
               {"ties_nu", est.tiesNu}};
  if (est.tiesRho + est.tiesNu > 0) {
    std::ostringstream m;
    m << est.tiesRho << " points of " << nameP << " coincide with another point of " << nameP << " and "
      << est.tiesNu << " with a point of " << nameQ
      << "; those zero distances were skipped (the estimator assumes no ties)";
    r.message = m.str();
  }
  return r;
}

}  // namespace barrow
