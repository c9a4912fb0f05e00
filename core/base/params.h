// Measure parameters: typed specs with defaults and ranges, and the key=value set that the
// CLI (--set), the session file and the GUI editors all share.
#pragma once

#include <map>
#include <optional>
#include <string>
#include <utility>
#include <vector>

namespace barrow {

enum class ParamKind {
  Real,      // one number
  Integer,   // one whole number
  Boolean,   // true|false
  Choice,    // one of `choices`
  RealPair,  // "s" or "sx,sy" (one number used for both) — bandwidths, grid origins
};

struct ParamSpec {
  std::string key;            // full key, "group.name", e.g. "sinkhorn.epsilon"
  ParamKind kind = ParamKind::Real;
  std::string defaultValue;   // as text, e.g. "0.05", "median", "hist"
  double min = -1e300;        // inclusive bounds for numbers
  double max = 1e300;
  bool minExclusive = false;  // e.g. epsilon > 0
  std::vector<std::string> choices;  // Choice: the allowed words; Real/RealPair: words
                                     // accepted instead of a number ("median", "auto")
  std::string unit;           // "cost units", "directions", "" ...
  std::string help;           // one line, shown in --help and tooltips

  /// Whether the bounds are real limits (the defaults ±1e300 mean "none").
  bool hasMin() const { return min > -1e299; }
  bool hasMax() const { return max < 1e299; }
};

/// Checks one value against its spec; returns the reason it is invalid.
std::optional<std::string> checkParam(const ParamSpec& spec, const std::string& value);

/// A set of key=value settings (values kept as the text the user gave).
class ParamSet {
 public:
  void set(const std::string& key, const std::string& value) { values_[key] = value; }
  /// Numbers in the shortest text that reads back to exactly the same double, so a frozen
  /// setting replays bit for bit ("s" or "x,y").
  void setNumber(const std::string& key, double value);
  void setPair(const std::string& key, double x, double y);
  bool has(const std::string& key) const { return values_.count(key) != 0; }
  void erase(const std::string& key) { values_.erase(key); }
  const std::map<std::string, std::string>& values() const { return values_; }

  /// Text of a key; throws std::out_of_range naming the key when absent.
  const std::string& text(const std::string& key) const;
  double real(const std::string& key) const;
  int integer(const std::string& key) const;
  bool boolean(const std::string& key) const;
  /// "s" gives (s, s); "sx,sy" gives (sx, sy).
  std::pair<double, double> pair(const std::string& key) const;
  /// True when the value is one of the spec's words rather than a number ("median").
  bool isWord(const std::string& key, const std::string& word) const;

  /// Parses "group.key=value"; on error returns the reason.
  std::optional<std::string> assign(const std::string& assignment);

  /// Values for `specs`: this set's values where present, defaults elsewhere; keys outside
  /// `specs` are dropped. Returns the first invalid value's reason in `error`.
  ParamSet resolved(const std::vector<ParamSpec>& specs, std::string* error) const;

 private:
  std::map<std::string, std::string> values_;
};

/// Number parsing that accepts the whole string only ("1.5" yes, "1.5x" no).
std::optional<double> parseNumber(const std::string& text);
/// Why `text` is not a number: "is out of range" for a well-formed number beyond the doubles
/// (1e400), else "is not a number". Use for messages after parseNumber failed.
std::string notNumberReason(const std::string& text);

}  // namespace barrow
