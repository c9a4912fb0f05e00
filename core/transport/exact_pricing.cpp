#include "transport/exact_pricing.h"

namespace barrow {

double cTransformAt(double x, double y, const Eigen::Ref<const Eigen::ArrayXd>& sx,
                    const Eigen::Ref<const Eigen::ArrayXd>& sy, const Eigen::Ref<const Eigen::ArrayXd>& v,
                    const GroundCost& cost) {
  const auto d2 = (sx - x).square() + (sy - y).square();
  switch (cost.kind()) {
    case CostKind::Distance: return (d2.sqrt() - v).minCoeff();
    case CostKind::Squared: return (d2 - v).minCoeff();
    case CostKind::Power: break;
  }
  return (d2.pow(0.5 * cost.p()) - v).minCoeff();
}

bool priceAllPairs(const ExactProblem& pr, SiteTree& sinks, const Eigen::ArrayXd& u, const Eigen::ArrayXd& v,
                   double tol, int perRow, std::vector<std::pair<int, int>>* violated, const RunControl* control,
                   double progress) {
  sinks.setPotentials(v);
  std::vector<std::pair<double, int>> hits;
  for (int i = 0; i < pr.n(); ++i) {
    if ((i & 255) == 255 && control && control->shouldStop(progress)) return false;
    sinks.below(pr.ax(i), pr.ay(i), u(i) - tol, perRow, &hits);
    for (const auto& [score, j] : hits) violated->emplace_back(i, j);
  }
  return true;
}

void cTransformSources(const ExactProblem& pr, SiteTree& sinks, const Eigen::ArrayXd& v, double zeroTol,
                       Eigen::ArrayXd* u, std::vector<int>* ties) {
  sinks.setPotentials(v);
  u->resize(pr.n());
  ties->assign(std::size_t(pr.n()), 0);
  for (int i = 0; i < pr.n(); ++i) (*u)(i) = sinks.minScore(pr.ax(i), pr.ay(i), zeroTol, &(*ties)[std::size_t(i)]);
}

}  // namespace barrow
