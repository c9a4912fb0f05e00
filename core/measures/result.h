// What one evaluation of a measure returns.
#pragma once

#include <Eigen/Core>
#include <cmath>
#include <nlohmann/json.hpp>
#include <string>
#include <vector>

#include "base/plan_entry.h"
#include "base/status.h"

namespace barrow {

struct Result {
  Status status = Status::InvalidInput;
  double value = NAN;                    // as defined in DEVELOPERS.md, Measure conventions; +inf when Infinite
  double low = NAN, high = NAN;          // Bracketed: certified bounds, low <= true value <= high
  std::string message = "evaluate was not called";
  std::vector<PlanEntry> plan;           // optional (transport measures)
  Eigen::VectorXd u, v;                  // optional dual potentials on A and on B
  int iterations = 0;
  double seconds = 0.0;                  // wall time of evaluate()
  /// Settings actually used and diagnostics, shown by the CLI (JSON) and the GUI:
  /// e.g. {"estimator":"hist","bin":0.25}, {"epsilon":0.01,"marginal_error":3e-10}.
  nlohmann::json details = nlohmann::json::object();

  bool usable() const { return barrow::usable(status); }
  static Result invalid(std::string why) {
    Result r;
    r.message = std::move(why);
    return r;
  }
  /// A computation stopped through RunControl; `message` says which, when known.
  static Result cancelled(std::string message = "cancelled") {
    Result r;
    r.status = Status::Cancelled;
    r.message = std::move(message);
    return r;
  }
  static Result ok(double value) {
    Result r;
    r.status = std::isinf(value) ? Status::Infinite : Status::Ok;
    r.value = value;
    r.message.clear();
    return r;
  }
  /// A certified bracket: status Bracketed, value the midpoint (the caller's details say so).
  static Result bracketed(double low, double high) {
    Result r;
    r.status = Status::Bracketed;
    r.low = low;
    r.high = high;
    r.value = 0.5 * (low + high);
    r.message.clear();
    return r;
  }
};

}  // namespace barrow
