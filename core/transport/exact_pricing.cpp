#include "transport/exact_pricing.h"

#include <algorithm>

namespace barrow {
namespace {

using ArrayRef = Eigen::Ref<const Eigen::ArrayXd>;

// c(x, y_j) − v_j for all j, as an Eigen expression (vectorised, evaluated lazily).
template <class Fn>
decltype(auto) withReduced(double x, double y, const ArrayRef& sx, const ArrayRef& sy, const ArrayRef& v,
                           const GroundCost& cost, Fn&& fn) {
  const auto d2 = (sx - x).square() + (sy - y).square();
  switch (cost.kind()) {
    case CostKind::Distance: return fn(d2.sqrt() - v);
    case CostKind::Squared: return fn(d2 - v);
    case CostKind::Power: break;
  }
  return fn(d2.pow(0.5 * cost.p()) - v);
}

}  // namespace

double cTransformAt(double x, double y, const ArrayRef& sx, const ArrayRef& sy, const ArrayRef& v,
                    const GroundCost& cost) {
  return withReduced(x, y, sx, sy, v, cost, [](const auto& e) { return e.minCoeff(); });
}

bool priceAllPairs(const ExactProblem& pr, const Eigen::ArrayXd& u, const Eigen::ArrayXd& v, double tol,
                   int perRow, std::vector<std::pair<int, int>>* violated, const RunControl* control,
                   double progress) {
  Eigen::ArrayXd row(pr.m());
  std::vector<int> hits;
  for (int i = 0; i < pr.n(); ++i) {
    if ((i & 255) == 255 && control && control->shouldStop(progress)) return false;
    const double x = pr.ax(i), y = pr.ay(i);
    const double best = cTransformAt(x, y, pr.bx, pr.by, v, pr.cost);
    if (!(best - u(i) < -tol)) continue;
    withReduced(x, y, pr.bx, pr.by, v, pr.cost, [&](const auto& e) { row = e; return 0; });
    const double limit = u(i) - tol;
    hits.clear();
    for (int j = 0; j < pr.m(); ++j)
      if (row(j) < limit) hits.push_back(j);
    if (int(hits.size()) > perRow) {
      std::nth_element(hits.begin(), hits.begin() + perRow, hits.end(),
                       [&](int p, int q) { return row(p) < row(q); });
      hits.resize(std::size_t(perRow));
    }
    for (int j : hits) violated->emplace_back(i, j);
  }
  return true;
}

void cTransformSources(const ExactProblem& pr, const Eigen::ArrayXd& v, double zeroTol, Eigen::ArrayXd* u,
                       std::vector<int>* ties) {
  Eigen::ArrayXd row(pr.m());
  u->resize(pr.n());
  ties->assign(std::size_t(pr.n()), 0);
  for (int i = 0; i < pr.n(); ++i) {
    withReduced(pr.ax(i), pr.ay(i), pr.bx, pr.by, v, pr.cost, [&](const auto& e) { row = e; return 0; });
    const double best = row.minCoeff();
    (*u)(i) = best;
    (*ties)[std::size_t(i)] = int((row <= best + zeroTol).count());
  }
}

}  // namespace barrow
