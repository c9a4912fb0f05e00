// A measure with its settings fixed once on the original pair (A, B): ε, bandwidths, bins and
// σ that a rule such as "median" or "auto" would derive from the data are resolved there and
// reused on every resample, permutation and subsample. Re-deriving them per resample would
// add the setting's own variation to the interval (DEVELOPERS.md, Measure conventions:
// data-dependent settings are frozen).
#pragma once

#include <string>

#include "cloud/cloud.h"
#include "measures/measure.h"

namespace barrow {

class FrozenMeasure {
 public:
  /// Resolves `user` for `m` and freezes it on (a, b). Never throws; a failure is kept in
  /// error().
  FrozenMeasure(const Measure& m, const ParamSet& user, const Cloud& a, const Cloud& b);

  const Measure& measure() const { return *m_; }
  const ParamSet& settings() const { return frozen_; }
  const std::string& error() const { return error_; }

  /// D(a, b) under the frozen settings (validated, timed, never throws). No warm start: a
  /// resample's value must not depend on which resample a thread happened to solve before.
  Result evaluate(const Cloud& a, const Cloud& b, const RunControl* control) const;

 private:
  const Measure* m_;
  ParamSet frozen_;
  std::string error_;
};

}  // namespace barrow
