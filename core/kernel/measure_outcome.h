// Small helpers for building Results, shared by the kernel and geometric measures.
#pragma once

#include <string>

#include "measures/result.h"

namespace barrow {

/// The result of a computation stopped through RunControl.
inline Result cancelledResult(const std::string& what) {
  Result r;
  r.status = Status::Cancelled;
  r.message = what + ": cancelled";
  return r;
}

}  // namespace barrow
