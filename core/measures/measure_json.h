// One measure's result as the JSON row of `barrow-cli measure --json`:
//   {"id","name","value","unit","status","seconds","iterations","details"[,"low","high"][,"message"]}
// ("low"/"high" only with status "bracketed": the certified bounds, "value" a point between them)
// (the unit under the user's parameters `params`, e.g. "length^2" for entropic with p = 2).
// A non-finite value is null (JSON has no infinity); the status says why. Shared by the CLI
// and the report so both print the same row.
#pragma once

#include <nlohmann/json.hpp>

#include "measures/measure.h"

namespace barrow {

nlohmann::json measureRowJson(const Measure& m, const Result& r, const ParamSet& params);

}  // namespace barrow
