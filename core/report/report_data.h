// The machine-readable inside of a report: one JSON object with the keys of the contract
//   clouds   {"A": {...}, "B": {...}, "plan": {...}[, "interpolation_plan": [...]]}
//   settings the user's parameters, the sweep settings, frozen settings, title, date, version
//   measures the rows of `measure --json`
//   sweep    {"columns": [...], "rows": [[...]]} with the sweep CSV's columns and cells
//            (a number; "inf" where the CSV writes inf; null where it leaves the cell empty)
//   findings the list of `findings --json`
// and the escaping that lets it sit inside a <script> element.
#pragma once

#include <nlohmann/json.hpp>
#include <string>

#include "report/report_input.h"

namespace barrow {

nlohmann::ordered_json reportData(const ReportInput& in);

/// JSON text that cannot end the <script> element it sits in, nor be read as HTML: `<`, `>`,
/// `&`, U+2028 and U+2029 are written as \u escapes (they only occur inside strings, where
/// JSON.parse reads the escape back as the same character). Invalid UTF-8 becomes U+FFFD.
std::string scriptSafeJson(const nlohmann::ordered_json& j);

}  // namespace barrow
