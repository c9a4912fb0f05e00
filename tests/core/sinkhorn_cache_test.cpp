// The shared store of entropic solves (transport/sinkhorn_cache.h): a hit is the stored solve
// bit for bit, anything that changes the problem misses, what may not stand for every start
// is not kept, memory stays bounded, two threads asking at once get correct results, and the
// measures `entropic` and `sinkhorn` share their A–B solve. The reference for every value is
// the plain solver on the same input [D]: the store returns stored bytes, nothing else.
#include <gtest/gtest.h>

#include <atomic>
#include <cmath>
#include <future>
#include <random>
#include <thread>

#include "measures/entropic_measure.h"
#include "measures/evaluate.h"
#include "measures/sinkhorn_measure.h"
#include "support/shared_solves_off.h"
#include "sweep/sweep_engine.h"
#include "support/test_support.h"
#include "transport/sinkhorn_cache.h"

namespace barrow {
namespace {

struct Problem {
  Eigen::MatrixX2d x, y;
  Eigen::VectorXd a, b;
  SinkhornOptions o;
};

Problem randomProblem(int n, int m, unsigned seed, double eps = 0.01) {
  std::mt19937 rng(seed);
  std::uniform_real_distribution<double> u(0.0, 1.0), w(0.2, 1.0);
  Problem q{Eigen::MatrixX2d(n, 2), Eigen::MatrixX2d(m, 2), Eigen::VectorXd(n), Eigen::VectorXd(m), {}};
  for (int i = 0; i < n; ++i) {
    q.x.row(i) << u(rng), u(rng);
    q.a(i) = w(rng);
  }
  for (int j = 0; j < m; ++j) {
    q.y.row(j) << 0.4 + u(rng), 0.1 + u(rng);
    q.b(j) = w(rng);
  }
  q.a /= q.a.sum();
  q.b /= q.b.sum();
  q.o.epsilon = eps;
  q.o.tolerance = 1e-9;
  return q;
}

SinkhornResult direct(const Problem& q) { return solveSinkhorn(q.x, q.a, q.y, q.b, q.o); }

SinkhornResult through(SinkhornCache& c, const Problem& q, bool* reused, const RunControl* control = nullptr,
                       const SinkhornStart* start = nullptr) {
  return c.solve(q.x, q.a, q.y, q.b, q.o, control, start, nullptr, reused);
}

void expectSameBits(const SinkhornResult& got, const SinkhornResult& want) {
  EXPECT_EQ(got.status, want.status);
  EXPECT_EQ(got.value, want.value);  // exact: the same solve
  EXPECT_EQ(got.f, want.f);
  EXPECT_EQ(got.g, want.g);
  EXPECT_EQ(got.iterations, want.iterations);
  EXPECT_EQ(got.marginalError, want.marginalError);
}

TEST(SinkhornCacheTest, AHitIsTheStoredSolveBitForBit) {
  SinkhornCache cache;
  const Problem q = randomProblem(90, 70, 1);
  const SinkhornResult plain = direct(q);
  ASSERT_EQ(plain.status, SinkhornStatus::Converged);
  bool reused = true;
  const SinkhornResult first = through(cache, q, &reused);
  EXPECT_FALSE(reused);
  expectSameBits(first, plain);  // the cold path does not depend on the store
  const SinkhornResult second = through(cache, q, &reused);
  EXPECT_TRUE(reused);
  expectSameBits(second, plain);
  EXPECT_EQ(cache.stats().hits, 1);
  EXPECT_EQ(cache.stats().misses, 1);
  EXPECT_EQ(cache.stats().entries, 1);
}

TEST(SinkhornCacheTest, AnyChangeOfPointsWeightsOrSettingsMisses) {
  SinkhornCache cache;
  const Problem q = randomProblem(60, 50, 2);
  bool reused = false;
  through(cache, q, &reused);
  std::vector<std::pair<const char*, Problem>> changed;
  Problem w = q;  // one weight by one unit in the last place: a different problem
  w.a(7) = std::nextafter(w.a(7), 1.0);
  changed.push_back({"weight", w});
  Problem x = q;
  x.y(3, 1) = std::nextafter(x.y(3, 1), 2.0);
  changed.push_back({"point", x});
  Problem e = q;
  e.o.epsilon = std::nextafter(e.o.epsilon, 1.0);
  changed.push_back({"epsilon", e});
  Problem p = q;
  p.o.p = 1;
  changed.push_back({"p", p});
  Problem t = q;
  t.o.tolerance = 1e-8;
  changed.push_back({"tolerance", t});
  Problem it = q;
  it.o.maxIterations = 9999;
  changed.push_back({"max_iterations", it});
  Problem sc = q;
  sc.o.epsilonScaling = false;
  changed.push_back({"epsilon scaling", sc});
  Problem sw = q;  // A and B swapped: another problem (f and g trade places)
  std::swap(sw.x, sw.y);
  std::swap(sw.a, sw.b);
  changed.push_back({"swapped", sw});
  for (const auto& [what, c] : changed) {
    const SinkhornResult r = through(cache, c, &reused);
    EXPECT_FALSE(reused) << what;
    expectSameBits(r, direct(c));
  }
  // The symmetric problem on A's points is not the A–B problem, nor is it the A–A problem
  // posed as A–B through solve() (same numbers, separate entries).
  const SinkhornResult self = cache.solveSymmetric(q.x, q.a, q.o, nullptr, nullptr, nullptr, &reused);
  EXPECT_FALSE(reused);
  EXPECT_EQ(self.value, solveSinkhornSymmetric(q.x, q.a, q.o).value);
  cache.solveSymmetric(q.x, q.a, q.o, nullptr, nullptr, nullptr, &reused);
  EXPECT_TRUE(reused);
}

// A warm start only changes the speed, so a kept cold solve answers a warm request, and a
// converged warm solve answers a cold one; the latter is within the tolerance of a fresh
// cold solve (value gap second order in the marginal error: sinkhorn_solver.h).
TEST(SinkhornCacheTest, TheStartIsNotPartOfTheProblem) {
  SinkhornCache cache;
  const Problem q = randomProblem(80, 80, 3);
  const SinkhornResult cold = direct(q);
  Eigen::VectorXd f = cold.f.array() + 0.01, g = cold.g.array() - 0.01;
  const SinkhornStart start{&f, &g};
  bool reused = false;
  const SinkhornResult warm = through(cache, q, &reused, nullptr, &start);
  EXPECT_FALSE(reused);
  EXPECT_TRUE(warm.warmStarted);
  ASSERT_EQ(warm.status, SinkhornStatus::Converged);
  const SinkhornResult later = through(cache, q, &reused);
  EXPECT_TRUE(reused);
  expectSameBits(later, warm);
  EXPECT_NEAR(later.value, cold.value, 1e-9 * std::abs(cold.value));
}

TEST(SinkhornCacheTest, OnlySolvesThatStandForEveryStartAreKept) {
  SinkhornCache cache;
  Problem q = randomProblem(40, 40, 4, 1e-4);
  q.o.maxIterations = 5;
  q.o.p = 1;
  bool reused = false;
  // Ran out of iterations from the cold start: deterministic, kept.
  EXPECT_EQ(through(cache, q, &reused).status, SinkhornStatus::MaxIterations);
  through(cache, q, &reused);
  EXPECT_TRUE(reused);
  // Ran out from a warm start: depends on the start, not kept.
  Problem o = q;
  o.o.tolerance = 1e-10;
  Eigen::VectorXd f = Eigen::VectorXd::Zero(40), g = Eigen::VectorXd::Zero(40);
  const SinkhornStart start{&f, &g};
  EXPECT_EQ(through(cache, o, &reused, nullptr, &start).status, SinkhornStatus::MaxIterations);
  through(cache, o, &reused, nullptr, &start);
  EXPECT_FALSE(reused);
  // Cancelled: not kept.
  const Problem c = randomProblem(30, 30, 5);
  const std::atomic<bool> stop{true};
  RunControl control;
  control.cancel = &stop;
  EXPECT_EQ(through(cache, c, &reused, &control).status, SinkhornStatus::Cancelled);
  EXPECT_EQ(through(cache, c, &reused).status, SinkhornStatus::Converged);
  EXPECT_FALSE(reused);
}

TEST(SinkhornCacheTest, LeastRecentlyUsedGoFirstAndMemoryIsBounded) {
  SinkhornCache few(std::size_t(1) << 30, 2);
  const Problem p1 = randomProblem(30, 30, 6), p2 = randomProblem(30, 30, 7), p3 = randomProblem(30, 30, 8);
  bool reused = false;
  through(few, p1, &reused);
  through(few, p2, &reused);
  through(few, p1, &reused);  // p1 now the most recent
  EXPECT_TRUE(reused);
  through(few, p3, &reused);  // p2 goes
  EXPECT_EQ(few.stats().entries, 2);
  through(few, p1, &reused);
  EXPECT_TRUE(reused);
  through(few, p2, &reused);
  EXPECT_FALSE(reused);
  // An entry holds its points, weights and potentials: 8 bytes × (3n + 3m + n + m) here.
  EXPECT_EQ(few.stats().bytes, std::size_t(2) * 8 * (4 * 30 + 4 * 30));
  // A budget below one entry keeps nothing, and the answers are still right.
  SinkhornCache tiny(1000, 16);
  const SinkhornResult r = through(tiny, p1, &reused);
  expectSameBits(through(tiny, p1, &reused), r);
  EXPECT_FALSE(reused);
  EXPECT_EQ(tiny.stats().entries, 0);
}

// Two threads on the same problem at once: one solves, the other waits for it (or arrives
// after it) and gets the same bits; neither repeats the work. Also two threads on different
// problems in turn. Run under ThreadSanitizer by scripts/ci-sanitizers.sh.
TEST(SinkhornCacheTest, TwoThreadsAtOnceGetCorrectResults) {
  SinkhornCache cache;
  const Problem q = randomProblem(120, 100, 9);
  const SinkhornResult plain = direct(q);
  SinkhornResult r1, r2;
  bool u1 = false, u2 = false;
  std::promise<void> solving;
  std::shared_future<void> solvingNow = solving.get_future().share();
  std::promise<void> secondAsked;
  std::shared_future<void> secondAskedNow = secondAsked.get_future().share();
  bool signalled = false;
  RunControl slow;  // holds the first solve at its first progress report until the second asked
  slow.onProgress = [&](double) {
    if (!signalled) {
      signalled = true;
      solving.set_value();
      secondAskedNow.wait();
      std::this_thread::sleep_for(std::chrono::milliseconds(30));
    }
    return true;
  };
  std::thread first([&] { r1 = through(cache, q, &u1, &slow); });
  solvingNow.wait();
  std::thread second([&] {
    secondAsked.set_value();
    r2 = through(cache, q, &u2);
  });
  first.join();
  second.join();
  EXPECT_FALSE(u1);
  EXPECT_TRUE(u2);
  expectSameBits(r1, plain);
  expectSameBits(r2, plain);
  EXPECT_EQ(cache.stats().misses, 1);

  std::vector<Problem> qs;
  for (unsigned s = 0; s < 4; ++s) qs.push_back(randomProblem(50, 40, 20 + s));
  std::vector<SinkhornResult> want;
  for (const auto& p : qs) want.push_back(direct(p));
  SinkhornCache shared(std::size_t(1) << 30, 3);  // fewer entries than problems: evictions too
  std::vector<std::vector<SinkhornResult>> got(2);
  auto work = [&](int t) {
    for (int round = 0; round < 6; ++round)
      for (std::size_t k = 0; k < qs.size(); ++k) {
        bool reused = false;
        got[t].push_back(through(shared, qs[(k + t) % qs.size()], &reused));
      }
  };
  std::thread t0(work, 0), t1(work, 1);
  t0.join();
  t1.join();
  for (int t = 0; t < 2; ++t)
    for (std::size_t k = 0; k < got[t].size(); ++k) expectSameBits(got[t][k], want[(k + t) % qs.size()]);
}

// A request waiting for another thread's solve still answers its own cancel flag.
TEST(SinkhornCacheTest, AWaitingRequestCanBeCancelled) {
  SinkhornCache cache;
  const Problem q = randomProblem(100, 100, 10);
  std::promise<void> solving, released;
  std::shared_future<void> releasedNow = released.get_future().share();
  bool signalled = false;
  RunControl slow;
  slow.onProgress = [&](double) {
    if (!signalled) {
      signalled = true;
      solving.set_value();
      releasedNow.wait();
    }
    return true;
  };
  SinkhornResult r1;
  bool u1 = false, u2 = false;
  std::thread first([&] { r1 = through(cache, q, &u1, &slow); });
  solving.get_future().wait();
  const std::atomic<bool> stop{true};
  RunControl cancelled;
  cancelled.cancel = &stop;
  const SinkhornResult r2 = through(cache, q, &u2, &cancelled);  // the first is still solving
  released.set_value();
  first.join();
  EXPECT_EQ(r2.status, SinkhornStatus::Cancelled);
  EXPECT_FALSE(u2);
  expectSameBits(r1, direct(q));
}

// When the thread that was solving is cancelled, a thread waiting for it solves the problem
// itself: its result is the full solve whichever order the two took.
TEST(SinkhornCacheTest, AWaiterSolvesItselfWhenTheSolverIsCancelled) {
  SinkhornCache cache;
  const Problem q = randomProblem(100, 90, 11);
  std::promise<void> solving, secondAsked;
  std::shared_future<void> secondAskedNow = secondAsked.get_future().share();
  RunControl stopping;
  bool signalled = false;
  stopping.onProgress = [&](double) {
    if (!signalled) {
      signalled = true;
      solving.set_value();
      secondAskedNow.wait();
      std::this_thread::sleep_for(std::chrono::milliseconds(30));
    }
    return false;  // cancel
  };
  SinkhornResult r1, r2;
  bool u1 = false, u2 = false;
  std::thread first([&] { r1 = through(cache, q, &u1, &stopping); });
  solving.get_future().wait();
  std::thread second([&] {
    secondAsked.set_value();
    r2 = through(cache, q, &u2);
  });
  first.join();
  second.join();
  EXPECT_EQ(r1.status, SinkhornStatus::Cancelled);
  EXPECT_FALSE(u2);
  expectSameBits(r2, direct(q));
}

// The two measures through the shared store: `sinkhorn` after `entropic` on the same clouds
// and settings takes the A–B solve (ab_reused) and gives the same bits as with the store off.
TEST(SinkhornCacheTest, EntropicAndSinkhornShareTheirABSolve) {
  const Cloud a = test::gaussianCloud(150, 31, 0.0, 1.0), b = test::gaussianCloud(140, 32, 0.7, 0.8);
  EvalRequest req;  // the defaults, as `measure` runs them: ε = auto on both
  Result entOff, sinkOff;
  {
    const test::SharedSolvesOff off;
    entOff = evaluateMeasure(EntropicMeasure(), a, b, req);
    sinkOff = evaluateMeasure(SinkhornMeasure(), a, b, req);
  }
  SinkhornCache::shared().clear();
  const Result ent = evaluateMeasure(EntropicMeasure(), a, b, req);
  const Result sink = evaluateMeasure(SinkhornMeasure(), a, b, req);
  ASSERT_EQ(ent.status, Status::Ok) << ent.message;
  ASSERT_EQ(sink.status, Status::Ok) << sink.message;
  EXPECT_FALSE(ent.details["reused"].get<bool>());
  EXPECT_TRUE(sink.details["ab_reused"].get<bool>());
  EXPECT_FALSE(sinkOff.details["ab_reused"].get<bool>());
  EXPECT_EQ(sink.details["ot_ab"].get<double>(), ent.value);
  EXPECT_EQ(ent.value, entOff.value);
  EXPECT_EQ(sink.value, sinkOff.value);
  // The iterations of the reused solve were not run by this call.
  EXPECT_EQ(sink.iterations, sinkOff.iterations - sinkOff.details["ab_iterations"].get<int>());
  // A changed ε is another problem.
  EvalRequest other = req;
  other.params.set("sinkhorn.epsilon", "0.05");
  EXPECT_FALSE(evaluateMeasure(SinkhornMeasure(), a, b, other).details["ab_reused"].get<bool>());
  SinkhornCache::shared().clear();
}

// The measures from two threads at once (as the window's workers or a sweep's threads may):
// every value equals the one computed with the store off.
TEST(SinkhornCacheTest, MeasuresFromTwoThreadsMatchTheStoreOff) {
  const Cloud a = test::gaussianCloud(120, 41, 0.0, 1.0), b = test::gaussianCloud(110, 42, 0.5, 1.2);
  EvalRequest req;
  Result entOff, sinkOff;
  {
    const test::SharedSolvesOff off;
    entOff = evaluateMeasure(EntropicMeasure(), a, b, req);
    sinkOff = evaluateMeasure(SinkhornMeasure(), a, b, req);
  }
  SinkhornCache::shared().clear();
  Result ent, sink;
  std::thread t1([&] { ent = evaluateMeasure(EntropicMeasure(), a, b, req); });
  std::thread t2([&] { sink = evaluateMeasure(SinkhornMeasure(), a, b, req); });
  t1.join();
  t2.join();
  EXPECT_EQ(ent.value, entOff.value);
  EXPECT_EQ(sink.value, sinkOff.value);
  // Exactly one of them solved OT_ε(a, b).
  EXPECT_NE(ent.details["reused"].get<bool>(), sink.details["ab_reused"].get<bool>());
  SinkhornCache::shared().clear();
}

// A sweep on two threads with warm starts: `sinkhorn` takes `entropic`'s A–B solve at each θ
// (which `entropic` warm-started from its own previous θ, so not the bits `sinkhorn`'s own
// warm start would give): every value stays within the accuracy the sweep states for it.
TEST(SinkhornCacheTest, ASweepSharesTheSolvesWithinTheStatedAccuracy) {
  const Cloud a = test::gaussianCloud(140, 51, 0.0, 1.0), b = test::gaussianCloud(130, 52, 0.8, 0.9);
  const EntropicMeasure ent;
  const SinkhornMeasure sink;
  SweepRequest req;
  req.settings.family = Family::Shift;
  req.settings.from = -1;
  req.settings.to = 1;
  req.settings.steps = 9;
  req.refineJumps = false;
  req.threads = 2;
  req.measureObjects = {&ent, &sink};
  SweepResult off;
  {
    const test::SharedSolvesOff noStore;
    off = runSweep(a, b, req);
  }
  SinkhornCache::shared().clear();
  const SweepResult on = runSweep(a, b, req);
  ASSERT_TRUE(on.message.empty()) << on.message;
  ASSERT_EQ(on.theta, off.theta);
  EXPECT_GE(SinkhornCache::shared().stats().hits, 9);  // sinkhorn's A–B at every θ at least
  for (std::size_t s = 0; s < 2; ++s) {
    const double accuracy = std::max(on.series[s].accuracy, off.series[s].accuracy);
    EXPECT_GT(accuracy, 0.0);
    for (std::size_t k = 0; k < on.theta.size(); ++k) {
      EXPECT_EQ(on.series[s].status[k], Status::Ok);
      EXPECT_NEAR(on.series[s].value[k], off.series[s].value[k], accuracy) << s << " θ " << on.theta[k];
    }
  }
  SinkhornCache::shared().clear();
}

}  // namespace
}  // namespace barrow
