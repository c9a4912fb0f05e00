// The common interface of every measure (id, name, formula, parameters, evaluate).
#pragma once

#include <Eigen/Core>
#include <memory>
#include <optional>
#include <string>
#include <vector>

#include "base/params.h"
#include "base/run_control.h"
#include "base/warm_state.h"
#include "cloud/cloud.h"
#include "measures/result.h"

namespace barrow {

struct EvalContext {
  /// Every parameter of the measure, defaults filled in and validated (see evaluateMeasure).
  ParamSet params;
  const RunControl* control = nullptr;
  /// Slot for warm-start state; null means "no warm start". The measure may read it (when
  /// the state fits the current sizes) and should overwrite it with its final state.
  std::shared_ptr<WarmState>* warm = nullptr;
  /// Fill Result::plan / potentials when the measure has them (costs time for some).
  bool wantPlan = false;

  bool shouldStop(double fraction = -1.0) const { return control && control->shouldStop(fraction); }
  /// Threads the measure may keep busy, row teams included (the control's budget).
  int threads() const { return threadBudget(control); }
};

class Measure {
 public:
  virtual ~Measure() = default;

  virtual std::string id() const = 0;           // "w1", "js", ...
  virtual std::string displayName() const = 0;  // "Wasserstein-1 (exact)"
  virtual std::string formula() const = 0;      // one line of plain text
  /// Parameter specs with full keys (groups may be shared, e.g. density.*).
  virtual std::vector<ParamSpec> params() const { return {}; }
  /// Unit of the value under resolved parameters: "length", "length^2", "nats", ...
  /// (measures/units.h). Every measure states it; the empty default fails the registry test.
  virtual std::string unit(const ParamSet& resolved) const {
    (void)resolved;
    return {};
  }
  /// One line deriving the unit from the definition (shown by --help).
  virtual std::string unitRule() const { return {}; }
  /// True when the value is known to be cheap to recompute (for live updates while dragging).
  virtual bool cheap() const { return true; }
  /// True when the value depends only on the weighted empirical measure, so a cloud with a
  /// point repeated k times may be given as that point once with k times the weight (the
  /// resampling loops then solve smaller problems). False for estimators that count points
  /// (kNN densities, the unbiased MMD's diagonal), and by default.
  virtual bool repeatsMayMerge() const { return false; }
  /// True when the measure runs when the user names none (CLI without --measures, a sweep
  /// without a list, the window's Measures table). Slow opt-in measures return false.
  virtual bool inDefaultSet() const { return true; }

  /// Evaluates D(A, B). Pre: both clouds validated, ctx.params resolved and valid.
  /// Must not throw for bad data: return Result::invalid(reason) instead.
  virtual Result evaluate(const Cloud& a, const Cloud& b, const EvalContext& ctx) const = 0;

  /// Replaces data-dependent settings ("median", "auto", ...) by the numbers they resolve to
  /// on (a, b), so that a sweep keeps them fixed. Default: nothing data-dependent.
  virtual ParamSet freeze(const Cloud& a, const Cloud& b, const ParamSet& resolved) const {
    (void)a; (void)b;
    return resolved;
  }

  /// dD/dx_i for each point of A (n x 2), when the theory gives it in closed form
  /// (e.g. through the optimal plan, by the envelope theorem). `r` is evaluate()'s result on
  /// the same input, computed with wantPlan = gradientNeedsPlan(). nullopt: no analytic
  /// gradient here.
  /// True when gradientA() reads Result::plan (a sweep then asks evaluate() for the plan at
  /// every θ; building a dense entropic plan there would be wasted work).
  virtual bool gradientNeedsPlan() const { return false; }

  virtual std::optional<Eigen::MatrixX2d> gradientA(const Cloud& a, const Cloud& b,
                                                    const EvalContext& ctx, const Result& r) const {
    (void)a; (void)b; (void)ctx; (void)r;
    return std::nullopt;
  }
};

}  // namespace barrow
