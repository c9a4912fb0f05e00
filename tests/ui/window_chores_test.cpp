// The small promises of the window, each found broken once in an interactive session: Open
// asks about unsaved work before the chooser, Save As has a key, export dialogs suggest a
// name, the geometry survives a crash, the guide speaks of the demo only when it is loaded,
// the Add/Spray tooltips name the cloud they target, the read-out follows a dragged point,
// and an import re-fits the Field with no point under the legend.
#include <gtest/gtest.h>

#include <QAction>
#include <QComboBox>
#include <QFileInfo>
#include <QLabel>
#include <QSettings>
#include <QToolButton>

#include "field_panel.h"
#include "field_view.h"
#include "getting_started.h"
#include "scenario/demo_scenario.h"
#include "session_document.h"
#include "support/test_support.h"
#include "ui_test_support.h"

namespace barrow::ui {
namespace {

using test::makeWindow;
using test::waitIdle;

TEST(WindowChoresTest, OpenAsksAboutUnsavedChangesBeforeTheChooser) {
  auto w = makeWindow(demoSession());
  w->document()->setParam("sliced.directions", "64");
  ASSERT_TRUE(w->document()->isModified());
  std::vector<std::string> asked;
  bool keep = false;
  w->setPrompts({[&] {
                   asked.push_back("choose");
                   return QString();
                 },
                 [&] {
                   asked.push_back("discard");
                   return keep;
                 }});
  w->openDialog();
  EXPECT_EQ(asked, (std::vector<std::string>{"discard"})) << "cancelling the question still opened the chooser";
  asked.clear();
  keep = true;
  w->openDialog();
  EXPECT_EQ(asked, (std::vector<std::string>{"discard", "choose"}));
  // Nothing unsaved: straight to the chooser.
  w->document()->undoStack()->undo();
  asked.clear();
  w->openDialog();
  EXPECT_EQ(asked, (std::vector<std::string>{"choose"}));
  ASSERT_TRUE(waitIdle(*w));
}

TEST(WindowChoresTest, SaveAsHasAShortcutOfItsOwn) {
  auto w = makeWindow(demoSession());
  auto* saveAs = w->findChild<QAction*>("saveAsAction");
  ASSERT_NE(saveAs, nullptr);
  EXPECT_FALSE(saveAs->shortcut().isEmpty());
  EXPECT_NE(saveAs->shortcut(), QKeySequence(QKeySequence::Save));
  if (QKeySequence::keyBindings(QKeySequence::SaveAs).isEmpty())
    EXPECT_EQ(saveAs->shortcut(), QKeySequence("Ctrl+Shift+S"));
  else
    EXPECT_EQ(saveAs->shortcut(), QKeySequence(QKeySequence::SaveAs));
  ASSERT_TRUE(waitIdle(*w));
}

TEST(WindowChoresTest, ExportDialogsSuggestAFileNameFromTheSession) {
  auto w = makeWindow(demoSession());
  QSettings().remove("files/lastDir");
  EXPECT_EQ(w->suggestedPath("sweep", "png").toStdString(), "sweep.png");
  const QString path = QString::fromStdString(barrow::test::tempPath("shifted_batches.json"));
  ASSERT_TRUE(w->saveTo(path).isEmpty());
  QSettings().setValue("files/lastDir", "/some/folder");
  EXPECT_EQ(w->suggestedPath("field", "svg"), "/some/folder/" + QFileInfo(path).completeBaseName() + "-field.svg");
  QSettings().remove("files/lastDir");
  ASSERT_TRUE(waitIdle(*w));
}

TEST(WindowChoresTest, GeometryIsKeptWithoutACleanExit) {
  QSettings().remove("ui/geometry");
  QSettings().remove("ui/state");
  MainWindow::Options o;
  o.quiet = true;
  o.autoSweep = false;
  {
    MainWindow w(o);
    w.setSession(demoSession());
    w.resize(760, 540);
    w.show();
    ASSERT_TRUE(QTest::qWaitForWindowExposed(&w));
    w.resize(780, 560);
    EXPECT_TRUE(QTest::qWaitFor([] { return QSettings().contains("ui/geometry"); }, 5000));
    ASSERT_TRUE(waitIdle(w));
    // No close(): the process "dies" with the window as it is.
  }
  MainWindow again(o);
  EXPECT_EQ(again.size(), QSize(780, 560));
  QSettings().remove("ui/geometry");
  QSettings().remove("ui/state");
}

TEST(WindowChoresTest, GuideSpeaksOfTheDemoOnlyWhenTheDemoIsShown) {
  auto w = makeWindow(demoSession());
  w->showGettingStarted();
  auto* guide = w->findChild<GettingStarted*>();
  ASSERT_NE(guide, nullptr);
  EXPECT_TRUE(guide->text().contains("demo"));
  const QString path = QString::fromStdString(barrow::test::tempPath("other_b.csv"));
  barrow::test::writeText(path.toStdString(), "x,y\n5,5\n6,6\n7,5\n");
  w->setDropChooser([](const QString&) { return std::optional<Which>(Which::B); });
  ASSERT_TRUE(w->openFile(path).isEmpty());
  w->showGettingStarted();
  EXPECT_FALSE(guide->text().contains("demo")) << guide->text().toStdString();
  ASSERT_TRUE(waitIdle(*w));
}

TEST(WindowChoresTest, AddAndSprayTooltipsNameTheTargetCloud) {
  auto w = makeWindow(demoSession());
  auto* target = w->field()->findChild<QComboBox*>("fieldTarget");
  auto* spray = w->field()->findChild<QToolButton*>("sprayTool");
  auto* add = w->field()->findChild<QToolButton*>("addTool");
  ASSERT_TRUE(target && spray && add);
  target->setCurrentIndex(0);
  EXPECT_TRUE(spray->toolTip().contains("cloud A"));
  EXPECT_FALSE(spray->toolTip().contains("cloud B"));
  EXPECT_TRUE(add->toolTip().contains("cloud A"));
  target->setCurrentIndex(1);
  EXPECT_TRUE(spray->toolTip().contains("cloud B"));
  EXPECT_FALSE(spray->toolTip().contains("cloud A"));
  EXPECT_TRUE(add->toolTip().contains("cloud B"));
  ASSERT_TRUE(waitIdle(*w));
}

TEST(WindowChoresTest, ReadOutFollowsADraggedPoint) {
  auto w = makeWindow(demoSession());
  FieldView* view = w->field()->view();
  view->setHover(Which::A, 0);
  SessionDocument* doc = w->document();
  Cloud moved = doc->session().a;
  moved.points.row(0) << 12.5, -7.25;
  doc->beginPreview();
  doc->preview(moved, doc->session().b);
  EXPECT_TRUE(view->readout().contains("(12.5, -7.25)")) << view->readout().toStdString();
  doc->commitPreview("drag");
  ASSERT_TRUE(waitIdle(*w));
  EXPECT_TRUE(view->readout().contains("(12.5, -7.25)")) << view->readout().toStdString();
}

TEST(WindowChoresTest, ImportRefitsTheFieldAndTheLegendCoversNoPoint) {
  auto w = makeWindow(demoSession());
  const QString path = QString::fromStdString(barrow::test::tempPath("far_b.csv"));
  barrow::test::writeText(path.toStdString(), "x,y\n0,40\n1,41\n-1,-40\n0.5,-38\n");
  w->setDropChooser([](const QString&) { return std::optional<Which>(Which::B); });
  ASSERT_TRUE(w->openFile(path).isEmpty());
  ASSERT_TRUE(waitIdle(*w));
  QCustomPlot* p = w->field()->view()->plot();
  p->replot();
  const QRect legend = p->legend->outerRect();
  const QRect rect = p->axisRect()->rect();
  ASSERT_GT(legend.height(), 0);
  for (const Cloud* c : {&w->session().a, &w->session().b})
    for (Eigen::Index i = 0; i < c->size(); ++i) {
      const QPoint px = test::fieldPixel(*w->field()->view(), c->points(i, 0), c->points(i, 1));
      EXPECT_TRUE(rect.contains(px)) << "point " << i << " outside the view";
      EXPECT_FALSE(legend.contains(px)) << "point " << i << " under the legend";
      // The band along the top that the legend occupies is kept free of points altogether.
      EXPECT_GT(px.y(), legend.bottom()) << "point " << i << " in the legend's band";
    }
}

}  // namespace
}  // namespace barrow::ui
