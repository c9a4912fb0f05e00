// The three estimators behind the density measures, each returning a complete Result whose
// details name the estimator and every setting used (DEVELOPERS.md, Measure conventions: "the density measures name
// their estimator and its setting in every output").
#pragma once

#include "cloud/cloud.h"
#include "density/density_settings.h"
#include "density/divergence_kind.h"
#include "measures/measure.h"

namespace barrow {

/// Plug-in divergence of the binned masses (histogram_grid.h). KL is +inf, status Infinite,
/// when a bin holds mass of the first argument and none of the second.
Result histogramEstimate(const Cloud& a, const Cloud& b, DivergenceKind kind, const DensitySettings& s,
                         const EvalContext& ctx);

/// Divergence between the two Gaussian KDEs, integrated on a grid (kde_pair.h, kde_integral.h)
/// with an error estimate. Status NotConverged when the node budget left the estimate large.
Result kdeEstimate(const Cloud& a, const Cloud& b, DivergenceKind kind, const DensitySettings& s,
                   const EvalContext& ctx);

/// kNN estimate of KL (knn_kl.h); invalid input for JS, TV, Hellinger and for weighted clouds.
Result knnEstimate(const Cloud& a, const Cloud& b, DivergenceKind kind, const DensitySettings& s,
                   const EvalContext& ctx);

}  // namespace barrow
