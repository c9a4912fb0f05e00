#include "base/status.h"

namespace barrow {

const char* statusName(Status s) {
  switch (s) {
    case Status::Ok: return "ok";
    case Status::Infinite: return "infinite";
    case Status::NotConverged: return "not-converged";
    case Status::InvalidInput: return "invalid-input";
    case Status::Cancelled: return "cancelled";
    case Status::Bracketed: return "bracketed";
  }
  return "invalid-input";
}

}  // namespace barrow
