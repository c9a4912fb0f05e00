// The details of a result as short readable lines for the text output of `measure`
// (the JSON output keeps them whole).
#pragma once

#include <nlohmann/json.hpp>
#include <string>
#include <vector>

namespace barrow::cli {

/// "key=value" items (nested objects as dotted keys, numbers to 6 significant digits,
/// arrays of numbers comma-joined), packed into lines of at most `width` characters
/// (an item longer than that gets a line of its own).
std::vector<std::string> detailLines(const nlohmann::json& details, std::size_t width = 100);

}  // namespace barrow::cli
