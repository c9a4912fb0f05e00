// Which segments of a large transport plan to draw. A plan between 10^4-point clouds has
// ~2·10^4 entries; drawn all at once they merge into one dark sheet that hides both clouds.
// Systematic sampling by mass keeps the picture honest: walking the entries in a fixed order,
// one entry is taken each time the running mass crosses the next multiple of a stride
// (total / budget), so an entry is drawn with probability proportional to its mass (certainly,
// if it carries at least one stride) and the drawn set spreads over the whole plan the way the
// mass does. The caller states the share of mass drawn.
#pragma once

#include <cstddef>
#include <vector>

#include "measures/result.h"

namespace barrow::ui {

struct ThinnedPlan {
  std::vector<std::size_t> drawn;  // indices into the entries, ascending
  double drawnMass = 0.0;          // Σ mass of the drawn entries
  double totalMass = 0.0;          // Σ mass of all entries
};

/// All entries when there are at most `budget`; otherwise at most `budget` of them, chosen by
/// mass as above (entries in the given order; zero-mass entries are never drawn).
ThinnedPlan thinByMass(const std::vector<PlanEntry>& entries, std::size_t budget);

}  // namespace barrow::ui
