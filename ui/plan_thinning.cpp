#include "plan_thinning.h"

#include <algorithm>
#include <cmath>

namespace barrow::ui {

ThinnedPlan thinByMass(const std::vector<PlanEntry>& entries, std::size_t budget) {
  ThinnedPlan out;
  for (const auto& e : entries) out.totalMass += std::max(0.0, e.mass);
  if (entries.size() <= budget || budget == 0 || out.totalMass <= 0) {
    if (budget == 0) return out;
    for (std::size_t k = 0; k < entries.size(); ++k)
      if (entries[k].mass > 0) out.drawn.push_back(k), out.drawnMass += entries[k].mass;
    return out;
  }
  // Sample points at (q + ½)·stride, q = 0 … budget−1: an entry covering the interval
  // [before, after) of the running mass is drawn when a sample point falls inside it.
  const double stride = out.totalMass / double(budget);
  double before = 0.0;
  double next = 0.5 * stride;
  for (std::size_t k = 0; k < entries.size() && out.drawn.size() < budget; ++k) {
    const double m = std::max(0.0, entries[k].mass);
    const double after = before + m;
    if (m > 0 && next < after) {
      out.drawn.push_back(k);
      out.drawnMass += m;
      next += stride * std::ceil((after - next) / stride);  // the first sample point past it
    }
    before = after;
  }
  return out;
}

}  // namespace barrow::ui
