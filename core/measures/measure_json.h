// One measure's result as the JSON row of `barrow-cli measure --json`:
//   {"id","name","value","status","seconds","iterations","details"[,"message"]}
// A non-finite value is null (JSON has no infinity); the status says why. Shared by the CLI
// and the report so both print the same row.
#pragma once

#include <nlohmann/json.hpp>

#include "measures/measure.h"

namespace barrow {

nlohmann::json measureRowJson(const Measure& m, const Result& r);

}  // namespace barrow
