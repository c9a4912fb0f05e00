// `entropic`: entropic OT cost OT_ε(A, B) = min ⟨P,C⟩ + ε KL(P ‖ a⊗b), C = |x − y|^p
// (convention (i) of REFERENCES.md "Sinkhorn", so OT ≤ OT_ε ≤ OT + ε·min(H(a), H(b))),
// reported as the dual objective of log-domain Sinkhorn (Cuturi 2013, NIPS; Peyré & Cuturi
// 2019, Sec. 4.4). Also the settings shared with `sinkhorn` (same keys under its group).
#pragma once

#include <string>
#include <vector>

#include "measures/measure.h"
#include "measures/units.h"
#include "transport/sinkhorn_solver.h"

namespace barrow {

/// Parameter specs <group>.epsilon, .p, .max_iterations, .tolerance, .exact_limit,
/// .representatives.
std::vector<ParamSpec> entropicParamSpecs(const std::string& group);

/// The settings one evaluation uses, read from resolved parameters.
struct EntropicSettings {
  SinkhornOptions options;
  double diameter = 0.0;         // joint diameter D of A and B
  bool automatic = false;        // ε came from the "auto" rule (D/20)^p
  double costBound = 0.0;        // (bounding-box diagonal)^p: no cost |x − y|^p exceeds it
  long long exactLimit = 0;      // larger clouds (points of positive weight) are bracketed
  long long representatives = 0; // bracket mode: points per quantised cloud (entropic_bracket.h)
  /// Reason the settings are unusable (e.g. "auto" on two identical single points).
  std::string error;
};

/// Reads <group>.* and resolves ε = "auto" to (D/20)^p on (a, b).
EntropicSettings readEntropicSettings(const std::string& group, const ParamSet& params, const Cloud& a,
                                      const Cloud& b);
/// "auto" replaced by its number on (a, b), for sweeps.
ParamSet freezeEntropic(const std::string& group, const Cloud& a, const Cloud& b, const ParamSet& resolved);
/// length^p for the ground cost |x-y|^p of <group>.p: <P,C> is in cost units and so is
/// eps·KL (eps is absolute, in cost units; KL is a pure number).
inline std::string entropicUnit(const std::string& group, const ParamSet& resolved) {
  return lengthPower(resolved.has(group + ".p") ? resolved.integer(group + ".p") : 2);
}
inline constexpr const char* kEntropicUnitRule =
    "length^p with p = <group>.p (length^2 by default): <P,C> is in cost units, |x-y|^p, and so "
    "is eps*KL (eps absolute, in cost units; KL a pure number)";

/// Details every entropic result carries: ε (absolute and relative to D^p), p, tolerance...
nlohmann::json entropicDetails(const EntropicSettings& s);
/// True when a cloud has more points of positive weight than s.exactLimit: the value is
/// then a certified bracket (entropic_bracket.h).
bool entropicBrackets(const EntropicSettings& s, const Cloud& a, const Cloud& b);
/// Adds a solve's diagnostics under `prefix` (e.g. "" or "ab_").
void addSolveDetails(nlohmann::json& d, const std::string& prefix, const SinkhornResult& r);

class EntropicMeasure : public Measure {
 public:
  std::string id() const override { return "entropic"; }
  std::string displayName() const override { return "Entropic OT cost"; }
  std::string formula() const override { return "OT_eps = min_P <P,C> + eps*KL(P | a x b), C = |x-y|^p"; }
  std::vector<ParamSpec> params() const override { return entropicParamSpecs("entropic"); }
  std::string unit(const ParamSet& resolved) const override { return entropicUnit("entropic", resolved); }
  std::string unitRule() const override { return kEntropicUnitRule; }
  bool cheap() const override { return false; }

  Result evaluate(const Cloud& a, const Cloud& b, const EvalContext& ctx) const override;
  ParamSet freeze(const Cloud& a, const Cloud& b, const ParamSet& resolved) const override {
    return freezeEntropic("entropic", a, b, resolved);
  }
  /// Σ_j P_ij ∇_x c(x_i, y_j) from the potentials in r (envelope theorem on the dual).
  std::optional<Eigen::MatrixX2d> gradientA(const Cloud& a, const Cloud& b, const EvalContext& ctx,
                                            const Result& r) const override;
};

}  // namespace barrow
