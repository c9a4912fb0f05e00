#include "io/session_io.h"

#include <algorithm>
#include <climits>
#include <cmath>
#include <cstdint>

namespace barrow {

using nlohmann::json;

namespace {

json cloudToJson(const Cloud& c) {
  json pts = json::array();
  for (Eigen::Index i = 0; i < c.size(); ++i) pts.push_back({c.points(i, 0), c.points(i, 1)});
  json w = json::array();
  for (Eigen::Index i = 0; i < c.size(); ++i) w.push_back(c.weights(i));
  return {{"name", c.name}, {"points", pts}, {"weights", w}};
}

// Thrown inside the parser with the JSON path of the offending field.
struct FieldError {
  std::string field;
  std::string reason;
};

const json& need(const json& obj, const std::string& key, const std::string& path) {
  if (!obj.is_object() || !obj.contains(key)) throw FieldError{path + key, "missing"};
  return obj.at(key);
}

double number(const json& v, const std::string& path) {
  if (!v.is_number()) throw FieldError{path, "expected a number"};
  const double d = v.get<double>();
  if (!std::isfinite(d)) throw FieldError{path, "not a finite number"};
  return d;
}

// A whole number that fits an int (get<int>() would wrap 2^32 + 1 around to 1).
int wholeNumber(const json& v, const std::string& path) {
  if (!v.is_number_integer()) throw FieldError{path, "expected a whole number"};
  if (v.is_number_unsigned() ? v.get<std::uint64_t>() > std::uint64_t(INT_MAX)
                             : (v.get<std::int64_t>() > INT_MAX || v.get<std::int64_t>() < INT_MIN))
    throw FieldError{path, "whole number out of range"};
  return int(v.get<std::int64_t>());
}

Cloud cloudFromJson(const json& j, const std::string& path) {
  if (!j.is_object()) throw FieldError{path, "expected an object"};
  Cloud c;
  if (j.contains("name")) {
    if (!j["name"].is_string()) throw FieldError{path + ".name", "expected a string"};
    c.name = j["name"].get<std::string>();
  }
  const json& pts = need(j, "points", path + ".");
  if (!pts.is_array()) throw FieldError{path + ".points", "expected an array of [x, y]"};
  if (pts.empty()) throw FieldError{path + ".points", "the cloud is empty"};
  const auto n = Eigen::Index(pts.size());
  c.points.resize(n, 2);
  for (Eigen::Index i = 0; i < n; ++i) {
    const std::string p = path + ".points[" + std::to_string(i) + "]";
    const json& row = pts[std::size_t(i)];
    if (!row.is_array() || row.size() != 2) throw FieldError{p, "expected [x, y]"};
    c.points(i, 0) = number(row[0], p + "[0]");
    c.points(i, 1) = number(row[1], p + "[1]");
  }
  c.weights = Eigen::VectorXd::Constant(n, 1.0 / double(n));
  if (j.contains("weights")) {
    const json& w = j["weights"];
    if (!w.is_array() || Eigen::Index(w.size()) != n)
      throw FieldError{path + ".weights", "expected " + std::to_string(n) + " numbers, one per point"};
    for (Eigen::Index i = 0; i < n; ++i) {
      const std::string p = path + ".weights[" + std::to_string(i) + "]";
      c.weights(i) = number(w[std::size_t(i)], p);
      if (c.weights(i) < 0) throw FieldError{p, "weight is negative"};
    }
    if (!(c.weights.sum() > 0)) throw FieldError{path + ".weights", "all weights are zero"};
  }
  return c;
}

// Deepest nesting of arrays/objects a session may have (the schema needs 4; the free-form
// "view" gets the rest). Deeper files are refused while parsing, before any recursion.
constexpr int kMaxSessionDepth = 64;

// Thrown from the parser callback when the nesting limit is reached.
struct TooDeep {};

int lineOfByte(const std::string& text, std::size_t byte) {
  byte = std::min(byte, text.size());
  return 1 + int(std::count(text.begin(), text.begin() + std::ptrdiff_t(byte), '\n'));
}

}  // namespace

std::string formatSession(const Session& s) {
  json params = json::object();
  for (const auto& [k, v] : s.params.values()) params[k] = v;
  json sweep = {{"family", familyName(s.sweep.family)},
                {"direction", {s.sweep.direction[0], s.sweep.direction[1]}},
                {"center", s.sweep.center ? json{(*s.sweep.center)[0], (*s.sweep.center)[1]} : json()},
                {"from", s.sweep.from},
                {"to", s.sweep.to},
                {"steps", s.sweep.steps},
                {"reference", s.sweep.reference ? json(*s.sweep.reference) : json()},
                {"measures", s.sweep.measures}};
  json root = {{"format", "barrow-session"},
               {"version", kSessionVersion},
               {"clouds", {{"A", cloudToJson(s.a)}, {"B", cloudToJson(s.b)}}},
               {"measures", {{"selected", s.selected}, {"params", params}}},
               {"sweep", sweep},
               {"view", s.view}};
  return root.dump(1) + "\n";
}

Loaded<Session> parseSession(const std::string& text, const std::string& file) {
  json root;
  try {
    // The callback sees every value as it is parsed, with its depth: nesting past the limit
    // is refused there, before a tree exists whose copy or destruction would recurse that
    // deep (10^5 levels overflowed the stack).
    const json::parser_callback_t limitDepth = [&](int depth, json::parse_event_t event, json&) {
      if ((event == json::parse_event_t::object_start || event == json::parse_event_t::array_start) &&
          depth >= kMaxSessionDepth)
        throw TooDeep{};
      return true;
    };
    root = json::parse(text, limitDepth);
  } catch (const TooDeep&) {
    return Loaded<Session>::fail(LoadError{
        file, 0, "", "nested deeper than " + std::to_string(kMaxSessionDepth) + " levels"});
  } catch (const json::parse_error& e) {
    std::string why = e.what();
    if (auto p = why.find("parse error"); p != std::string::npos) why = why.substr(p);
    return Loaded<Session>::fail(LoadError{file, lineOfByte(text, e.byte), "", "not valid JSON: " + why});
  } catch (const json::exception& e) {
    // A number outside double's range (1e400) is an out_of_range error, not a parse_error.
    std::string why = e.what();
    if (auto p = why.find("] "); p != std::string::npos) why = why.substr(p + 2);
    return Loaded<Session>::fail(LoadError{file, 0, "", "not readable JSON: " + why});
  }
  try {
    if (!root.is_object()) throw FieldError{"(top level)", "expected a JSON object"};
    const json& fmt = need(root, "format", "");
    if (fmt != "barrow-session") throw FieldError{"format", "expected \"barrow-session\""};
    const json& ver = need(root, "version", "");
    const int version = wholeNumber(ver, "version");
    if (version > kSessionVersion || version < 1)
      throw FieldError{"version", "version " + std::to_string(version) +
                                      " is not supported (this build reads 1 to " +
                                      std::to_string(kSessionVersion) + ")"};
    Session s;
    const json& clouds = need(root, "clouds", "");
    s.a = cloudFromJson(need(clouds, "A", "clouds."), "clouds.A");
    s.b = cloudFromJson(need(clouds, "B", "clouds."), "clouds.B");
    if (root.contains("measures")) {
      const json& m = root["measures"];
      if (m.contains("selected")) {
        if (!m["selected"].is_array()) throw FieldError{"measures.selected", "expected an array of ids"};
        for (const auto& id : m["selected"]) {
          if (!id.is_string()) throw FieldError{"measures.selected", "expected strings"};
          s.selected.push_back(id.get<std::string>());
        }
      }
      if (m.contains("params")) {
        if (!m["params"].is_object()) throw FieldError{"measures.params", "expected an object"};
        for (const auto& [k, v] : m["params"].items()) {
          if (v.is_string()) s.params.set(k, v.get<std::string>());
          else if (v.is_number() || v.is_boolean()) s.params.set(k, v.dump());
          else throw FieldError{"measures.params." + k, "expected a string or number"};
        }
      }
    }
    if (root.contains("sweep")) {
      const json& w = root["sweep"];
      SweepSettings& t = s.sweep;
      if (w.contains("family")) {
        if (!w["family"].is_string()) throw FieldError{"sweep.family", "expected a string"};
        const FamilySpec* f = findFamily(w["family"].get<std::string>());
        if (!f)
          throw FieldError{"sweep.family", "unknown family '" + w["family"].get<std::string>() + "' (expected " +
                                               familyChoices() + ")"};
        t.family = f->family;
      }
      if (w.contains("direction")) {
        const json& d = w["direction"];
        if (!d.is_array() || d.size() != 2) throw FieldError{"sweep.direction", "expected [dx, dy]"};
        t.direction = {number(d[0], "sweep.direction[0]"), number(d[1], "sweep.direction[1]")};
      }
      if (w.contains("center") && !w["center"].is_null()) {
        const json& d = w["center"];
        if (!d.is_array() || d.size() != 2) throw FieldError{"sweep.center", "expected [x, y] or null"};
        t.center = std::array<double, 2>{number(d[0], "sweep.center[0]"), number(d[1], "sweep.center[1]")};
      }
      if (w.contains("from")) t.from = number(w["from"], "sweep.from");
      if (w.contains("to")) t.to = number(w["to"], "sweep.to");
      if (w.contains("steps")) {
        t.steps = wholeNumber(w["steps"], "sweep.steps");
      }
      if (w.contains("reference") && !w["reference"].is_null())
        t.reference = number(w["reference"], "sweep.reference");
      if (w.contains("measures")) {
        if (!w["measures"].is_array()) throw FieldError{"sweep.measures", "expected an array of ids"};
        for (const auto& id : w["measures"]) {
          if (!id.is_string()) throw FieldError{"sweep.measures", "expected strings"};
          t.measures.push_back(id.get<std::string>());
        }
      }
      if (auto e = t.validate()) throw FieldError{"sweep", *e};
    }
    if (root.contains("view")) s.view = root["view"];
    return Loaded<Session>::success(std::move(s));
  } catch (const FieldError& e) {
    return Loaded<Session>::fail(LoadError{file, 0, e.field, e.reason});
  } catch (const json::exception& e) {
    return Loaded<Session>::fail(LoadError{file, 0, "", std::string("unexpected content: ") + e.what()});
  }
}

Loaded<Session> readSession(const std::string& path) {
  std::string why;
  const auto text = readWholeFile(path, &why);
  if (!text) return Loaded<Session>::fail(LoadError{path, 0, "", "cannot open: " + why});
  return parseSession(*text, path);
}

std::optional<std::string> writeSession(const std::string& path, const Session& s,
                                        const WriteFault* fault) {
  return atomicWriteFile(path, formatSession(s), fault);
}

}  // namespace barrow
