#include "measures/measure_json.h"

#include <cmath>

#include "measures/units.h"

namespace barrow {

nlohmann::json measureRowJson(const Measure& m, const Result& r, const ParamSet& params) {
  nlohmann::json row = {{"id", m.id()},
                        {"name", m.displayName()},
                        {"value", std::isfinite(r.value) ? nlohmann::json(r.value) : nlohmann::json()},
                        {"unit", measureUnit(m, params)},
                        {"status", statusName(r.status)},
                        {"seconds", r.seconds},
                        {"iterations", r.iterations},
                        {"details", r.details}};
  if (r.status == Status::Bracketed) {  // certified bounds (DEVELOPERS.md, Command-line contract)
    row["low"] = std::isfinite(r.low) ? nlohmann::json(r.low) : nlohmann::json();
    row["high"] = std::isfinite(r.high) ? nlohmann::json(r.high) : nlohmann::json();
  }
  if (!r.message.empty()) row["message"] = r.message;
  return row;
}

}  // namespace barrow
