#include "base/params.h"

#include "base/number_text.h"

#include <algorithm>
#include <charconv>
#include <cmath>
#include <sstream>
#include <stdexcept>

namespace barrow {

void ParamSet::setNumber(const std::string& key, double value) { values_[key] = shortestText(value); }

void ParamSet::setPair(const std::string& key, double x, double y) {
  values_[key] = shortestText(x) + "," + shortestText(y);
}

namespace {

// The text a number is read from: blanks around it and one leading '+' dropped.
std::string numberText(const std::string& text) {
  std::string t = text;
  t.erase(0, t.find_first_not_of(" \t"));
  t.erase(t.find_last_not_of(" \t") + 1);
  if (!t.empty() && t[0] == '+') t.erase(0, 1);
  return t;
}

}  // namespace

std::optional<double> parseNumber(const std::string& text) {
  const std::string t = numberText(text);
  if (t.empty()) return std::nullopt;
  double v = 0;
  const auto [end, ec] = std::from_chars(t.data(), t.data() + t.size(), v);
  if (ec != std::errc() || end != t.data() + t.size()) {
    // from_chars rejects "inf"/"nan" spellings we may want to name explicitly.
    std::string low = t;
    std::transform(low.begin(), low.end(), low.begin(), ::tolower);
    if (low == "inf" || low == "infinity") return INFINITY;
    if (low == "-inf" || low == "-infinity") return -INFINITY;
    if (low == "nan") return NAN;
    return std::nullopt;
  }
  return v;
}

std::string notNumberReason(const std::string& text) {
  const std::string t = numberText(text);
  double v = 0;
  const auto [end, ec] = std::from_chars(t.data(), t.data() + t.size(), v);
  if (ec == std::errc::result_out_of_range && end == t.data() + t.size())
    return "is out of range (a double holds magnitudes from about 2.2e-308 to 1.8e308)";
  return "is not a number";
}

namespace {

bool isWordOf(const ParamSpec& spec, const std::string& v) {
  return std::find(spec.choices.begin(), spec.choices.end(), v) != spec.choices.end();
}

std::string rangeText(const ParamSpec& s) {
  std::ostringstream o;
  o << (s.minExclusive ? "> " : ">= ") << s.min;
  if (s.hasMax()) o << " and <= " << s.max;
  return o.str();
}

std::optional<std::string> checkNumber(const ParamSpec& spec, const std::string& part) {
  const auto v = parseNumber(part);
  if (!v) return "'" + part + "' is not a number";
  if (!std::isfinite(*v)) return "'" + part + "' is not a finite number";
  if (spec.kind == ParamKind::Integer && std::floor(*v) != *v)
    return "'" + part + "' is not a whole number";
  const bool low = spec.minExclusive ? !(*v > spec.min) : !(*v >= spec.min);
  if (low || *v > spec.max) return part + " is out of range (must be " + rangeText(spec) + ")";
  return std::nullopt;
}

std::vector<std::string> splitComma(const std::string& s) {
  std::vector<std::string> out;
  std::stringstream ss(s);
  std::string item;
  while (std::getline(ss, item, ',')) out.push_back(item);
  if (!s.empty() && s.back() == ',') out.push_back("");
  return out;
}

}  // namespace

std::optional<std::string> checkParam(const ParamSpec& spec, const std::string& value) {
  auto fail = [&](const std::string& why) { return spec.key + ": " + why; };
  switch (spec.kind) {
    case ParamKind::Boolean:
      if (value != "true" && value != "false") return fail("expected true or false, got '" + value + "'");
      return std::nullopt;
    case ParamKind::Choice:
      if (!isWordOf(spec, value)) {
        std::string all;
        for (const auto& c : spec.choices) all += (all.empty() ? "" : "|") + c;
        return fail("expected one of " + all + ", got '" + value + "'");
      }
      return std::nullopt;
    case ParamKind::Real:
    case ParamKind::Integer:
      if (isWordOf(spec, value)) return std::nullopt;
      if (auto e = checkNumber(spec, value)) return fail(*e);
      return std::nullopt;
    case ParamKind::RealPair: {
      if (isWordOf(spec, value)) return std::nullopt;
      const auto parts = splitComma(value);
      if (parts.size() != 1 && parts.size() != 2)
        return fail("expected one number or two separated by a comma, got '" + value + "'");
      for (const auto& p : parts)
        if (auto e = checkNumber(spec, p)) return fail(*e);
      return std::nullopt;
    }
  }
  return std::nullopt;
}

const std::string& ParamSet::text(const std::string& key) const {
  const auto it = values_.find(key);
  if (it == values_.end()) throw std::out_of_range("parameter '" + key + "' is not set");
  return it->second;
}

double ParamSet::real(const std::string& key) const {
  const auto v = parseNumber(text(key));
  if (!v) throw std::invalid_argument("parameter '" + key + "' is not a number: " + text(key));
  return *v;
}

int ParamSet::integer(const std::string& key) const { return int(std::lround(real(key))); }

bool ParamSet::boolean(const std::string& key) const { return text(key) == "true"; }

std::pair<double, double> ParamSet::pair(const std::string& key) const {
  const auto parts = splitComma(text(key));
  const auto x = parts.empty() ? std::nullopt : parseNumber(parts[0]);
  const auto y = parts.size() > 1 ? parseNumber(parts[1]) : x;
  if (!x || !y) throw std::invalid_argument("parameter '" + key + "' is not a number pair: " + text(key));
  return {*x, *y};
}

bool ParamSet::isWord(const std::string& key, const std::string& word) const {
  return has(key) && text(key) == word;
}

std::optional<std::string> ParamSet::assign(const std::string& assignment) {
  const auto eq = assignment.find('=');
  if (eq == std::string::npos || eq == 0)
    return "expected group.key=value, got '" + assignment + "'";
  const std::string key = assignment.substr(0, eq);
  if (key.find('.') == std::string::npos)
    return "parameter '" + key + "' has no group (expected e.g. sinkhorn.epsilon)";
  set(key, assignment.substr(eq + 1));
  return std::nullopt;
}

ParamSet ParamSet::resolved(const std::vector<ParamSpec>& specs, std::string* error) const {
  ParamSet out;
  for (const auto& spec : specs) {
    const auto it = values_.find(spec.key);
    const std::string& v = it != values_.end() ? it->second : spec.defaultValue;
    if (error && error->empty())
      if (auto e = checkParam(spec, v)) *error = *e;
    out.set(spec.key, v);
  }
  return out;
}

}  // namespace barrow
