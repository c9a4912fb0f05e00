// The Measures table shows each value's unit, and follows a setting that changes it.
#include <gtest/gtest.h>

#include <QTreeWidget>

#include "measures/registry.h"
#include "measures/units.h"
#include "measures_panel.h"
#include "scenario/demo_scenario.h"
#include "ui_test_support.h"

namespace barrow::ui {
namespace {

// [D] The Unit column (index 3) holds the unit the measure declares for the session's
// settings, and the exported table carries it too.
TEST(MeasuresUnitsTest, TableShowsEachUnitAndFollowsSettingsThatChangeIt) {
  auto w = test::makeWindow(demoSession(40));
  ASSERT_TRUE(test::waitIdle(*w));
  EXPECT_EQ(w->measures()->tree()->headerItem()->text(3), "Unit");
  for (const Measure* m : MeasureRegistry::instance().defaults())
    EXPECT_EQ(w->measures()->cellText(m->id(), 3).toStdString(), measureUnit(*m, w->session().params)) << m->id();
  EXPECT_EQ(w->measures()->cellText("entropic", 3), "length^2");
  EXPECT_EQ(w->measures()->cellText("chamfer", 3), "length");
  w->document()->setParam("chamfer.squared", "true");
  ASSERT_TRUE(test::waitIdle(*w));
  EXPECT_EQ(w->measures()->cellText("chamfer", 3), "length^2");
  EXPECT_NE(w->measures()->toCsv().find("chamfer,\"Chamfer distance\","), std::string::npos);
  EXPECT_EQ(w->measures()->toCsv().rfind("id,name,value,unit,change,status,seconds\n", 0), 0u);
}

}  // namespace
}  // namespace barrow::ui
