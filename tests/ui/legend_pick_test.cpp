// A click on a curve's entry in the sweep plot's legend picks that measure in every pane, as a
// click in the Findings or the Measures table does (issue #19); a second click lets it go.
#include <gtest/gtest.h>

#include <QTreeWidget>
#include <qcustomplot.h>

#include "findings_panel.h"
#include "measures_panel.h"
#include "scenario/demo_scenario.h"
#include "sweep_panel.h"
#include "sweep_plots.h"
#include "ui_test_support.h"

namespace barrow::ui {
namespace {

using test::makeWindow;
using test::waitIdle;

// The legend entry of `id`'s curve in the value pane (nullptr: none).
QCPAbstractLegendItem* legendEntry(SweepPlots* plots, const std::string& id) {
  QCustomPlot* plot = plots->plot();
  for (int g = 0; g < plot->graphCount(); ++g) {
    QCPGraph* graph = plot->graph(g);
    if (graph->property("measure").toString().toStdString() == id && graph->valueAxis() ==
        plots->valueRect()->axis(QCPAxis::atLeft))
      if (QCPAbstractLegendItem* item = plot->legend->itemWithPlottable(graph)) return item;
  }
  return nullptr;
}

// [D] Picking is the window's one notion of a focused measure: the plot, the Findings row and
// the Measures tree agree after a legend click, and the θ cursor stays where it was.
TEST(LegendPickTest, ClickingALegendEntryPicksThatMeasureEverywhere) {
  Session s = demoSession();
  s.selected = {"w1", "w2", "energy", "hausdorff", "js"};
  auto w = makeWindow(s);
  w->sweep()->run();
  ASSERT_TRUE(waitIdle(*w));
  SweepPlots* plots = w->sweep()->plots();
  ASSERT_EQ(plots->curveCount(), 5);
  ASSERT_TRUE(plots->highlighted().empty());
  const auto cursor = plots->cursor();

  auto findingOf = [&] {
    const auto rows = w->findings()->table()->selectionModel()->selectedRows();
    return rows.isEmpty() ? std::string()
                          : w->findings()->table()->item(rows.first().row(), 0)->data(Qt::UserRole).toString().toStdString();
  };
  QTreeWidget* tree = w->measures()->tree();
  auto treeOf = [&] {
    return tree->currentItem() ? tree->currentItem()->data(0, Qt::UserRole + 1).toString().toStdString() : std::string();
  };
  auto click = [&](const std::string& id) {
    plots->plot()->replot();
    QCPAbstractLegendItem* item = legendEntry(plots, id);
    ASSERT_NE(item, nullptr) << id;
    ASSERT_TRUE(item->visible() && item->rect().isValid()) << id;
    QTest::mouseClick(plots->plot(), Qt::LeftButton, Qt::NoModifier, item->rect().center());
    QApplication::processEvents();
  };

  click("hausdorff");
  EXPECT_EQ(plots->highlighted(), "hausdorff");
  EXPECT_EQ(findingOf(), "hausdorff");
  EXPECT_EQ(treeOf(), "hausdorff");
  EXPECT_EQ(plots->cursor(), cursor) << "a legend click moved the θ cursor";

  click("energy");  // the curve is drawn anew: find its entry again
  EXPECT_EQ(plots->highlighted(), "energy");
  EXPECT_EQ(findingOf(), "energy");
  EXPECT_EQ(treeOf(), "energy");

  click("energy");  // the picked one again: nothing picked
  EXPECT_TRUE(plots->highlighted().empty());
  EXPECT_TRUE(findingOf().empty());
}

}  // namespace
}  // namespace barrow::ui
