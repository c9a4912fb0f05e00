// One measure's part of a sweep: its settings frozen at the reference θ, whether it has an
// analytic dD/dθ, and the evaluation of one (θ, measure) cell. Internal to the sweep engine.
#pragma once

#include <Eigen/Core>
#include <memory>
#include <nlohmann/json.hpp>
#include <string>

#include "cloud/cloud.h"
#include "measures/measure.h"

namespace barrow {

struct SweepCell {
  double value = NAN;             // +inf allowed; NaN when failed or not computed
  Status status = Status::Cancelled;  // Cancelled until computed
  double slope = NAN;             // analytic dD/dθ when `analyticSlope`
  bool analyticSlope = false;
  bool oneSided = false;          // "plan_unique": false
  double seconds = 0.0;
  double accuracy = 0.0;          // the value's stated absolute accuracy (details "value_accuracy")
  std::string message;            // the measure's note when it failed or did not converge
};

class SweepJob {
 public:
  /// Resolves `user` for `m`, freezes data-dependent settings on (a0, b) — A at the reference
  /// θ — and probes there once with the plan requested to learn whether gradientA() answers.
  /// `wantAnalytic` false (the caller's choice, or a family without velocity) skips the probe
  /// for gradients. Never throws; a failure is kept in setupError().
  SweepJob(const Measure& m, const ParamSet& user, const Cloud& a0, const Cloud& b,
           bool wantAnalytic, const RunControl* control);

  const Measure& measure() const { return *m_; }
  const ParamSet& frozen() const { return frozen_; }
  /// The settings freezing replaced, as the user gave them ("auto", "median", ...).
  const ParamSet& rules() const { return rules_; }
  bool analytic() const { return analytic_; }
  const std::string& setupError() const { return setupError_; }
  const nlohmann::json& referenceDetails() const { return details_; }

  /// D(A_θ, B), and dD/dθ = Σ_i ⟨∇_{x_i}D, v_i⟩ when analytic() and `velocity` matches A_θ.
  SweepCell evaluate(const Cloud& at, const Cloud& b, const Eigen::MatrixX2d& velocity,
                     std::shared_ptr<WarmState>* warm, const RunControl* control) const;

 private:
  const Measure* m_;
  ParamSet frozen_;
  ParamSet rules_;
  bool analytic_ = false;
  std::string setupError_;
  nlohmann::json details_ = nlohmann::json::object();
};

}  // namespace barrow
