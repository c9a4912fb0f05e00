// Passes over the Gibbs kernel exp(-|x_i - y_j|^p / ε) computed on the fly from the
// coordinates (no n×m matrix), vectorised and split between cores. They are the inner loops
// of log-domain Sinkhorn (Peyré & Cuturi 2019, Computational Optimal Transport, Sec. 4.4):
// row log-sum-exp for the potential updates, weighted row sums for gradients, and single
// rows for reading the transport plan.
//
// Units: coordinates are stored pre-scaled (ScaledPoints) so that the exponent is
// c̃_ij = |x̃_i - ỹ_j|^p = c_ij / ε. Column weights h_j are passed in log form (nats), padded
// with -inf (paddedLength) so that every row is a whole number of SIMD registers.
#pragma once

#include <Eigen/Core>
#include <atomic>
#include <vector>

#include "base/row_workers.h"

namespace barrow::kernel {

/// A stabilised row sum inside [kSumLow, kSumHigh] is accurate in double (see logSumExpRows).
inline constexpr double kSumLow = 1e-250;
inline constexpr double kSumHigh = 1e250;

/// True when the AVX2 forms of the passes may run (the CPU has AVX2+FMA, cpu_features.h).
bool useAvx2();

/// Length of a padded column array for `n` points.
int paddedLength(int n);

/// Points in structure-of-arrays form, multiplied by `scale` and padded with zeros.
struct ScaledPoints {
  std::vector<double> x, y;  // paddedLength(size) entries each
  int size = 0;              // number of real points

  ScaledPoints() = default;
  /// scale: 1/sqrt(ε) for p = 2, 1/ε for p = 1 (see scaleFor).
  ScaledPoints(const Eigen::MatrixX2d& pts, double scale);
  int padded() const { return int(x.size()); }
};

/// Coordinate scale that turns |x-y|^p / ε into |x̃-ỹ|^p. Pre: p ∈ {1, 2}, ε > 0.
double scaleFor(int p, double epsilon);

/// A padded log-weight array: log(w_j) for the real entries (−inf where w_j = 0), −inf in
/// the padding.
std::vector<double> paddedLogWeights(const Eigen::VectorXd& w);

/// Row log-sum-exp: out_i = log Σ_j exp(h_j − c̃(r_i, q_j)) for every row i.
/// `guess_i` should be close to out_i (the previous iterate): it serves as the stabiliser,
/// so each pair costs one exp. A row whose stabilised sum leaves [1e-250, 1e250] (a poor or
/// missing guess) is recomputed with its exact maximum, so the result never under- or
/// overflows. `ratio_i` (optional) receives exp(out_i − guess_i) (0 or +inf possible for
/// recomputed rows): with guess = −f/ε it is the row marginal of the current plan divided by
/// a_i. Pre: h.size() == cols.padded(); p ∈ {1, 2}.
/// `stop` (optional): once it reads true, the remaining chunks are skipped and `out`/`ratio`
/// are left partly stale, so a caller that passes it must check it before using them (a
/// pass at 10^4 + 10^4 takes ~0.1 s; this lets a cancel end it early).
void logSumExpRows(const ScaledPoints& rows, const ScaledPoints& cols, const std::vector<double>& h,
                   int p, const double* guess, double* out, double* ratio, RowWorkers& workers,
                   const std::atomic<bool>* stop = nullptr);

/// Weighted row sums for gradients: with e_ij = exp(h_j − c̃_ij − o_i),
///   s0_i = Σ_j e_ij,  sx_i = Σ_j e_ij d_ij.x,  sy_i = Σ_j e_ij d_ij.y,
/// where d_ij = r̃_i − q̃_j for p = 2 and its unit vector for p = 1 (0 where the points
/// coincide). Outputs are in scaled units; the caller converts.
void gradientRows(const ScaledPoints& rows, const ScaledPoints& cols, const std::vector<double>& h,
                  int p, const double* o, double* s0, double* sx, double* sy, RowWorkers& workers);

/// One row of the stabilised kernel: out_j = exp(h_j − c̃(r_i, q_j) − o) for j < cols.padded().
void kernelRow(const ScaledPoints& rows, int i, const ScaledPoints& cols, const std::vector<double>& h,
               int p, double o, double* out);

/// Rows per chunk for a pass over a rows×cols block (whole block on one thread when small).
int grainFor(int rows, int cols);

}  // namespace barrow::kernel
