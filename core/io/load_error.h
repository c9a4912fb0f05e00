// Errors from reading files: always name the file, the place in it and the reason.
#pragma once

#include <optional>
#include <string>
#include <utility>

namespace barrow {

struct LoadError {
  std::string file;
  int line = 0;          // 1-based text line, 0 when not line-based
  std::string field;     // header field or JSON path, when that is the better locator
  std::string reason;

  /// "file:line: reason", "file: field 'x': reason" or "file: reason".
  std::string text() const;
};

/// A value or the reason there is none; a failed read never yields a partial value.
template <class T>
struct Loaded {
  std::optional<T> value;
  LoadError error;

  static Loaded fail(LoadError e) { return Loaded{std::nullopt, std::move(e)}; }
  static Loaded success(T v) { return Loaded{std::move(v), {}}; }
  explicit operator bool() const { return value.has_value(); }
};

}  // namespace barrow
