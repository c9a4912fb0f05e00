// The exact median pairwise distance without visiting every pair: a cell-grid rank search.
//
// The median's rank is bracketed by a deterministic sample of pairs. One pass over the cell
// grid (kernel/pair_grid.h) then counts every pair below the bracket and histograms the pairs
// inside it: a cell offset whose largest cell-to-cell distance is below the bracket is counted
// wholesale from row prefix counts, one whose smallest distance is beyond it is skipped, and
// only the point pairs of the offsets in between (an annulus of width ~ bracket + 3 cells) are
// computed. A second pass collects the few values in the histogram buckets that hold the two
// middle ranks, which are then selected exactly. Counts decide everything: a bracket that
// misses the ranks is widened, a bucket too full is refined, so the sample only affects speed.
// The values are the same squared distances dx*dx + dy*dy the streamed selection compares.
#pragma once

#include <optional>

#include "kernel/median_distance.h"

namespace barrow {

/// nullopt when the search cannot finish within its pass budget (the caller then uses the
/// streamed selection). Pre: points.rows() >= 2, all coordinates finite.
std::optional<MedianDistance> medianByCellGrid(const Eigen::MatrixX2d& points, const WorkSlice& slice,
                                               const MedianDistanceOptions& options);

}  // namespace barrow
