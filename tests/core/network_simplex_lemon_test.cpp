// The exact solver against LEMON's NetworkSimplex (Debian liblemon-dev, header-only use) on
// instances of 1000–2000 points per side, where the SciPy LP would be too slow. LEMON solves
// the complete bipartite graph with an explicit cost per arc, the way its users would.
#include <gtest/gtest.h>

#include <cmath>
#include <random>

#include "transport/exact_certificate.h"
#include "transport/exact_ot.h"

#ifdef BARROW_HAVE_LEMON
#include <lemon/network_simplex.h>
#include <lemon/smart_graph.h>
#endif

namespace barrow {
namespace {

#ifdef BARROW_HAVE_LEMON

// [CP] LEMON 1.3 NetworkSimplex (block search) as the reference optimum. Masses are scaled
// to integers summing to exactly 2^52 (largest remainder on the last row), so LEMON solves
// a balanced problem; the scaling moves the optimum by ~1e-13 relative at most.
double lemonOptimum(const Cloud& a, const Cloud& b, double p) {
  using Graph = lemon::SmartDigraph;
  Graph g;
  g.reserveNode(int(a.size() + b.size()));
  g.reserveArc(int(a.size() * b.size()));
  std::vector<Graph::Node> na, nb;
  for (Eigen::Index i = 0; i < a.size(); ++i) na.push_back(g.addNode());
  for (Eigen::Index j = 0; j < b.size(); ++j) nb.push_back(g.addNode());
  Graph::ArcMap<double> cost(g);
  for (Eigen::Index i = 0; i < a.size(); ++i)
    for (Eigen::Index j = 0; j < b.size(); ++j)
      cost[g.addArc(na[std::size_t(i)], nb[std::size_t(j)])] = std::pow((a.point(i) - b.point(j)).norm(), p);
  const double scale = std::ldexp(1.0, 52);
  Graph::NodeMap<long long> supply(g);
  auto fill = [&](const Cloud& c, const std::vector<Graph::Node>& nodes, long long sign) {
    const Eigen::VectorXd w = c.normalizedWeights();
    long long sum = 0;
    for (Eigen::Index i = 0; i + 1 < c.size(); ++i) {
      const long long q = std::llround(w(i) * scale);
      supply[nodes[std::size_t(i)]] = sign * q;
      sum += q;
    }
    supply[nodes.back()] = sign * ((1LL << 52) - sum);
  };
  fill(a, na, 1);
  fill(b, nb, -1);
  using Solver = lemon::NetworkSimplex<Graph, long long, double>;
  Solver ns(g);
  ns.costMap(cost).supplyMap(supply);
  EXPECT_EQ(ns.run(), Solver::OPTIMAL);
  return std::pow(ns.totalCost() / scale, 1.0 / p);
}

Cloud instance(int n, std::uint64_t seed, bool clustered, bool weighted) {
  std::mt19937_64 rng(seed);
  std::uniform_real_distribution<double> u(0.0, 1.0);
  std::normal_distribution<double> z(0.0, 0.07);
  Eigen::MatrixX2d p(n, 2);
  Eigen::VectorXd w = Eigen::VectorXd::Ones(n);
  for (int i = 0; i < n; ++i) {
    if (clustered) p.row(i) << (u(rng) < 0.3 ? 0.25 : 0.75) + z(rng), 0.5 + z(rng);
    else p.row(i) << u(rng), u(rng);
    if (weighted) w(i) = 0.1 + u(rng);
  }
  return Cloud("", p, w);
}

// [CP] LEMON as an outside oracle, relative agreement 1e-9, plus each solve's certificate.
TEST(NetworkSimplexLemonTest, LargeInstancesMatchLemon) {
  const struct {
    int n, m;
    bool clustered, weighted;
    double p;
  } cases[] = {
      {1000, 1200, false, true, 1.0},
      {1500, 1500, true, false, 2.0},
      {2000, 1800, true, true, 1.0},
      {2000, 2000, false, false, 2.0},
  };
  std::uint64_t seed = 41;
  for (const auto& c : cases) {
    const Cloud a = instance(c.n, ++seed, c.clustered, c.weighted);
    const Cloud b = instance(c.m, ++seed, false, c.weighted);
    ExactOtOptions o;
    o.p = c.p;
    const auto r = solveExactOt(a, b, o);
    ASSERT_EQ(r.status, ExactOtStatus::Optimal) << r.message;
    const double ref = lemonOptimum(a, b, c.p);
    EXPECT_NEAR(r.value, ref, 1e-9 * ref) << c.n << " x " << c.m << " p=" << c.p;
    EXPECT_EQ(certificateFailure(certifyTransport(a, b, c.p, r.plan, r.u, r.v)), "");
  }
}

#else

TEST(NetworkSimplexLemonTest, LargeInstancesMatchLemon) { GTEST_SKIP() << "LEMON (liblemon-dev) not found"; }

#endif

}  // namespace
}  // namespace barrow
