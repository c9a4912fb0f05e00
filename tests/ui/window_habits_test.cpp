// Habits of a desktop tool: every control explains itself in a tooltip; the first-run guide
// appears once and never in screenshots; the title marks unsaved changes.
#include <gtest/gtest.h>

#include <QAbstractButton>
#include <QAbstractSpinBox>
#include <QCheckBox>
#include <QComboBox>
#include <QSettings>
#include <QSlider>

#include "getting_started.h"
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
  if (shows) w.grab().save(QString(BARROW_TEST_TMP_DIR) + "/getting_started.png");  // to look at
  return shows;
}

TEST(WindowHabitsTest, GettingStartedShowsOnceAndNeverInScreenshots) {
  QSettings().remove("ui/gettingStartedShown");
  EXPECT_FALSE(guideShows(true));   // a screenshot does not count as the first run
  EXPECT_TRUE(guideShows(false));   // the first real run shows it
  EXPECT_FALSE(guideShows(false));  // and never again
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
