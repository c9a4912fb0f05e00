#include "measures/evaluate.h"

#include <chrono>
#include <exception>

namespace barrow {

ParamSet resolveParams(const Measure& m, const ParamSet& user, std::string* error) {
  return user.resolved(m.params(), error);
}

Result evaluateMeasure(const Measure& m, const Cloud& a, const Cloud& b, const EvalRequest& req) {
  const auto start = std::chrono::steady_clock::now();
  Result r;
  if (auto e = a.validate()) {
    r = Result::invalid("A: " + *e);
  } else if (auto e2 = b.validate()) {
    r = Result::invalid("B: " + *e2);
  } else {
    std::string error;
    EvalContext ctx;
    ctx.params = resolveParams(m, req.params, &error);
    ctx.control = req.control;
    ctx.warm = req.warm;
    ctx.wantPlan = req.wantPlan;
    if (!error.empty()) {
      r = Result::invalid(error);
    } else {
      try {
        r = m.evaluate(a, b, ctx);
      } catch (const std::exception& ex) {
        r = Result::invalid(m.id() + ": " + ex.what());
      }
    }
  }
  r.seconds = std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
  return r;
}

}  // namespace barrow
