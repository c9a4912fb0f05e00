#include "transport/exact_problem.h"

#include <algorithm>
#include <cmath>
#include <numeric>

namespace barrow {

std::vector<std::int64_t> quantizeMasses(const Eigen::VectorXd& w, std::int64_t target) {
  long double total = 0;
  for (Eigen::Index i = 0; i < w.size(); ++i) total += w(i) > 0 ? (long double)w(i) : 0.0L;
  std::vector<std::int64_t> q(std::size_t(w.size()), 0);
  std::vector<int> positive;
  std::int64_t sum = 0;
  for (Eigen::Index i = 0; i < w.size(); ++i) {
    if (!(w(i) > 0)) continue;
    const long double share = (long double)w(i) / total * (long double)target;
    q[std::size_t(i)] = std::max<std::int64_t>(1, std::llround(share));
    sum += q[std::size_t(i)];
    positive.push_back(int(i));
  }
  // The rounding residue (about one unit per point) goes to the largest masses, one unit
  // each in turn, so no mass moves by more than a unit or two; none drops below one unit.
  std::stable_sort(positive.begin(), positive.end(), [&](int x, int y) { return q[std::size_t(x)] > q[std::size_t(y)]; });
  std::int64_t residue = target - sum;
  const std::int64_t step = residue > 0 ? 1 : -1;
  for (std::size_t t = 0; residue != 0; t = (t + 1) % positive.size()) {
    std::int64_t& qi = q[std::size_t(positive[t])];
    if (step < 0 && qi <= 1) continue;
    qi += step;
    residue -= step;
  }
  return q;
}

ExactProblem makeExactProblem(const Cloud& a, const Cloud& b, double p) {
  ExactProblem pr;
  pr.cost = GroundCost(p);
  const std::int64_t na = (a.weights.array() > 0).count(), nb = (b.weights.array() > 0).count();
  const std::int64_t common = std::lcm(na, nb);
  pr.total = common <= (std::int64_t(1) << 40) ? kMassTotal / common * common : kMassTotal;
  auto take = [&pr](const Cloud& c, Eigen::ArrayXd& x, Eigen::ArrayXd& y, std::vector<std::int64_t>& mass,
                    std::vector<int>& rows) {
    const auto all = quantizeMasses(c.weights, pr.total);
    for (Eigen::Index i = 0; i < c.size(); ++i)
      if (all[std::size_t(i)] > 0) rows.push_back(int(i));
    x.resize(Eigen::Index(rows.size()));
    y.resize(Eigen::Index(rows.size()));
    for (std::size_t k = 0; k < rows.size(); ++k) {
      x(Eigen::Index(k)) = c.points(rows[k], 0);
      y(Eigen::Index(k)) = c.points(rows[k], 1);
      mass.push_back(all[std::size_t(rows[k])]);
    }
  };
  take(a, pr.ax, pr.ay, pr.massA, pr.rowA);
  take(b, pr.bx, pr.by, pr.massB, pr.rowB);
  return pr;
}

double ExactProblem::scale() const {
  const double x0 = std::min(ax.minCoeff(), bx.minCoeff()), x1 = std::max(ax.maxCoeff(), bx.maxCoeff());
  const double y0 = std::min(ay.minCoeff(), by.minCoeff()), y1 = std::max(ay.maxCoeff(), by.maxCoeff());
  return cost(x0, y0, x1, y1);
}

}  // namespace barrow
