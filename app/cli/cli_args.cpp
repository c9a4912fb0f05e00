#include "cli/cli_args.h"

#include <algorithm>
#include <cmath>
#include <sstream>

#include "base/params.h"

namespace barrow::cli {

namespace {
bool contains(const std::vector<std::string>& v, const std::string& s) {
  return std::find(v.begin(), v.end(), s) != v.end();
}
}  // namespace

CliArgs::CliArgs(const std::string& command, const std::vector<std::string>& args,
                 const std::vector<std::string>& valued, const std::vector<std::string>& flags)
    : command_(command) {
  for (std::size_t k = 0; k < args.size(); ++k) {
    std::string a = args[k];
    if (a.rfind("--", 0) != 0)
      throw UsageError{"unexpected argument '" + a + "' for '" + command + "' (see --help)"};
    a.erase(0, 2);
    std::optional<std::string> inlineValue;
    if (const auto eq = a.find('='); eq != std::string::npos) {
      inlineValue = a.substr(eq + 1);
      a.erase(eq);
    }
    if (a == "set" || contains(valued, a)) {
      std::string v;
      if (inlineValue) v = *inlineValue;
      else if (k + 1 < args.size()) v = args[++k];
      else throw UsageError{"option --" + a + " needs a value"};
      if (a == "set") sets_.push_back(v);
      else if (!values_.emplace(a, v).second)
        throw UsageError{"option --" + a + " is given twice ('" + values_[a] + "' and '" + v + "'): give it once"};
    } else if (contains(flags, a)) {
      if (inlineValue) throw UsageError{"option --" + a + " takes no value"};
      flags_[a] = true;
    } else {
      throw UsageError{"unknown option --" + a + " for '" + command + "' (see --help)"};
    }
  }
}

std::optional<std::string> CliArgs::value(const std::string& name) const {
  const auto it = values_.find(name);
  if (it == values_.end()) return std::nullopt;
  return it->second;
}

std::string CliArgs::required(const std::string& name) const {
  const auto v = value(name);
  if (!v) throw UsageError{"'" + command_ + "' needs --" + name};
  return *v;
}

double CliArgs::number(const std::string& name, double fallback) const {
  const auto v = value(name);
  if (!v) return fallback;
  const auto d = parseNumber(*v);
  if (!d) throw UsageError{"--" + name + ": '" + *v + "' " + notNumberReason(*v)};
  return *d;
}

int CliArgs::integer(const std::string& name, int fallback) const {
  const auto v = value(name);
  if (!v) return fallback;
  const auto d = parseNumber(*v);
  if (!d) throw UsageError{"--" + name + ": '" + *v + "' " + notNumberReason(*v)};
  if (!(std::abs(*d) < 2147483647.0) || *d != std::floor(*d))
    throw UsageError{"--" + name + ": '" + *v + "' is not a whole number in the range of an int"};
  return int(*d);
}

std::vector<std::string> splitList(const std::string& s) {
  std::vector<std::string> out;
  std::stringstream ss(s);
  std::string item;
  while (std::getline(ss, item, ','))
    if (!item.empty()) out.push_back(item);
  return out;
}

}  // namespace barrow::cli
