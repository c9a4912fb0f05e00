// Habits of a desktop tool: every control explains itself in a tooltip; the first-run guide
// appears once and never in screenshots; the title marks unsaved changes.
#include <gtest/gtest.h>

#include <QAbstractButton>
#include <QAbstractSpinBox>
#include <QCheckBox>
#include <QComboBox>
#include <QSettings>
#include <QSlider>

#include <QTableWidget>
#include <QTreeWidget>

#include "findings_panel.h"
#include "getting_started.h"
#include "measures_panel.h"
#include "sweep_panel.h"
#include "sweep_plots.h"
#include "scenario/demo_scenario.h"
#include "ui_test_support.h"

namespace barrow::ui {
namespace {

using test::makeWindow;
using test::waitIdle;

TEST(WindowHabitsTest, EveryControlHasATooltip) {
  auto w = makeWindow(demoSession());
  QStringList missing;
  for (QWidget* c : w->findChildren<QWidget*>()) {
    const bool control = qobject_cast<QAbstractButton*>(c) || qobject_cast<QComboBox*>(c) ||
                         qobject_cast<QAbstractSpinBox*>(c) || qobject_cast<QSlider*>(c);
    if (!control || !c->isVisibleTo(w.get())) continue;
    // Qt's own parts of composite widgets (dock title buttons, toolbar extension, the
    // combo box's internal line edit) carry Qt's accessible names instead.
    if (c->objectName().startsWith("qt_") || QString(c->metaObject()->className()).startsWith("QDockWidget"))
      continue;
    const QString tip = c->toolTip();
    if (tip.trimmed().isEmpty()) missing << QString("%1 '%2'").arg(c->metaObject()->className(), c->property("text").toString());
  }
  EXPECT_TRUE(missing.isEmpty()) << missing.join("; ").toStdString();
  ASSERT_TRUE(waitIdle(*w));
}

// Opens a window as the application does and reports whether the guide is showing.
bool guideShows(bool screenshot) {
  MainWindow::Options o;
  o.screenshot = screenshot;
  o.quiet = true;
  o.autoSweep = false;
  MainWindow w(o);
  w.setSession(demoSession());
  w.show();
  QApplication::processEvents();
  auto* guide = w.findChild<GettingStarted*>();
  const bool shows = guide != nullptr && guide->isVisible();
  EXPECT_TRUE(waitIdle(w));
  return shows;
}

TEST(WindowHabitsTest, GettingStartedShowsOnceAndNeverInScreenshots) {
  QSettings().remove("ui/gettingStartedShown");
  EXPECT_FALSE(guideShows(true));   // a screenshot does not count as the first run
  EXPECT_TRUE(guideShows(false));   // the first real run shows it
  EXPECT_FALSE(guideShows(false));  // and never again
}

// [D] One measure is picked out in every pane: choosing it in the Measures tree highlights
// its curve and selects its finding; choosing another finding moves the tree and the curve.
TEST(WindowHabitsTest, AMeasureChosenAnywhereIsChosenEverywhere) {
  auto w = makeWindow(demoSession());
  w->sweep()->run();
  ASSERT_TRUE(waitIdle(*w));
  ASSERT_GT(w->findings()->table()->rowCount(), 1);
  auto findingOf = [&] {
    const auto rows = w->findings()->table()->selectionModel()->selectedRows();
    return rows.isEmpty() ? std::string() : w->findings()->table()->item(rows.first().row(), 0)->data(Qt::UserRole).toString().toStdString();
  };
  QTreeWidget* tree = w->measures()->tree();
  auto treeOf = [&] { return tree->currentItem() ? tree->currentItem()->data(0, Qt::UserRole + 1).toString().toStdString() : std::string(); };

  tree->setCurrentItem(tree->topLevelItem(1));
  const std::string first = treeOf();
  ASSERT_FALSE(first.empty());
  EXPECT_EQ(w->sweep()->plots()->highlighted(), first);
  EXPECT_EQ(findingOf(), first);

  const int other = w->findings()->table()->item(0, 0)->data(Qt::UserRole).toString().toStdString() == first ? 1 : 0;
  w->findings()->table()->selectRow(other);
  const std::string second = findingOf();
  EXPECT_NE(second, first);
  EXPECT_EQ(w->sweep()->plots()->highlighted(), second);
  EXPECT_EQ(treeOf(), second);
}

TEST(WindowHabitsTest, TitleMarksUnsavedChanges) {
  auto w = makeWindow(demoSession());
  EXPECT_FALSE(w->isWindowModified());
  w->document()->setParam("sliced.directions", "64");
  EXPECT_TRUE(w->isWindowModified());
  w->document()->undoStack()->undo();
  EXPECT_FALSE(w->isWindowModified());  // back at the saved state
  ASSERT_TRUE(waitIdle(*w));
}

}  // namespace
}  // namespace barrow::ui
