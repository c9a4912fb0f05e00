#include "critic_check/exact_reference.h"

#include "measures/evaluate.h"
#include "measures/wasserstein_measure.h"
#include "transport/kr_potential.h"

namespace barrow::critic {

ExactReference exactReference(const Cloud& a, const Cloud& b, const RunControl* control) {
  ExactReference ref;
  EvalRequest req;
  req.control = control;
  const Result r = evaluateMeasure(WassersteinMeasure(1), a, b, req);
  ref.status = r.status;
  ref.message = r.message;
  if (r.status != Status::Ok || r.v.size() != b.size()) {
    if (ref.status == Status::Ok) {
      ref.status = Status::InvalidInput;
      ref.message = "the exact solver gave no potentials";
    }
    return ref;
  }
  ref.w1 = r.value;
  ref.v = r.v;
  ref.phiA.resize(a.size());
  ref.phiB.resize(b.size());
  for (Eigen::Index i = 0; i < a.size(); ++i) ref.phiA[i] = krPotential(b, r.v, a.point(i));
  for (Eigen::Index j = 0; j < b.size(); ++j) ref.phiB[j] = krPotential(b, r.v, b.point(j));
  return ref;
}

}  // namespace barrow::critic
