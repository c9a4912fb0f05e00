#include "io/findings_json.h"

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

namespace barrow {

std::string formatFindingsJson(const std::vector<Finding>& findings) { return findingsToJson(findings).dump() + "\n"; }

namespace {

struct FieldError {
  std::string field;
  std::string reason;
};

const nlohmann::json& member(const nlohmann::json& obj, const std::string& key, const std::string& path) {
  if (!obj.is_object() || !obj.contains(key)) throw FieldError{path + key, "missing"};
  return obj[key];
}

double numberOrNull(const nlohmann::json& v, const std::string& path, double ifNull) {
  if (v.is_null()) return ifNull;
  if (!v.is_number()) throw FieldError{path, "expected a number or null"};
  return v.get<double>();
}

bool flag(const nlohmann::json& v, const std::string& path) {
  if (!v.is_boolean()) throw FieldError{path, "expected true or false"};
  return v.get<bool>();
}

// A null size is a jump to +∞ ("to": "inf") or from +∞ ("from": "inf", size −∞).
std::vector<Jump> jumpList(const nlohmann::json& jumps, const std::string& path) {
  if (!jumps.is_array()) throw FieldError{path, "expected an array"};
  std::vector<Jump> out;
  for (std::size_t j = 0; j < jumps.size(); ++j) {
    const std::string jat = path + "[" + std::to_string(j) + "].";
    Jump jump;
    jump.theta = numberOrNull(member(jumps[j], "theta", jat), jat + "theta", NAN);
    const bool fromInf = jumps[j].is_object() && jumps[j].contains("from");
    jump.size = numberOrNull(member(jumps[j], "size", jat), jat + "size", fromInf ? -INFINITY : INFINITY);
    out.push_back(jump);
  }
  return out;
}

}  // namespace

Loaded<std::vector<Finding>> parseFindingsJson(const std::string& text, const std::string& file) {
  const nlohmann::json doc = nlohmann::json::parse(text, nullptr, false);
  if (doc.is_discarded()) return Loaded<std::vector<Finding>>::fail({file, 0, "", "not valid JSON"});
  try {
    const nlohmann::json& list = member(doc, "findings", "");
    if (!list.is_array()) throw FieldError{"findings", "expected an array"};
    std::vector<Finding> out;
    for (std::size_t k = 0; k < list.size(); ++k) {
      const std::string at = "findings[" + std::to_string(k) + "].";
      const nlohmann::json& row = list[k];
      Finding f;
      const nlohmann::json& id = member(row, "id", at);
      if (!id.is_string()) throw FieldError{at + "id", "expected a string"};
      f.id = id.get<std::string>();
      f.continuous = flag(member(row, "continuous", at), at + "continuous");
      f.jumps = jumpList(member(row, "jumps", at), at + "jumps");
      if (row.contains("unresolved")) f.unresolved = jumpList(row["unresolved"], at + "unresolved");
      const nlohmann::json& flat = member(row, "flat", at);
      if (!flat.is_array()) throw FieldError{at + "flat", "expected an array"};
      for (std::size_t j = 0; j < flat.size(); ++j) {
        const std::string fat = at + "flat[" + std::to_string(j) + "]";
        if (!flat[j].is_array() || flat[j].size() != 2) throw FieldError{fat, "expected [from, to]"};
        f.flat.emplace_back(numberOrNull(flat[j][0], fat, NAN), numberOrNull(flat[j][1], fat, NAN));
      }
      f.lipschitz = numberOrNull(member(row, "lipschitz", at), at + "lipschitz", NAN);
      f.monotone = flag(member(row, "monotone", at), at + "monotone");
      const nlohmann::json& summary = member(row, "summary", at);
      if (!summary.is_string()) throw FieldError{at + "summary", "expected a string"};
      f.summary = summary.get<std::string>();
      out.push_back(std::move(f));
    }
    return Loaded<std::vector<Finding>>::success(std::move(out));
  } catch (const FieldError& e) {
    return Loaded<std::vector<Finding>>::fail({file, 0, e.field, e.reason});
  }
}

}  // namespace barrow
