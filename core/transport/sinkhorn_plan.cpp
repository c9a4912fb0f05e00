#include "transport/sinkhorn_plan.h"

#include <algorithm>
#include <cmath>
#include <memory>

#include "transport/kernel_pass.h"

namespace barrow {

namespace {

// Column terms h_j = g_j/ε + log b_j and row offsets o_i = −(f_i/ε + log a_i), so that
// exp(h_j − c̃_ij − o_i) is the plan entry P_ij.
struct PlanTerms {
  std::vector<double> h, o;
  PlanTerms(const Eigen::VectorXd& a, const Eigen::VectorXd& b, const Eigen::VectorXd& f,
            const Eigen::VectorXd& g, double epsilon)
      : h(kernel::paddedLogWeights(b)), o(a.size()) {
    for (Eigen::Index j = 0; j < b.size(); ++j) h[j] += g(j) / epsilon;
    for (Eigen::Index i = 0; i < a.size(); ++i)
      o[i] = a(i) > 0 ? -(f(i) / epsilon + std::log(a(i))) : INFINITY;
  }
};

kernel::RowWorkers& teamOf(kernel::RowWorkers* given, std::unique_ptr<kernel::RowWorkers>& own) {
  if (given) return *given;
  own = std::make_unique<kernel::RowWorkers>();
  return *own;
}

}  // namespace

EntropicPlan entropicPlan(const Eigen::MatrixX2d& x, const Eigen::VectorXd& a, const Eigen::MatrixX2d& y,
                          const Eigen::VectorXd& b, const Eigen::VectorXd& f, const Eigen::VectorXd& g,
                          double epsilon, int p, int maxEntries, double threshold,
                          kernel::RowWorkers* workers) {
  const int n = int(x.rows());
  const double scale = kernel::scaleFor(p, epsilon);
  const kernel::ScaledPoints xs(x, scale), ys(y, scale);
  const PlanTerms t(a, b, f, g, epsilon);
  const std::size_t perRow = std::size_t(std::max(1, maxEntries / std::max(1, n)));
  std::vector<std::vector<PlanEntry>> rows(n);
  std::vector<char> cut(n, 0);
  std::unique_ptr<kernel::RowWorkers> own;
  teamOf(workers, own).run(n, std::max(1, kernel::grainFor(n, ys.size) / 4), [&](int begin, int end) {
    std::vector<double> buf(ys.padded());
    for (int i = begin; i < end; ++i) {
      if (!std::isfinite(t.o[i])) continue;  // no mass on this row
      kernel::kernelRow(xs, i, ys, t.h, p, t.o[i], buf.data());
      auto& row = rows[i];
      for (int j = 0; j < ys.size; ++j)
        if (buf[j] > threshold) row.push_back({i, j, buf[j]});
      if (row.size() > perRow) {
        std::nth_element(row.begin(), row.begin() + perRow, row.end(),
                         [](const PlanEntry& u, const PlanEntry& v) { return u.mass > v.mass; });
        row.resize(perRow);
        std::sort(row.begin(), row.end(), [](const PlanEntry& u, const PlanEntry& v) { return u.j < v.j; });
        cut[i] = 1;
      }
    }
  });
  EntropicPlan plan;
  for (int i = 0; i < n; ++i) {
    for (const auto& e : rows[i]) plan.keptMass += e.mass;
    plan.entries.insert(plan.entries.end(), rows[i].begin(), rows[i].end());
    plan.truncated = plan.truncated || cut[i];
  }
  return plan;
}

Eigen::MatrixX2d entropicGradient(const Eigen::MatrixX2d& x, const Eigen::VectorXd& a,
                                  const Eigen::MatrixX2d& y, const Eigen::VectorXd& b,
                                  const Eigen::VectorXd& f, const Eigen::VectorXd& g, double epsilon,
                                  int p, kernel::RowWorkers* workers) {
  const int n = int(x.rows());
  const double scale = kernel::scaleFor(p, epsilon);
  const kernel::ScaledPoints xs(x, scale), ys(y, scale);
  const PlanTerms t(a, b, f, g, epsilon);
  std::vector<double> s0(n), sx(n), sy(n);
  std::unique_ptr<kernel::RowWorkers> own;
  kernel::gradientRows(xs, ys, t.h, p, t.o.data(), s0.data(), sx.data(), sy.data(), teamOf(workers, own));
  // Scaled differences are (x − y)·scale; 2(x − y) = 2·d̃/scale for p = 2; unit vectors as is.
  const double toCost = p == 2 ? 2.0 / scale : 1.0;
  Eigen::MatrixX2d grad(n, 2);
  for (int i = 0; i < n; ++i) grad.row(i) << toCost * sx[i], toCost * sy[i];
  return grad;
}

}  // namespace barrow
