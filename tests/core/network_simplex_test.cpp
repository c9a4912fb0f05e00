// The exact transport solver on small hand-checkable problems, edge cases, bad input,
// cancellation, the pivot limit and warm starts. Every optimal solve is checked by its LP
// certificate (primal and dual feasibility, zero gap, complementary slackness).
#include <gtest/gtest.h>

#include <algorithm>
#include <atomic>
#include <cmath>
#include <numeric>
#include <random>

#include "transport/exact_certificate.h"
#include "transport/exact_ot.h"
#include "transport/exact_warm_state.h"
#include "transport/network_simplex.h"

namespace barrow {
namespace {

Cloud cloud(std::initializer_list<std::array<double, 2>> pts, std::vector<double> w = {}) {
  Eigen::MatrixX2d p(Eigen::Index(pts.size()), 2);
  Eigen::Index k = 0;
  for (const auto& q : pts) p.row(k++) << q[0], q[1];
  if (w.empty()) return Cloud("", p);
  return Cloud("", p, Eigen::Map<Eigen::VectorXd>(w.data(), Eigen::Index(w.size())));
}

Cloud randomCloud(int n, std::uint64_t seed, bool weighted, double spread = 1.0) {
  std::mt19937_64 rng(seed);
  std::uniform_real_distribution<double> u(0.0, 1.0);
  Eigen::MatrixX2d p(n, 2);
  Eigen::VectorXd w(n);
  for (int i = 0; i < n; ++i) {
    p.row(i) << spread * u(rng), spread * u(rng);
    w(i) = weighted ? 0.1 + u(rng) : 1.0;
  }
  return Cloud("", p, w);
}

// [P] LP duality for transport (Villani 2009, Thm 5.10 (mem)): feasible plan + feasible
// duals + zero gap = optimal.
void expectCertified(const Cloud& a, const Cloud& b, double p, const ExactOtResult& r) {
  ASSERT_EQ(r.status, ExactOtStatus::Optimal) << r.message;
  const auto t = certifyTransport(a, b, p, r.plan, r.u, r.v);
  EXPECT_EQ(certificateFailure(t), "");
  EXPECT_NEAR(t.primal, r.cost, 1e-13 * std::max(1.0, r.cost));
}

ExactOtOptions withP(double p) {
  ExactOtOptions o;
  o.p = p;
  return o;
}

// [D] Enumerating all 3! permutations of an equal-size uniform problem gives the optimum
// (Birkhoff: the LP optimum is attained at a permutation).
TEST(NetworkSimplexTest, ThreePointsMatchEnumeratedPermutations) {
  const Cloud a = cloud({{0, 0}, {2, 1}, {-1, 3}});
  const Cloud b = cloud({{1, 1}, {0, 4}, {3, -1}});
  for (double p : {1.0, 2.0, 3.0}) {
    std::array<int, 3> perm{0, 1, 2};
    double best = INFINITY;
    do {
      double c = 0;
      for (int i = 0; i < 3; ++i) c += std::pow((a.point(i) - b.point(perm[std::size_t(i)])).norm(), p) / 3;
      best = std::min(best, c);
    } while (std::next_permutation(perm.begin(), perm.end()));
    const auto r = solveExactOt(a, b, withP(p));
    expectCertified(a, b, p, r);
    EXPECT_NEAR(r.cost, best, 1e-14);
    EXPECT_NEAR(r.value, std::pow(best, 1.0 / p), 1e-14);
  }
}

// [D] With one point on a side the only coupling sends everything to (from) it.
TEST(NetworkSimplexTest, OnePointOnEitherSideHasTheOnlyCoupling) {
  const Cloud one = cloud({{0.5, -0.25}});
  const Cloud many = randomCloud(17, 3, true);
  const Eigen::VectorXd w = many.normalizedWeights();
  for (double p : {1.0, 2.0}) {
    double c = 0;
    for (Eigen::Index j = 0; j < many.size(); ++j) c += w(j) * std::pow((many.point(j) - one.point(0)).norm(), p);
    const auto r1 = solveExactOt(one, many, withP(p));
    const auto r2 = solveExactOt(many, one, withP(p));
    expectCertified(one, many, p, r1);
    expectCertified(many, one, p, r2);
    EXPECT_NEAR(r1.cost, c, 1e-14);
    EXPECT_NEAR(r2.cost, c, 1e-14);
    EXPECT_EQ(r1.plan.size(), 17u);
  }
  const auto r = solveExactOt(one, cloud({{3.5, 3.75}}));
  expectCertified(one, cloud({{3.5, 3.75}}), 1.0, r);
  EXPECT_NEAR(r.value, 5.0, 1e-15);  // [D] a 3-4-5 triangle
}

// [D] Identical clouds are at distance 0; coincident points (duplicates) change nothing.
TEST(NetworkSimplexTest, IdenticalAndCoincidentPointsGiveZero) {
  const Cloud a = cloud({{0, 0}, {0, 0}, {1, 2}, {1, 2}, {1, 2}, {-3, 0.5}}, {1, 2, 0.5, 0.5, 1, 3});
  for (double p : {1.0, 2.0}) {
    const auto r = solveExactOt(a, a, withP(p));
    expectCertified(a, a, p, r);
    EXPECT_EQ(r.value, 0.0);
  }
  // Everything in one place: the cost scale is 0 and every coupling is optimal.
  const Cloud dot = cloud({{2, 2}, {2, 2}, {2, 2}});
  const Cloud dot2 = cloud({{2, 2}, {2, 2}}, {1, 3});
  const auto r = solveExactOt(dot, dot2);
  ASSERT_EQ(r.status, ExactOtStatus::Optimal) << r.message;
  EXPECT_EQ(r.value, 0.0);
  EXPECT_LT(certifyTransport(dot, dot2, 1, r.plan, r.u, r.v).marginalRelError, 1e-12);
}

// [D] A row of zero weight carries no mass: the value equals the solve without it, and its
// potential still satisfies u_i + v_j <= c_ij (the certificate checks all pairs).
TEST(NetworkSimplexTest, ZeroWeightRowsCarryNoMassAndKeepFeasibleDuals) {
  const Cloud a = cloud({{0, 0}, {5, 5}, {1, 0}, {0, 1}}, {1, 0, 2, 1});
  const Cloud b = cloud({{0.5, 0.5}, {9, -9}, {2, 2}}, {1, 1e-300 * 0, 3});
  const Cloud a2 = cloud({{0, 0}, {1, 0}, {0, 1}}, {1, 2, 1});
  const Cloud b2 = cloud({{0.5, 0.5}, {2, 2}}, {1, 3});
  for (double p : {1.0, 2.0}) {
    const auto r = solveExactOt(a, b, withP(p));
    const auto r2 = solveExactOt(a2, b2, withP(p));
    expectCertified(a, b, p, r);
    expectCertified(a2, b2, p, r2);
    EXPECT_NEAR(r.value, r2.value, 1e-14);
    for (const auto& e : r.plan) {
      EXPECT_NE(e.i, 1);
      EXPECT_NE(e.j, 1);
    }
  }
}

// [D] Unequal sizes and weights: certificate only (the SciPy suite checks the values).
// Every other instance starts from coarse levels (small groups, low threshold), so the
// coarse-to-fine start is exercised on small problems too.
TEST(NetworkSimplexTest, UnequalSizesAndWeightsAreCertified) {
  for (int t = 0; t < 12; ++t) {
    const Cloud a = randomCloud(5 + 13 * t, 100 + std::uint64_t(t), t % 2 == 0);
    const Cloud b = randomCloud(3 + 29 * t, 200 + std::uint64_t(t), t % 3 == 0, 1.5);
    for (double p : {1.0, 2.0, 1.5}) {
      ExactOtOptions o = withP(p);
      o.coarsestSize = t % 2 ? 8 : 256;
      o.groupSize = 2 + t % 4;
      expectCertified(a, b, p, solveExactOt(a, b, o));
    }
  }
}

// [D] Integer grids with repeated points and equal weights are massively degenerate: the
// solve must terminate (strongly feasible trees do not cycle) with a certificate. Both
// starting bases and no candidate arcs at all (pricing finds every arc) are exercised.
TEST(NetworkSimplexTest, DegenerateGridsTerminateWithCertificate) {
  std::mt19937 rng(5);
  std::uniform_int_distribution<int> g(0, 4);
  for (int t = 0; t < 6; ++t) {
    Eigen::MatrixX2d pa(60, 2), pb(60, 2);
    for (int i = 0; i < 60; ++i) pa.row(i) << g(rng), g(rng);
    for (int i = 0; i < 60; ++i) pb.row(i) << g(rng), g(rng);
    const Cloud a("", pa), b("", pb);
    for (double p : {1.0, 2.0}) {
      ExactOtOptions o = withP(p);
      o.initial = t % 2 ? InitialBasis::NorthWest : InitialBasis::Greedy;
      o.neighbours = t % 3 == 2 ? 0 : 6;
      o.coarsestSize = t < 3 ? 10 : 256;
      const auto r = solveExactOt(a, b, o);
      expectCertified(a, b, p, r);
      EXPECT_GT(r.degeneratePivots + (r.pivots == 0), 0);
    }
  }
}

TEST(NetworkSimplexTest, BadInputIsAStatusWithAReason) {
  const Cloud good = cloud({{0, 0}, {1, 1}});
  Cloud nan = cloud({{0, 0}, {NAN, 1}});
  nan.name = "A";
  EXPECT_EQ(solveExactOt(nan, good).status, ExactOtStatus::InvalidInput);
  EXPECT_NE(solveExactOt(nan, good).message.find("row 2"), std::string::npos);
  EXPECT_EQ(solveExactOt(good, Cloud("", Eigen::MatrixX2d(0, 2))).status, ExactOtStatus::InvalidInput);
  EXPECT_EQ(solveExactOt(good, cloud({{0, 0}}, {0})).status, ExactOtStatus::InvalidInput);
  EXPECT_EQ(solveExactOt(good, cloud({{0, 0}}, {-1})).status, ExactOtStatus::InvalidInput);
  for (double p : {0.5, -1.0, double(NAN), double(INFINITY)}) {
    const auto r = solveExactOt(good, good, withP(p));
    EXPECT_EQ(r.status, ExactOtStatus::InvalidInput);
    EXPECT_NE(r.message.find("p must"), std::string::npos) << r.message;
  }
  ExactOtOptions o;
  o.tolerance = 0;
  EXPECT_EQ(solveExactOt(good, good, o).status, ExactOtStatus::InvalidInput);
  o = {};
  o.arcsPerRow = 0;
  EXPECT_EQ(solveExactOt(good, good, o).status, ExactOtStatus::InvalidInput);
}

TEST(NetworkSimplexTest, CancelIsHonoured) {
  const Cloud a = randomCloud(400, 1, true), b = randomCloud(400, 2, true);
  std::atomic<bool> stop{true};
  RunControl ctl;
  ctl.cancel = &stop;
  const auto r = solveExactOt(a, b, {}, &ctl);
  EXPECT_EQ(r.status, ExactOtStatus::Cancelled);
  EXPECT_TRUE(r.plan.empty());
  // Asked through the progress callback, after the solve has started.
  int calls = 0;
  RunControl ask;
  ask.onProgress = [&](double f) {
    EXPECT_GE(f, 0.0);
    EXPECT_LE(f, 1.0);
    return ++calls < 2;
  };
  ExactOtOptions o;
  o.neighbours = 0;  // many pivots and pricing rounds, so there are several polls
  EXPECT_EQ(solveExactOt(a, b, o, &ask).status, ExactOtStatus::Cancelled);
  EXPECT_EQ(calls, 2);
}

TEST(NetworkSimplexTest, PivotLimitGivesAFeasiblePlanAndSaysSo) {
  const Cloud a = randomCloud(200, 7, true), b = randomCloud(150, 8, false);
  ExactOtOptions o;
  o.maxPivots = 3;
  o.initial = InitialBasis::NorthWest;
  const auto r = solveExactOt(a, b, o);
  ASSERT_EQ(r.status, ExactOtStatus::IterationLimit);
  EXPECT_NE(r.message.find("pivot limit"), std::string::npos);
  EXPECT_EQ(r.pivots, 3);
  const auto t = certifyTransport(a, b, 1.0, r.plan, r.u, r.v);
  EXPECT_LT(t.marginalRelError, 1e-12);
  EXPECT_GE(r.cost, solveExactOt(a, b).cost);
}

// [D] A warm start changes the path, not the optimum: same value as a cold solve after the
// clouds move (shift, one dragged point), and it is used only when the weights match.
TEST(NetworkSimplexTest, WarmStartReachesTheSameOptimum) {
  const Cloud a = randomCloud(300, 11, true), b = randomCloud(280, 12, true);
  for (double p : {1.0, 2.0}) {
    std::shared_ptr<WarmState> slot;
    const auto first = solveExactOt(a, b, withP(p), nullptr, &slot);
    EXPECT_FALSE(first.warmStarted);
    ASSERT_TRUE(dynamic_cast<ExactWarmState*>(slot.get()));
    Cloud moved = a;
    moved.points.col(0).array() += 0.01;
    moved.points.row(17) << 0.3, 0.9;
    const auto warm = solveExactOt(moved, b, withP(p), nullptr, &slot);
    const auto cold = solveExactOt(moved, b, withP(p));
    EXPECT_TRUE(warm.warmStarted);
    expectCertified(moved, b, p, warm);
    EXPECT_NEAR(warm.cost, cold.cost, 1e-13);
    // Unchanged clouds: the stored basis is already optimal.
    const auto again = solveExactOt(moved, b, withP(p), nullptr, &slot);
    EXPECT_TRUE(again.warmStarted);
    EXPECT_EQ(again.pivots, 0);
    // Other weights: the state does not fit and is not used.
    Cloud reweighted = moved;
    reweighted.weights(0) *= 2;
    const auto other = solveExactOt(reweighted, b, withP(p), nullptr, &slot);
    EXPECT_FALSE(other.warmStarted);
    expectCertified(reweighted, b, p, other);
  }
}

// [D] The thread team only splits independent per-point searches (the coarse-to-fine start
// and pricing) and returns their results in point order, so one and two threads must make
// the same pivots and give the same plan and potentials, bit for bit. 3000 points: three
// coarser levels, and teams on the levels with 512 points or more.
TEST(NetworkSimplexTest, OneAndTwoThreadsGiveTheSameSolve) {
  const Cloud a = randomCloud(3000, 21, true), b = randomCloud(2900, 22, true, 1.3);
  for (double p : {1.0, 2.0}) {
    RunControl one, two;
    one.threads = 1;
    two.threads = 2;
    const auto r1 = solveExactOt(a, b, withP(p), &one);
    const auto r2 = solveExactOt(a, b, withP(p), &two);
    expectCertified(a, b, p, r1);
    EXPECT_EQ(r1.pivots, r2.pivots);
    EXPECT_EQ(r1.rounds, r2.rounds);
    EXPECT_EQ(r1.cost, r2.cost);
    EXPECT_TRUE(r1.u == r2.u);
    EXPECT_TRUE(r1.v == r2.v);
    ASSERT_EQ(r1.plan.size(), r2.plan.size());
    for (std::size_t k = 0; k < r1.plan.size(); ++k) {
      EXPECT_EQ(r1.plan[k].i, r2.plan[k].i);
      EXPECT_EQ(r1.plan[k].j, r2.plan[k].j);
      EXPECT_EQ(r1.plan[k].mass, r2.plan[k].mass);
    }
  }
}

// [P] LP duality as in expectCertified: the wider candidate sets the measures use for W1
// (exactOtOptionsFor) change the path, not the optimum; both solves are certified and their
// costs agree to rounding. Clusters of different sizes so that mass must cross between them.
TEST(NetworkSimplexTest, MeasureOptionsReachTheSameCertifiedOptimum) {
  Cloud a = randomCloud(2500, 31, true), b = randomCloud(2400, 32, false, 0.6);
  a.points.topRows(800).array() *= 0.3;
  b.points.col(0).array() += 0.5;
  for (double p : {1.0, 2.0}) {
    const auto plain = solveExactOt(a, b, withP(p));
    const auto tuned = solveExactOt(a, b, exactOtOptionsFor(p));
    expectCertified(a, b, p, plain);
    expectCertified(a, b, p, tuned);
    EXPECT_NEAR(tuned.cost, plain.cost, 1e-12 * plain.cost);
  }
}

// The simplex on its own: bases that are not spanning forests meeting the masses, or not
// strongly feasible, are refused with a reason.
TEST(NetworkSimplexTest, SetBasisRejectsWhatIsNotAStronglyFeasibleForest) {
  NetworkSimplex ns({2, 2}, {3, 1});
  const int e00 = ns.addArc(0, 0, 1.0), e01 = ns.addArc(0, 1, 2.0);
  const int e10 = ns.addArc(1, 0, 3.0), e11 = ns.addArc(1, 1, 0.5);
  EXPECT_NE(ns.setBasis({{e00, 2}, {e10, 2}}), "");                        // masses not met
  EXPECT_NE(ns.setBasis({{e00, 2}, {e10, 1}, {e11, 1}, {e01, 0}}), "");    // cycle
  EXPECT_NE(ns.setBasis({{e00, 3}, {e01, -1}, {e10, 0}, {e11, 2}}), "");   // negative flow
  // Degenerate masses: the zero-flow arc 0→1 must point towards the root, so the forest
  // may hang from sink 1 but not from source 0.
  NetworkSimplex deg({1, 1}, {1, 1});
  const int d00 = deg.addArc(0, 0, 1.0), d01 = deg.addArc(0, 1, 1.0), d11 = deg.addArc(1, 1, 1.0);
  EXPECT_NE(deg.setBasis({{d00, 1}, {d01, 0}, {d11, 1}}, {0}), "");
  EXPECT_EQ(deg.setBasis({{d00, 1}, {d01, 0}, {d11, 1}}, {2 + 1}), "");
  EXPECT_EQ(ns.setBasis({{e00, 2}, {e10, 1}, {e11, 1}}), "");
  ASSERT_EQ(ns.run(1e-12, 100, nullptr), NetworkSimplex::RunStatus::Optimal);
  // [D] optimum by inspection: 0→0 (2·1), 1→0 (1·3), 1→1 (1·0.5) = 5.5; the other basis
  // 0→0 1, 0→1 1, 1→0 2 costs 1 + 2 + 6 = 9.
  double cost = 0;
  for (int e = 0; e < ns.arcCount(); ++e) cost += double(ns.flow(e)) * ns.arcCost(e);
  EXPECT_DOUBLE_EQ(cost, 5.5);
  for (int e = 0; e < ns.arcCount(); ++e) {
    const double rc = ns.arcCost(e) - ns.u(ns.arcSource(e)) - ns.v(ns.arcSink(e));
    EXPECT_GE(rc, -1e-15);
    if (ns.flow(e) > 0) {
      EXPECT_NEAR(rc, 0.0, 1e-15);
    }
  }
}

}  // namespace
}  // namespace barrow
