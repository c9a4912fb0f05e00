// The one entry point the CLI, the sweep engine and the GUI use to run a measure.
#pragma once

#include "measures/measure.h"

namespace barrow {

struct EvalRequest {
  ParamSet params;                           // user settings (any subset of keys)
  const RunControl* control = nullptr;
  std::shared_ptr<WarmState>* warm = nullptr;
  bool wantPlan = false;
};

/// Validates both clouds and the parameters, fills defaults, times the call, and turns any
/// exception into an invalid-input/internal message. Never throws.
Result evaluateMeasure(const Measure& m, const Cloud& a, const Cloud& b, const EvalRequest& req);

/// The resolved parameters for `m` (defaults filled); `error` gets the first invalid value.
ParamSet resolveParams(const Measure& m, const ParamSet& user, std::string* error);

}  // namespace barrow
