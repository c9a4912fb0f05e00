// Command-line options of barrow-cli: "--name value", "--name=value", bare "--flag",
// and repeatable "--set group.key=value".
#pragma once

#include <map>
#include <optional>
#include <string>
#include <vector>

namespace barrow::cli {

/// Thrown for bad usage; main() prints it and exits with code 2.
struct UsageError {
  std::string message;
};

class CliArgs {
 public:
  /// `valued`: options that take a value; `flags`: options that do not. Others are errors.
  CliArgs(const std::string& command, const std::vector<std::string>& args,
          const std::vector<std::string>& valued, const std::vector<std::string>& flags);

  const std::string& command() const { return command_; }
  bool flag(const std::string& name) const { return flags_.count(name) != 0; }
  bool has(const std::string& name) const { return values_.count(name) != 0; }
  std::optional<std::string> value(const std::string& name) const;
  /// The value, or a UsageError "missing --name".
  std::string required(const std::string& name) const;
  double number(const std::string& name, double fallback) const;
  int integer(const std::string& name, int fallback) const;
  /// Every --set value, in order.
  const std::vector<std::string>& sets() const { return sets_; }

 private:
  std::string command_;
  std::map<std::string, std::string> values_;
  std::map<std::string, bool> flags_;
  std::vector<std::string> sets_;
};

/// Splits "a,b,c" (empty parts dropped).
std::vector<std::string> splitList(const std::string& s);

}  // namespace barrow::cli
