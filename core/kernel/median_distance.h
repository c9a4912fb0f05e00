// The median heuristic's bandwidth: the median Euclidean distance over all pairs {i, j},
// i < j, of a point set (the diagonal excluded, each unordered pair once; for an even number
// of pairs the mean of the two middle values, as numpy.median does). Applied by the MMD to
// the pooled sample A ∪ B. Gretton et al. 2012 (JMLR 13), Sec. 8, use this form of the
// heuristic; Garreau, Jitkrittum & Kanagawa 2017 analyse it (mem).
//
// Exact at every size, with O(N) memory beyond a bounded candidate buffer:
//  - up to `directLimit` points, all N(N-1)/2 squared distances are stored and selected;
//  - above, the cell-grid rank search (kernel/median_grid.h), which counts most pairs
//    wholesale and computes only those near the median; should it give up, or with
//    cellGrid = false:
//  - streamed selection: the distances are recomputed block by block on all cores in
//    each pass over the pairs, never stored. First try: a deterministic sample of up to 2^23
//    pairs brackets the median rank (+-5 sd of the sample quantile); one pass counts the pairs below
//    the bracket and collects those inside, which then hold the median (verified by the
//    counts). If the bracket misses, or would hold more than half of candidateLimit values
//    (pools above ~5*10^4 points), a radix selection on the bit patterns of the squared distances
//    (non-negative doubles order like their bits) histograms 16 bits per pass until the
//    median's bucket is small enough to collect: typically 2-3 passes.
#pragma once

#include <Eigen/Core>
#include <string>

#include "base/parallel_blocks.h"

namespace barrow {

struct MedianDistanceOptions {
  Eigen::Index directLimit = 2048;            // points up to which all pairs are stored
  std::size_t candidateLimit = std::size_t(1) << 22;  // values collected in the final pass
  bool sampleBracket = true;                  // try the one-pass sampled bracket first
  bool cellGrid = true;                       // above directLimit: kernel/median_grid.h first
  int threads = 0;                            // 0: all cores
};

struct MedianDistance {
  double value = 0.0;     // the median pairwise distance
  double pairs = 0.0;     // N(N-1)/2
  int passes = 0;         // passes over all pairs
  std::string method;     // how it was computed, for result details
  bool complete = true;   // false: stopped through RunControl
};

/// Pre: points.rows() >= 2, all coordinates finite.
MedianDistance medianPairwiseDistance(const Eigen::MatrixX2d& points, const WorkSlice& slice,
                                      const MedianDistanceOptions& options = {});

}  // namespace barrow
