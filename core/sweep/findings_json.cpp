#include "sweep/findings_json.h"

#include <cmath>

namespace barrow {

namespace {
nlohmann::ordered_json number(double v) { return std::isfinite(v) ? nlohmann::ordered_json(v) : nlohmann::ordered_json(); }
}  // namespace

nlohmann::ordered_json findingsToJson(const std::vector<Finding>& findings) {
  nlohmann::ordered_json list = nlohmann::ordered_json::array();
  for (const Finding& f : findings) {
    auto listOf = [](const std::vector<Jump>& from) {
      nlohmann::ordered_json list = nlohmann::ordered_json::array();
      for (const Jump& j : from) {
        nlohmann::ordered_json jump;
        jump["theta"] = j.theta;
        jump["size"] = number(j.size);  // null for a jump to or from +∞, direction below
        if (std::isinf(j.size)) jump[j.size > 0 ? "to" : "from"] = "inf";
        list.push_back(jump);
      }
      return list;
    };
    const nlohmann::ordered_json jumps = listOf(f.jumps);
    nlohmann::ordered_json flat = nlohmann::ordered_json::array();
    for (const auto& [lo, hi] : f.flat) flat.push_back({lo, hi});
    nlohmann::ordered_json row;  // keys in the contract's order
    row["id"] = f.id;
    row["continuous"] = f.continuous;
    row["jumps"] = jumps;
    row["unresolved"] = listOf(f.unresolved);
    row["flat"] = flat;
    row["lipschitz"] = number(f.lipschitz);
    row["monotone"] = f.monotone;
    row["summary"] = f.summary;
    list.push_back(row);
  }
  nlohmann::ordered_json out;
  out["findings"] = list;
  return out;
}

}  // namespace barrow
