// The three pair sums K_aa, K_bb, K_ab of kernel/discrepancy.h in O(n + G^2 log G) instead of
// O(n^2), with a rigorous, data-dependent bound on each sum's error.
//
// Method (linear binning with exact near field):
//  - Both clouds are spread onto the nodes of one square grid of spacing h by bilinear weights
//    (each point's mass goes to the four corners of its cell). For two points x, y in cells c,
//    c' the binned sum uses  sum_{corners} lambda(x) mu(y) k(corner - corner'),  the 4-D
//    multilinear interpolant of F(x, y) = k(x - y) on the box cell_c x cell_c'. The node sums
//    sum_{g,g'} A_g B_g' k(g - g') are a discrete convolution, done by FFT (kernel/grid_fft.h)
//    and Parseval's identity.
//  - Near field: for cell pairs at most one cell apart the interpolant is replaced by the exact
//    k(x - y), point pair by point pair (for |x - y| the interpolant is poor there: the cone's
//    second derivative is unbounded at 0).
//  - Bound for the other (far) cell pairs: linear interpolation on [0, h] errs by at most
//    h^2/8 max|f''| [P] (Süli & Mayers 2003, Thm 6.2 (mem)), and the tensor-product
//    interpolant in 4-D errs by at most the sum of the four one-axis terms [D] (interpolate one
//    axis at a time; each step is a convex combination, so earlier errors do not grow), i.e. by
//        beta(c - c') = h^2/4 (sup |d^2k/dd1^2| + sup |d^2k/dd2^2|)
//    with the sups over the difference box [(c - c' - 1) h, (c - c' + 1) h]^2. So
//        |binned K_ab - K_ab| <= sum_{c, c'} Ma_c Mb_c' beta(c - c'),
//    Ma, Mb the clouds' masses per cell, evaluated by the same FFT route, plus an allowance for
//    the FFT's rounding (Higham 2002, Sec. 24.1 (mem)). Linear binning for kernel sums is the
//    classical device of fast kernel density estimation (Wand 1994 (mem)); the bound is ours.
//  The sums are the V-statistic sums (diagonal included).
#pragma once

#include <Eigen/Core>
#include <optional>
#include <string>

#include "kernel/pair_sum.h"
#include "kernel/support_points.h"

namespace barrow {

struct BinnedSumOptions {
  int nodes = 512;                  // grid nodes along the longer side of the pooled bounding box
                                    // (512: FFTs of 1024 per side; 1024: 2048)
  double nearPairLimit = 4e8;       // near-field point pairs beyond which binning declines
  int threads = 0;                  // 0: the control's budget
};

struct BinnedSums {
  double aa = 0.0, bb = 0.0, ab = 0.0;                 // sum a_i a_k k(x_i, x_k) etc., all pairs
  double boundAA = 0.0, boundBB = 0.0, boundAB = 0.0;  // |sum - exact sum| <= bound
  int cols = 0, rows = 0;                              // grid nodes
  double spacing = 0.0;                                // h
  double nearPairs = 0.0;                              // point pairs computed exactly
  bool complete = true;                                // false: stopped through RunControl
};

/// nullopt when binning does not pay (more near pairs than options.nearPairLimit, e.g. many
/// coincident points) or the points do not span a box. Pre: weights sum to 1, finite points.
std::optional<BinnedSums> binnedPairSums(const SupportPoints& a, const SupportPoints& b, const PairKernelSpec& k,
                                         const WorkSlice& slice, const BinnedSumOptions& options = {});

/// sup |d^2k/dd1^2| + sup |d^2k/dd2^2| over the box [lo, hi] of differences d (Gaussian:
/// d^2k/dd1^2 = 2 gamma (2 gamma d1^2 - 1) exp(-gamma |d|^2); distance: d2^2/|d|^3 <= 1/|d|).
/// +inf for the distance kernel when the box holds 0.
double curvatureBound(const PairKernelSpec& k, const Eigen::Vector2d& lo, const Eigen::Vector2d& hi);

}  // namespace barrow
