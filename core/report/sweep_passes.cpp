#include "report/sweep_passes.h"

#include <algorithm>
#include <cmath>

namespace barrow {

SweepResult mergeSweepPasses(const std::vector<SweepResult>& passes) {
  SweepResult out;
  if (passes.empty()) return out;
  out = passes.front();
  out.series.clear();
  out.theta.clear();
  out.settings.measures.clear();
  out.refinedPoints = 0;
  out.seconds = 0.0;
  for (const auto& p : passes) {
    out.theta.insert(out.theta.end(), p.theta.begin(), p.theta.end());
    out.refinedPoints += p.refinedPoints;
    out.refineBudgetHit = out.refineBudgetHit || p.refineBudgetHit;
    out.cancelled = out.cancelled || p.cancelled;
    out.seconds += p.seconds;
    if (out.message.empty()) out.message = p.message;
  }
  std::sort(out.theta.begin(), out.theta.end());
  out.theta.erase(std::unique(out.theta.begin(), out.theta.end()), out.theta.end());
  const std::size_t n = out.theta.size();
  for (const auto& p : passes)
    for (const auto& s : p.series) {
      SweepSeries m = s;
      m.value.assign(n, NAN);
      m.status.assign(n, Status::Cancelled);
      m.slope.assign(n, NAN);
      m.seconds.assign(n, 0.0);
      m.oneSided.assign(n, false);
      for (std::size_t k = 0; k < p.theta.size(); ++k) {
        const auto at = std::size_t(std::lower_bound(out.theta.begin(), out.theta.end(), p.theta[k]) - out.theta.begin());
        if (k < s.value.size()) m.value[at] = s.value[k];
        if (k < s.status.size()) m.status[at] = s.status[k];
        if (k < s.slope.size()) m.slope[at] = s.slope[k];
        if (k < s.seconds.size()) m.seconds[at] = s.seconds[k];
        if (k < s.oneSided.size()) m.oneSided[at] = s.oneSided[k];
      }
      out.settings.measures.push_back(m.id);
      out.series.push_back(std::move(m));
    }
  return out;
}

}  // namespace barrow
