#include "uncertainty/frozen_measure.h"

#include <exception>

#include "measures/evaluate.h"

namespace barrow {

FrozenMeasure::FrozenMeasure(const Measure& m, const ParamSet& user, const Cloud& a, const Cloud& b) : m_(&m) {
  const ParamSet resolved = resolveParams(m, user, &error_);
  if (!error_.empty()) return;
  try {
    frozen_ = m.freeze(a, b, resolved);
  } catch (const std::exception& e) {
    error_ = m.id() + ": freezing the settings on the original clouds failed: " + e.what();
  }
}

Result FrozenMeasure::evaluate(const Cloud& a, const Cloud& b, const RunControl* control) const {
  if (!error_.empty()) return Result::invalid(error_);
  EvalRequest req;
  req.params = frozen_;
  req.control = control;
  return evaluateMeasure(*m_, a, b, req);
}

}  // namespace barrow
