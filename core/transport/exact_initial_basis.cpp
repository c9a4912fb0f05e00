#include "transport/exact_initial_basis.h"

#include <Eigen/Eigenvalues>
#include <algorithm>
#include <numeric>

namespace barrow {
namespace {

// Indices of both sides sorted by their coordinate along the principal axis of all points.
void principalOrder(const ExactProblem& pr, std::vector<int>* orderA, std::vector<int>* orderB) {
  const double cnt = double(pr.n() + pr.m());
  const double mx = (pr.ax.sum() + pr.bx.sum()) / cnt, my = (pr.ay.sum() + pr.by.sum()) / cnt;
  Eigen::Matrix2d cov;
  cov(0, 0) = (pr.ax - mx).square().sum() + (pr.bx - mx).square().sum();
  cov(1, 1) = (pr.ay - my).square().sum() + (pr.by - my).square().sum();
  cov(0, 1) = cov(1, 0) = ((pr.ax - mx) * (pr.ay - my)).sum() + ((pr.bx - mx) * (pr.by - my)).sum();
  const Eigen::SelfAdjointEigenSolver<Eigen::Matrix2d> eig(cov);
  const Eigen::Vector2d axis = eig.eigenvectors().col(1);  // largest eigenvalue
  auto order = [&](const Eigen::ArrayXd& x, const Eigen::ArrayXd& y, std::vector<int>* out) {
    const Eigen::ArrayXd t = axis(0) * x + axis(1) * y;
    out->resize(std::size_t(x.size()));
    std::iota(out->begin(), out->end(), 0);
    std::stable_sort(out->begin(), out->end(), [&](int p, int q) { return t(p) < t(q); });
  };
  order(pr.ax, pr.ay, orderA);
  order(pr.bx, pr.by, orderB);
}

// North-west corner rule over the given orders, shipping what `remA`/`remB` still hold.
void northWestCorner(const std::vector<int>& orderA, const std::vector<int>& orderB,
                     std::vector<std::int64_t>& remA, std::vector<std::int64_t>& remB,
                     std::vector<FlowArc>* out) {
  std::size_t s = 0, t = 0;
  while (true) {
    while (s < orderA.size() && remA[std::size_t(orderA[s])] == 0) ++s;
    while (t < orderB.size() && remB[std::size_t(orderB[t])] == 0) ++t;
    if (s == orderA.size() || t == orderB.size()) break;
    const int i = orderA[s], j = orderB[t];
    const std::int64_t f = std::min(remA[std::size_t(i)], remB[std::size_t(j)]);
    out->push_back({i, j, f});
    remA[std::size_t(i)] -= f;
    remB[std::size_t(j)] -= f;
  }
}

}  // namespace

std::vector<FlowArc> northWestBasis(const ExactProblem& pr) {
  std::vector<int> orderA, orderB;
  principalOrder(pr, &orderA, &orderB);
  std::vector<std::int64_t> remA = pr.massA, remB = pr.massB;
  std::vector<FlowArc> out;
  out.reserve(std::size_t(pr.n() + pr.m()));
  northWestCorner(orderA, orderB, remA, remB, &out);
  return out;
}

std::vector<FlowArc> greedyBasis(const ExactProblem& pr, const std::vector<std::pair<int, int>>& arcs,
                                 std::vector<double> order) {
  if (order.size() != arcs.size()) {
    order.resize(arcs.size());
    for (std::size_t k = 0; k < arcs.size(); ++k) order[k] = pr.c(arcs[k].first, arcs[k].second);
  }
  std::vector<int> byCost(arcs.size());
  std::iota(byCost.begin(), byCost.end(), 0);
  std::sort(byCost.begin(), byCost.end(),
            [&](int p, int q) { return order[std::size_t(p)] < order[std::size_t(q)]; });

  std::vector<std::int64_t> remA = pr.massA, remB = pr.massB;
  std::vector<FlowArc> out;
  out.reserve(std::size_t(pr.n() + pr.m()));
  for (int k : byCost) {
    const auto [i, j] = arcs[std::size_t(k)];
    const std::int64_t f = std::min(remA[std::size_t(i)], remB[std::size_t(j)]);
    if (f == 0) continue;
    out.push_back({i, j, f});
    remA[std::size_t(i)] -= f;
    remB[std::size_t(j)] -= f;
  }
  std::vector<int> orderA, orderB;
  principalOrder(pr, &orderA, &orderB);
  northWestCorner(orderA, orderB, remA, remB, &out);
  return out;
}

}  // namespace barrow
