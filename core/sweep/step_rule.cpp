#include "sweep/step_rule.h"

#include <algorithm>
#include <cmath>

namespace barrow {

double finiteRange(const std::vector<double>& value) {
  double lo = INFINITY, hi = -INFINITY;
  for (double v : value)
    if (std::isfinite(v)) {
      lo = std::min(lo, v);
      hi = std::max(hi, v);
    }
  return hi >= lo ? hi - lo : 0.0;
}

namespace {

// The noise floor of a step: a share of the curve's range, never below rounding of its size.
double stepFloor(const std::vector<double>& value, const StepRule& rule) {
  double maxAbs = 0.0;
  for (double v : value)
    if (std::isfinite(v)) maxAbs = std::max(maxAbs, std::abs(v));
  return std::max(rule.floor * finiteRange(value), 1e-12 * std::max(1.0, maxAbs));
}

}  // namespace

std::vector<StepInterval> classifySteps(const std::vector<double>& theta,
                                        const std::vector<double>& value, const StepRule& rule) {
  std::vector<StepInterval> out;
  std::size_t prev = value.size();
  for (std::size_t k = 0; k < value.size(); ++k) {
    if (std::isnan(value[k])) continue;
    if (prev != value.size()) out.push_back({prev, k, value[k] - value[prev], false});
    prev = k;
  }

  // The absolute part keeps rounding noise of a constant curve from counting as a step.
  const double floor = stepFloor(value, rule);

  // Secant slopes of the finite intervals; NaN marks an interval with an infinite end.
  std::vector<double> slope(out.size(), NAN);
  for (std::size_t k = 0; k < out.size(); ++k)
    if (std::isfinite(out[k].step))
      slope[k] = std::abs(out[k].step) / (theta[out[k].right] - theta[out[k].left]);

  std::vector<double> near;
  for (std::size_t k = 0; k < out.size(); ++k) {
    StepInterval& s = out[k];
    const bool leftInf = std::isinf(value[s.left]), rightInf = std::isinf(value[s.right]);
    if (leftInf || rightInf) {
      s.jumpLike = leftInf != rightInf;
      continue;
    }
    if (!(std::abs(s.step) > floor)) continue;
    near.clear();
    int taken = 0;
    for (std::size_t j = k; j-- > 0 && taken < rule.window;)
      if (!std::isnan(slope[j])) near.push_back(slope[j]), ++taken;
    taken = 0;
    for (std::size_t j = k + 1; j < out.size() && taken < rule.window; ++j)
      if (!std::isnan(slope[j])) near.push_back(slope[j]), ++taken;
    if (near.empty()) continue;  // a lone interval: no evidence either way
    const auto mid = near.begin() + std::ptrdiff_t(near.size() / 2);
    std::nth_element(near.begin(), mid, near.end());
    double median = *mid;
    if (near.size() % 2 == 0) median = 0.5 * (median + *std::max_element(near.begin(), mid));
    s.jumpLike = slope[k] > rule.factor * median;
  }
  return out;
}

std::vector<JudgedStep> judgeSteps(const std::vector<double>& theta, const std::vector<double>& value,
                                   const StepRule& rule, const JumpTest& test) {
  const std::vector<StepInterval> steps = classifySteps(theta, value, rule);
  const double floor = std::max(stepFloor(value, rule), 2.0 * test.accuracy);
  auto width = [&](const StepInterval& s) { return theta[s.right] - theta[s.left]; };
  std::vector<JudgedStep> out;
  for (std::size_t k = 0; k < steps.size(); ++k) {
    const StepInterval& s = steps[k];
    if (!s.jumpLike) {
      out.push_back({s, StepVerdict::Smooth});
      continue;
    }
    JudgedStep j{s, StepVerdict::Unresolved};
    // A relative slack so that a width computed as a difference of θ values still counts.
    if (!(test.resolution > 0) || width(s) > test.resolution * (1 + 1e-9)) {
      out.push_back(j);
      continue;
    }
    if (!std::isfinite(s.step)) {
      j.verdict = StepVerdict::Jump;
      out.push_back(j);
      continue;
    }
    if (!(std::abs(s.step) > floor)) {
      j.verdict = StepVerdict::Smooth;
      out.push_back(j);
      continue;
    }
    double local = -1.0;  // largest neighbouring secant slope; < 0: no neighbour
    int taken = 0;
    for (std::size_t i = k; i-- > 0 && taken < rule.window;)
      if (std::isfinite(steps[i].step)) local = std::max(local, std::abs(steps[i].step) / width(steps[i])), ++taken;
    taken = 0;
    for (std::size_t i = k + 1; i < steps.size() && taken < rule.window; ++i)
      if (std::isfinite(steps[i].step)) local = std::max(local, std::abs(steps[i].step) / width(steps[i])), ++taken;
    if (local >= 0)
      j.verdict = std::abs(s.step) > test.safety * local * width(s) ? StepVerdict::Jump : StepVerdict::Smooth;
    out.push_back(j);
  }
  return out;
}

}  // namespace barrow
