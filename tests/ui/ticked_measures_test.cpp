// The window computes only the ticked measures (issue 13, goal 7: on clouds of 10^4 points an
// unticked entropic solve would hold every edit for tens of seconds). An unticked row says
// "off" and its value is gone, so no number is shown that was not recomputed for these clouds;
// ticking it computes it. The measure behind the plan on the Field is computed regardless.
#include <gtest/gtest.h>

#include "measures_panel.h"
#include "scenario/demo_scenario.h"
#include "ui_test_support.h"

namespace barrow::ui {
namespace {

constexpr int kStatusColumn = 4;

TEST(TickedMeasuresTest, OnlyTickedMeasuresAreComputedAndTickingOneComputesIt) {
  auto w = test::makeWindow(demoSession());
  ASSERT_TRUE(test::waitIdle(*w));
  w->document()->setSelected({"sliced", "frechet"});
  ASSERT_TRUE(test::waitIdle(*w));
  MeasuresPanel* m = w->measures();
  EXPECT_NE(m->result("sliced"), nullptr);
  EXPECT_NE(m->result("frechet"), nullptr);
  EXPECT_EQ(m->result("sinkhorn"), nullptr);
  EXPECT_EQ(m->cellText("sinkhorn", kStatusColumn), QStringLiteral("off"));
  EXPECT_EQ(m->cellText("sinkhorn", 1), QString());
  EXPECT_EQ(m->toCsv().find("sinkhorn"), std::string::npos);  // not exported either
  w->document()->setSelected({"sliced", "frechet", "sinkhorn"});
  ASSERT_TRUE(test::waitIdle(*w));
  ASSERT_NE(m->result("sinkhorn"), nullptr);
  EXPECT_TRUE(m->result("sinkhorn")->usable());
}

}  // namespace
}  // namespace barrow::ui
