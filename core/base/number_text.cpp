#include "base/number_text.h"

#include <charconv>
#include <cstdio>

namespace barrow {

std::string shortestText(double v) {
  char buf[32];
  const auto res = std::to_chars(buf, buf + sizeof buf, v);
  return std::string(buf, res.ptr);
}

std::string sixDigits(double v) {
  char buf[32];
  std::snprintf(buf, sizeof buf, "%.6g", v);
  return buf;
}

}  // namespace barrow
