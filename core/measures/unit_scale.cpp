#include "measures/unit_scale.h"

#include <algorithm>
#include <cmath>

#include "measures/units.h"

namespace barrow {

double extremeCoordinateUnit(const Cloud& a, const Cloud& b) {
  double largest = 0.0;
  for (const Cloud* c : {&a, &b})
    if (c->size() > 0) largest = std::max(largest, c->points.cwiseAbs().maxCoeff());
  if (!(largest > 0) || !std::isfinite(largest)) return 1.0;
  if (largest >= 0x1p-60 && largest <= 0x1p60) return 1.0;
  return std::ldexp(1.0, std::ilogb(largest));
}

Cloud dividedBy(const Cloud& c, double unit) {
  Cloud out = c;
  out.points /= unit;
  return out;
}

std::optional<Result> evaluateAtUnitScale(const Measure& m, const Cloud& a, const Cloud& b, const EvalContext& ctx,
                                          std::initializer_list<std::pair<const char*, int>> detailDegrees) {
  const double unit = extremeCoordinateUnit(a, b);
  if (unit == 1.0) return std::nullopt;
  const std::optional<double> degree = lengthExponent(m.unit(ctx.params));
  if (!degree) return Result::invalid(m.id() + ": its value is not a power of length, so it cannot be rescaled");
  const double valueDegree = *degree;
  EvalContext inner = ctx;
  inner.warm = nullptr;
  Result r = m.evaluate(dividedBy(a, unit), dividedBy(b, unit), inner);
  if (!r.usable()) return r;
  // Multiplying back can overflow (a true value beyond 1.8e308) or underflow: say so.
  const double inUnits = r.value;
  r.value *= std::pow(unit, valueDegree);
  r.low *= std::pow(unit, valueDegree);   // a bracket's bounds (NaN otherwise) scale with the value
  r.high *= std::pow(unit, valueDegree);
  if (r.status == Status::Ok && !std::isfinite(r.value))
    return Result::invalid("the value " + std::to_string(inUnits) + " x 2^" +
                           std::to_string(valueDegree * std::ilogb(unit)) + " is beyond the range of a double");
  for (const auto& [key, degree] : detailDegrees)
    if (r.details.contains(key) && r.details[key].is_number())
      r.details[key] = r.details[key].get<double>() * std::pow(unit, degree);
  r.details["coordinate_unit"] = unit;
  r.details["coordinate_unit_note"] =
      "computed on coordinates divided by this power of two (exact), to keep squared distances "
      "from under- or overflowing; other details are in those units";
  if (r.u.size() > 0 || r.v.size() > 0) {  // potentials are in cost units, dropped rather than rescaled
    r.u.resize(0);
    r.v.resize(0);
  }
  return r;
}

}  // namespace barrow
