// One thread budget for nested parallelism: a sweep's worker threads divide the budget, and
// the row teams and block runners inside each measure stay within their share. Checked by
// counting threads that are busy at the same moment (BusyProbe), not by timing.
#include <gtest/gtest.h>

#include <atomic>
#include <vector>

#include "base/busy_probe.h"
#include "base/parallel_blocks.h"
#include "base/row_workers.h"
#include "base/run_control.h"
#include "support/test_support.h"
#include "sweep/sweep_engine.h"

namespace barrow {
namespace {

// Entropic measures start a row team per evaluation; at 600 points each pass has many row
// chunks, so a team with helpers would use them. [D] the budget arithmetic: 2 sweep threads
// on a budget of 2 leave each measure 1 thread, so never more than 2 are busy.
int peakBusyThreadsOfSweep(int threads) {
  const Cloud a = test::gaussianCloud(600, 11), b = test::gaussianCloud(600, 12, 0.5);
  SweepRequest req;
  req.settings.measures = {"entropic", "sinkhorn"};
  req.settings.from = -0.5;
  req.settings.to = 0.5;
  req.settings.steps = 6;
  req.refineJumps = false;
  req.threads = threads;
  req.params.assign("entropic.epsilon=0.05");
  req.params.assign("sinkhorn.epsilon=0.05");
  BusyProbe::start();
  const SweepResult r = runSweep(a, b, req);
  BusyProbe::stop();
  EXPECT_TRUE(r.message.empty()) << r.message;
  EXPECT_EQ(r.series.size(), 2u);
  return BusyProbe::peak();
}

TEST(ThreadBudgetTest, SweepWithTwoThreadsNeverHasMoreThanTwoBusy) {
  const int peak = peakBusyThreadsOfSweep(2);
  EXPECT_GE(peak, 1);
  EXPECT_LE(peak, 2);
}

TEST(ThreadBudgetTest, SweepWithOneThreadKeepsOneBusy) { EXPECT_EQ(peakBusyThreadsOfSweep(1), 1); }

TEST(ThreadBudgetTest, BlockRunnerStaysWithinTheControlsBudget) {
  RunControl control;
  control.threads = 1;
  std::atomic<int> ran{0};
  BusyProbe::start();
  EXPECT_TRUE(runBlocks(64, [&](int) { ran.fetch_add(1); }, WorkSlice{&control}, 8));
  BusyProbe::stop();
  EXPECT_EQ(ran.load(), 64);
  EXPECT_EQ(BusyProbe::peak(), 1);
}

// A row team's helpers count as busy threads: the probe is not blind to them. With 2
// threads and rows that each wait until both threads hold a row, the peak must be 2 [D].
TEST(ThreadBudgetTest, ProbeSeesRowTeamHelpers) {
  kernel::RowWorkers team(2);
  std::atomic<int> inside{0};
  BusyProbe::start();
  team.run(2, 1, [&](int, int) {
    inside.fetch_add(1);
    while (inside.load() < 2) {
    }
  });
  BusyProbe::stop();
  EXPECT_EQ(BusyProbe::peak(), 2);
}

TEST(RunControlTest, SubRangeMapsProgressAndKeepsCancelAndBudget) {
  std::atomic<bool> cancel{false};
  std::vector<double> seen;
  RunControl outer;
  outer.cancel = &cancel;
  outer.threads = 3;
  outer.onProgress = [&](double f) {
    seen.push_back(f);
    return true;
  };
  const RunControl part = outer.sub(0.25, 0.75);
  EXPECT_EQ(part.threads, 3);
  EXPECT_FALSE(part.shouldStop(0.5));
  ASSERT_EQ(seen.size(), 1u);
  EXPECT_DOUBLE_EQ(seen[0], 0.5);  // 0.25 + 0.5 · (0.75 − 0.25)
  cancel = true;
  EXPECT_TRUE(part.shouldStop());
  EXPECT_EQ(threadBudget(&part), 3);
  EXPECT_EQ(threadBudget(nullptr), defaultThreadCount());
}

}  // namespace
}  // namespace barrow
