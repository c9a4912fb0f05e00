// The details of a result as short readable "key=value" items, for people: the text output
// of `barrow-cli measure` and the details pane of the window (JSON keeps them whole).
#pragma once

#include <nlohmann/json.hpp>
#include <string>
#include <vector>

namespace barrow {

/// "key=value" items: nested objects as dotted keys, numbers to 6 significant digits,
/// arrays comma-joined.
std::vector<std::string> detailItems(const nlohmann::json& details);

/// detailItems packed into lines of at most `width` characters, "; " between items (an item
/// longer than that gets a line of its own).
std::vector<std::string> detailLines(const nlohmann::json& details, std::size_t width = 100);

}  // namespace barrow
