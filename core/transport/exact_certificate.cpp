#include "transport/exact_certificate.h"

#include <algorithm>
#include <cmath>
#include <cstdio>

#include "transport/exact_cost.h"

namespace barrow {

TransportCertificate certifyTransport(const Cloud& a, const Cloud& b, double p, const std::vector<PlanEntry>& plan,
                                      const Eigen::VectorXd& u, const Eigen::VectorXd& v) {
  TransportCertificate t;
  t.n = a.size();
  t.m = b.size();
  if (u.size() != a.size() || v.size() != b.size() || a.empty() || b.empty()) return t;
  const GroundCost cost(p);
  Eigen::MatrixX2d all(a.size() + b.size(), 2);
  all << a.points, b.points;
  const Eigen::RowVector2d lo = all.colwise().minCoeff(), hi = all.colwise().maxCoeff();
  t.costScale = cost(lo(0), lo(1), hi(0), hi(1));
  auto c = [&](int i, int j) { return cost(a.points(i, 0), a.points(i, 1), b.points(j, 0), b.points(j, 1)); };
  const Eigen::VectorXd wa = a.normalizedWeights(), wb = b.normalizedWeights();
  Eigen::VectorXd rows = Eigen::VectorXd::Zero(a.size()), cols = Eigen::VectorXd::Zero(b.size());
  for (const auto& e : plan) {
    if (e.i < 0 || e.i >= a.size() || e.j < 0 || e.j >= b.size() || !std::isfinite(e.mass) || e.mass < 0) return t;
    rows(e.i) += e.mass;
    cols(e.j) += e.mass;
    if (e.mass > 0) {
      ++t.support;
      t.primal += e.mass * c(e.i, e.j);
      t.slackness = std::max(t.slackness, std::abs(c(e.i, e.j) - u(e.i) - v(e.j)));
    }
  }
  t.wellFormed = true;
  auto marginal = [&](const Eigen::VectorXd& got, const Eigen::VectorXd& want) {
    for (Eigen::Index k = 0; k < want.size(); ++k) {
      const double err = std::abs(got(k) - want(k));
      t.marginalError = std::max(t.marginalError, err);
      t.marginalRelError = std::max(t.marginalRelError, want(k) > 0 ? err / want(k) : err);
    }
  };
  marginal(rows, wa);
  marginal(cols, wb);
  t.dual = wa.dot(u) + wb.dot(v);
  t.dualViolation = -INFINITY;
  for (Eigen::Index i = 0; i < a.size(); ++i)
    for (Eigen::Index j = 0; j < b.size(); ++j)
      t.dualViolation = std::max(t.dualViolation, u(i) + v(j) - c(int(i), int(j)));
  return t;
}

std::string certificateFailure(const TransportCertificate& t, double relTol) {
  const double costScale = t.costScale;
  auto say = [](const char* what, double got, double limit) {
    char buf[128];
    std::snprintf(buf, sizeof buf, "%s %.3g exceeds %.3g", what, got, limit);
    return std::string(buf);
  };
  if (!t.wellFormed) return "plan or potentials are malformed";
  if (t.marginalRelError > relTol) return say("marginal error", t.marginalRelError, relTol);
  if (t.dualViolation > relTol * costScale) return say("dual violation", t.dualViolation, relTol * costScale);
  if (t.slackness > 10 * relTol * costScale) return say("slackness", t.slackness, 10 * relTol * costScale);
  const double gap = std::abs(t.primal - t.dual);
  if (gap > 10 * relTol * costScale) return say("duality gap", gap, 10 * relTol * costScale);
  if (t.support > t.n + t.m - 1) return "support of " + std::to_string(t.support) + " exceeds n + m - 1";
  return {};
}

}  // namespace barrow
