#include "sweep/sweep_merge.h"

#include <algorithm>
#include <cmath>

namespace barrow {

SweepResult mergeSweeps(const std::vector<SweepResult>& parts) {
  if (parts.empty()) return {};
  if (parts.size() == 1) return parts.front();
  SweepResult out = parts.front();
  out.series.clear();
  out.settings.measures.clear();
  out.theta.clear();
  out.seconds = 0.0;
  out.refinedPoints = 0;
  out.message.clear();
  for (const auto& p : parts) out.theta.insert(out.theta.end(), p.theta.begin(), p.theta.end());
  std::sort(out.theta.begin(), out.theta.end());
  out.theta.erase(std::unique(out.theta.begin(), out.theta.end()), out.theta.end());
  const std::size_t n = out.theta.size();
  for (const auto& p : parts) {
    out.cancelled = out.cancelled || p.cancelled;
    out.refineBudgetHit = out.refineBudgetHit || p.refineBudgetHit;
    out.seconds += p.seconds;
    out.refinedPoints += p.refinedPoints;
    if (out.message.empty()) out.message = p.message;
    for (const auto& s : p.series) {
      SweepSeries m = s;
      m.value.assign(n, NAN);
      m.status.assign(n, Status::Cancelled);
      m.slope.assign(n, NAN);
      m.seconds.assign(n, 0.0);
      m.oneSided.assign(n, false);
      for (std::size_t k = 0; k < p.theta.size(); ++k) {
        const std::size_t at =
            std::size_t(std::lower_bound(out.theta.begin(), out.theta.end(), p.theta[k]) - out.theta.begin());
        if (k < s.value.size()) m.value[at] = s.value[k];
        if (k < s.status.size()) m.status[at] = s.status[k];
        if (k < s.slope.size()) m.slope[at] = s.slope[k];
        if (k < s.seconds.size()) m.seconds[at] = s.seconds[k];
        if (k < s.oneSided.size()) m.oneSided[at] = s.oneSided[k];
      }
      out.settings.measures.push_back(s.id);
      out.series.push_back(std::move(m));
    }
  }
  return out;
}

}  // namespace barrow
