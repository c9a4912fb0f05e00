#include "measures/details_text.h"

#include "base/number_text.h"

namespace barrow {

namespace {

std::string scalarText(const nlohmann::json& v) {
  if (v.is_string()) return v.get<std::string>();
  if (v.is_boolean()) return v.get<bool>() ? "true" : "false";
  if (v.is_number_integer() || v.is_number_unsigned()) return v.dump();
  if (v.is_number_float()) return sixDigits(v.get<double>());
  if (v.is_null()) return "none";
  if (v.is_array()) {
    std::string s;
    for (const auto& e : v) s += (s.empty() ? "" : ",") + scalarText(e);
    return s;
  }
  return v.dump();
}

void flatten(const nlohmann::json& d, const std::string& prefix, std::vector<std::string>* items) {
  for (const auto& [k, v] : d.items()) {
    if (v.is_object()) flatten(v, prefix + k + ".", items);
    else items->push_back(prefix + k + "=" + scalarText(v));
  }
}

}  // namespace

std::vector<std::string> detailItems(const nlohmann::json& details) {
  std::vector<std::string> items;
  if (details.is_object()) flatten(details, "", &items);
  return items;
}

std::vector<std::string> detailLines(const nlohmann::json& details, std::size_t width) {
  std::vector<std::string> lines;
  std::string line;
  for (const auto& item : detailItems(details)) {
    if (!line.empty() && line.size() + 2 + item.size() > width) {
      lines.push_back(line);
      line.clear();
    }
    line += (line.empty() ? "" : "; ") + item;
  }
  if (!line.empty()) lines.push_back(line);
  return lines;
}

}  // namespace barrow
