// The window's exports are the command line's files: for the same clouds and settings, the
// sweep CSV, the findings JSON and the plan CSV are byte for byte what barrow-cli writes,
// because both call the one writer per format in core/io [CP].
#include <gtest/gtest.h>

#include <string>

#include "field_panel.h"
#include "io/csv_io.h"
#include "io/plan_csv.h"
#include "scenario/demo_scenario.h"
#include "support/test_support.h"
#include "sweep_panel.h"
#include "ui_test_support.h"

namespace barrow::ui {
namespace {

using test::makeWindow;
using test::waitIdle;

int cli(const std::string& args, std::string* out = nullptr) {
  std::string o, e;
  const int rc = barrow::test::runCommand(std::string(BARROW_CLI) + " " + args, &o, &e);
  if (out) *out = o;
  EXPECT_EQ(rc, 0) << args << "\n" << e;
  return rc;
}

// The clouds of `s` as CSV files (the cloud writer reads back bit for bit), as CLI options.
std::string cloudOptions(const Session& s, const std::string& tag) {
  const std::string a = barrow::test::tempPath(tag + "_a.csv"), b = barrow::test::tempPath(tag + "_b.csv");
  EXPECT_FALSE(writeCloudCsv(a, s.a));
  EXPECT_FALSE(writeCloudCsv(b, s.b));
  return "--a " + a + " --b " + b;
}

// One pass of quick measures, so the window runs exactly the sweep the CLI runs.
Session quickSweepSession() {
  Session s = demoSession();
  s.sweep.family = Family::Shift;
  s.sweep.direction = {1.0, 0.0};
  s.sweep.center.reset();
  s.sweep.from = -1.0;
  s.sweep.to = 1.0;
  s.sweep.steps = 11;
  s.sweep.reference.reset();
  s.selected = {"w1", "js", "tv"};
  s.params = ParamSet();
  return s;
}

TEST(SharedExportsTest, SweepCsvAndFindingsJsonMatchTheCommandLine) {
  const Session s = quickSweepSession();
  auto w = makeWindow(s);
  w->sweep()->run();
  ASSERT_TRUE(waitIdle(*w));
  ASSERT_EQ(w->sweep()->parts().size(), 1u) << "the chosen measures should run in one pass";
  const std::string sweepOptions =
      cloudOptions(s, "shared") + " --family shift --direction 1,0 --from -1 --to 1 --steps 11 --measures w1,js,tv";
  const std::string path = barrow::test::tempPath("shared_sweep.csv");
  ASSERT_EQ(cli("sweep " + sweepOptions + " --out " + path), 0);
  EXPECT_EQ(w->sweep()->toCsv(), barrow::test::readText(path));
  std::string json;
  ASSERT_EQ(cli("findings " + sweepOptions + " --json", &json), 0);
  EXPECT_EQ(w->sweep()->findingsJson(), json);
}

TEST(SharedExportsTest, PlanCsvMatchesTheCommandLine) {
  Session s = quickSweepSession();
  auto w = makeWindow(s);
  w->field()->setPlanShown(true);
  w->field()->setPlanCost("w2");
  ASSERT_TRUE(waitIdle(*w));
  const std::string windowCsv = w->planCsv();
  ASSERT_FALSE(windowCsv.empty());
  const std::string path = barrow::test::tempPath("shared_plan.csv");
  ASSERT_EQ(cli("plan " + cloudOptions(s, "plan") + " --cost w2 --out " + path), 0);
  EXPECT_EQ(windowCsv, barrow::test::readText(path));
  // and the one reader takes it back: masses add up to 1 [D] (a coupling of two
  // probability vectors).
  const auto rows = parsePlanCsv(windowCsv, "window");
  ASSERT_TRUE(rows) << rows.error.text();
  double total = 0;
  for (const auto& r : *rows.value) total += r.mass;
  EXPECT_NEAR(total, 1.0, 1e-12);
}

}  // namespace
}  // namespace barrow::ui
