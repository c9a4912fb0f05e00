// What a sweep produces: per measure, D(A_θ, B) and dD/dθ on a θ grid.
// Shared contract between the sweep engine, the findings, the CLI and the GUI.
#pragma once

#include <cstdint>
#include <nlohmann/json.hpp>
#include <string>
#include <vector>

#include "base/params.h"
#include "base/status.h"
#include "sweep/sweep_settings.h"

namespace barrow {

struct SweepSeries {
  std::string id;                     // measure id
  std::vector<double> value;          // one per θ; +inf allowed; NaN when failed
  std::vector<Status> status;         // one per θ
  std::vector<double> slope;          // dD/dθ per θ; NaN where undefined
  std::vector<double> seconds;        // compute time per θ
  std::vector<bool> oneSided;         // true where the exact plan is not unique (slope one-sided)
  std::string gradientMethod;         // "analytic" or "finite-difference"
  std::string unit;                   // of the value (measures/units.h); the slope's is unit per θ unit
  ParamSet frozen;                    // the settings used at every θ (frozen at the reference)
  ParamSet rules;                     // the data-dependent settings freezing replaced, as given
  nlohmann::json details = nlohmann::json::object();  // estimator settings etc. at the reference
  std::string message;                // first failure's reason; empty when every θ succeeded
  double accuracy = 0.0;              // absolute accuracy of the values (largest the solver stated)
  // Resampling band per θ (core/uncertainty/sweep_bands.h); empty when the sweep ran without.
  std::vector<double> low, high;
};

struct SweepResult {
  SweepSettings settings;
  std::vector<double> theta;          // increasing; the grid plus any refinement points
  std::vector<SweepSeries> series;    // in the order of the requested measures
  bool cancelled = false;
  double seconds = 0.0;
  std::string message;                // empty when all went well
  // How the sweep was run (recorded in the CSV so a run can be repeated exactly).
  double refineTolerance = 0.0;       // θ width refinement bisected down to; 0 = no refinement
  int refinedPoints = 0;              // θ values inserted by refinement
  bool refineBudgetHit = false;       // refinement stopped at its point budget, not at the tolerance
  double referenceTheta = 0.0;        // θ0 where data-dependent settings were frozen
  int refineBudget = 0;               // θ values refinement was allowed to insert
  int threads = 0;                    // worker threads used (θ is split into that many chunks)
  bool warmStart = true;              // warm starts between neighbouring θ within a chunk
  // Resampling bands (0 resamples = none): B, level and seed, written to the CSV.
  int bandResamples = 0;
  double bandLevel = 0.95;
  std::uint64_t bandSeed = 0;
};

}  // namespace barrow
