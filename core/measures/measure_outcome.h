// A guard shared by the kernel and geometric measures (cancelled results: Result::cancelled).
#pragma once

#include <cmath>
#include <string>

#include "measures/result.h"

namespace barrow {

/// `r` unless its value is not finite: squared distances overflow double precision once
/// coordinates differ by more than ~1e154, and the measure's value is then meaningless.
inline Result finiteOrInvalid(Result r, const std::string& what) {
  if (!r.usable() || std::isfinite(r.value)) return r;
  return Result::invalid(what + ": the value is not a finite number (coordinates too large: squared "
                                "distances overflow beyond about 1e154)");
}

}  // namespace barrow
