// Findings as the JSON of the CLI contract:
//   {"findings":[{"id":"js","continuous":false,"jumps":[{"theta":0.13,"size":0.69}],
//     "unresolved":[],"flat":[[0.13,1.0]],"lipschitz":5.3,"monotone":true,"summary":"…"}]}
// A jump to or from +∞ has "size": null (JSON has no infinity) and "to": "inf" or
// "from": "inf"; a Lipschitz estimate that does not exist (every θ failed) is null.
// "unresolved" lists steps the jump test could not decide, in the jumps' shape.
// Keys keep the contract's order.
#pragma once

#include <nlohmann/json.hpp>
#include <string>
#include <vector>

#include "io/load_error.h"
#include "sweep/findings.h"

namespace barrow {

nlohmann::ordered_json findingsToJson(const std::vector<Finding>& findings);

/// The text both the CLI (`findings --json`) and the window's export write: one line of
/// compact JSON and a newline.
std::string formatFindingsJson(const std::vector<Finding>& findings);

/// Reads what formatFindingsJson writes. A null jump size reads back as +inf (a jump to or
/// from +∞), a null Lipschitz estimate as NaN. Errors name the file and the field.
Loaded<std::vector<Finding>> parseFindingsJson(const std::string& text, const std::string& file);

}  // namespace barrow
