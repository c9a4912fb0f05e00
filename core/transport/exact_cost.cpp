#include "transport/exact_cost.h"

#include <cstdio>

namespace barrow {

std::string GroundCost::label() const {
  switch (kind_) {
    case CostKind::Distance: return "|x-y|";
    case CostKind::Squared: return "|x-y|^2";
    case CostKind::Power: break;
  }
  char buf[48];
  std::snprintf(buf, sizeof buf, "|x-y|^%g", p_);
  return buf;
}

}  // namespace barrow
