// Findings as the JSON of the CLI contract:
//   {"findings":[{"id":"js","continuous":false,"jumps":[{"theta":0.13,"size":0.69}],
//     "flat":[[0.13,1.0]],"lipschitz":5.3,"monotone":true,"summary":"…"}]}
// A jump to or from +∞ has "size": null (JSON has no infinity); so has a Lipschitz estimate
// that does not exist (every θ failed). Keys keep the contract's order.
#pragma once

#include <nlohmann/json.hpp>
#include <vector>

#include "sweep/findings.h"

namespace barrow {

nlohmann::ordered_json findingsToJson(const std::vector<Finding>& findings);

}  // namespace barrow
