// One notion of "current": the session document names its content by a revision, and the
// Sweep, the Findings and the sweep exports all judge their results against it. A drag makes
// them stale (the Findings say so in words, the exports refuse), undo makes them current again,
// and a cancelled sweep keeps the curves it had.
#include <gtest/gtest.h>

#include <QElapsedTimer>
#include <QFile>
#include <QLabel>
#include <QTableWidget>

#include "findings_panel.h"
#include "scenario/demo_scenario.h"
#include "session_document.h"
#include "support/test_support.h"
#include "sweep_panel.h"
#include "sweep_plots.h"
#include "ui_test_support.h"

namespace barrow::ui {
namespace {

using test::makeWindow;
using test::waitIdle;

Session smallSweep(int steps = 11) {
  Session s = demoSession();
  s.sweep.steps = steps;
  s.selected = {"w1", "hausdorff"};
  return s;
}

void waitStopped(SweepPanel* sweep) {
  QElapsedTimer t;
  t.start();
  while (sweep->running() && t.elapsed() < 60000) QTest::qWait(10);
}

TEST(WindowCurrentTest, RevisionIsNewForEveryEditAndRestoredByUndoAndRedo) {
  SessionDocument doc;
  doc.reset(smallSweep(), QString());
  const quint64 r0 = doc.revision();
  Cloud moved = doc.session().a;
  moved.points(0, 0) += 1.0;
  doc.beginPreview();
  doc.preview(moved, doc.session().b);
  const quint64 r1 = doc.revision();
  EXPECT_NE(r1, r0);
  moved.points(0, 0) += 1.0;
  doc.preview(moved, doc.session().b);
  const quint64 r2 = doc.revision();
  EXPECT_NE(r2, r1);
  doc.commitPreview("drag");
  EXPECT_EQ(doc.revision(), r2);
  doc.undoStack()->undo();
  EXPECT_TRUE(doc.isCurrent(r0));
  doc.undoStack()->redo();
  EXPECT_TRUE(doc.isCurrent(r2));
  doc.setParam("entropic.epsilon", "0.5");
  EXPECT_FALSE(doc.isCurrent(r2));
  // A drag cancelled (or one that ends where it began) is no change.
  const quint64 r3 = doc.revision();
  doc.beginPreview();
  doc.preview(moved, doc.session().b);
  doc.cancelPreview();
  EXPECT_TRUE(doc.isCurrent(r3));
}

TEST(WindowCurrentTest, DragMakesFindingsSayOutOfDateAndSweepExportsRefuse) {
  auto w = makeWindow(smallSweep());
  w->sweep()->run();
  ASSERT_TRUE(waitIdle(*w));
  ASSERT_TRUE(w->sweepExportProblem().isEmpty()) << w->sweepExportProblem().toStdString();
  EXPECT_FALSE(w->findings()->staleNotice()->isVisibleTo(w->findings()));
  const QString fresh = QString::fromStdString(barrow::test::tempPath("current_sweep.svg"));
  QFile::remove(fresh);
  EXPECT_TRUE(w->exportFigure(1, fresh, QSize(600, 400)).isEmpty());
  EXPECT_TRUE(QFile::exists(fresh));

  SessionDocument* doc = w->document();
  Cloud moved = doc->session().a;
  moved.points(3, 1) += 0.4;
  doc->beginPreview();
  doc->preview(moved, doc->session().b);
  doc->commitPreview("drag");
  ASSERT_TRUE(waitIdle(*w));
  EXPECT_TRUE(w->findings()->stale());
  EXPECT_TRUE(w->findings()->staleNotice()->isVisibleTo(w->findings()));
  EXPECT_TRUE(w->findings()->staleNotice()->text().contains("Out of date"));
  EXPECT_TRUE(w->sweep()->plots()->stale());
  EXPECT_FALSE(w->sweepExportProblem().isEmpty());
  const QString old = QString::fromStdString(barrow::test::tempPath("stale_sweep.svg"));
  QFile::remove(old);
  EXPECT_FALSE(w->exportFigure(1, old, QSize(600, 400)).isEmpty());
  EXPECT_FALSE(QFile::exists(old)) << "a sweep figure of other clouds was written";
  // The Field figure shows the session as it is: always allowed.
  const QString field = QString::fromStdString(barrow::test::tempPath("current_field.png"));
  EXPECT_TRUE(w->exportFigure(0, field, QSize(400, 300)).isEmpty());

  doc->undoStack()->undo();
  ASSERT_TRUE(waitIdle(*w));
  EXPECT_FALSE(w->findings()->stale());
  EXPECT_FALSE(w->findings()->staleNotice()->isVisibleTo(w->findings()));
  EXPECT_TRUE(w->sweepExportProblem().isEmpty());
}

TEST(WindowCurrentTest, CancelledSweepKeepsThePreviousCurvesAndFindings) {
  auto w = makeWindow(smallSweep());
  SweepPanel* sweep = w->sweep();
  sweep->run();
  ASSERT_TRUE(waitIdle(*w));
  const int curves = sweep->plots()->curveCount();
  const int rows = w->findings()->table()->rowCount();
  ASSERT_EQ(curves, 2);
  ASSERT_EQ(rows, 2);

  // A long run, cancelled before its first pass can end.
  Session s = w->session();
  s.sweep.steps = 20001;
  w->document()->setSweep(s.sweep);
  sweep->run();
  EXPECT_EQ(sweep->plots()->curveCount(), curves) << "the curves went away when the run started";
  sweep->cancel();
  waitStopped(sweep);
  ASSERT_TRUE(waitIdle(*w));
  EXPECT_TRUE(sweep->cancelled());
  EXPECT_EQ(sweep->plots()->curveCount(), curves);
  EXPECT_EQ(int(sweep->parts().size()), 1);
  EXPECT_EQ(w->findings()->table()->rowCount(), rows);
  // They were computed with 11 steps, the session now asks for 20001: shown, but out of date.
  EXPECT_TRUE(sweep->plots()->stale());
  EXPECT_TRUE(w->findings()->stale());
  // Undoing the settings change makes them current again.
  w->document()->undoStack()->undo();
  ASSERT_TRUE(waitIdle(*w));
  EXPECT_FALSE(sweep->plots()->stale());
  EXPECT_TRUE(w->sweepExportProblem().isEmpty());
}

TEST(WindowCurrentTest, SweepPlotKeepsItsPanesWhileASweepRuns) {
  Session s = smallSweep(20001);
  s.selected = {"w1", "w2", "hausdorff", "energy"};
  auto w = makeWindow(s);
  ASSERT_TRUE(waitIdle(*w));
  SweepPlots* plots = w->sweep()->plots();
  plots->plot()->replot();
  const int valueH = plots->valueRect()->rect().height();
  const int slopeH = plots->slopeRect()->rect().height();
  // Before any sweep (an empty legend) the value pane already has its share of the height.
  ASSERT_GT(valueH, plots->plot()->height() / 3);
  w->sweep()->run();
  for (int k = 0; k < 20; ++k) {
    QTest::qWait(20);
    plots->plot()->replot();
    EXPECT_GE(plots->valueRect()->rect().height(), valueH * 8 / 10) << "value pane collapsed while running";
    EXPECT_GE(plots->slopeRect()->rect().height(), slopeH * 8 / 10) << "slope pane collapsed while running";
  }
  w->sweep()->cancel();
  waitStopped(w->sweep());
  ASSERT_TRUE(waitIdle(*w));
}

}  // namespace
}  // namespace barrow::ui

#include <QDockWidget>
#include <QHeaderView>
#include <QTableWidget>

namespace barrow::ui {
namespace {

// Every Findings row is tall enough for its words wrapped at the column's width, also after
// the pane is narrowed (rows follow the column width).
TEST(WindowCurrentTest, FindingsRowsShowTheirWholeText) {
  auto w = test::makeWindow(smallSweep());
  w->resize(1000, 700);
  w->sweep()->run();
  ASSERT_TRUE(test::waitIdle(*w));
  QTableWidget* t = w->findings()->table();
  auto check = [&] {
    const int col = t->columnWidth(2);
    const QFontMetrics fm(t->font());
    for (int r = 0; r < t->rowCount(); ++r) {
      const QString text = t->item(r, 2)->text();
      const QRect need = fm.boundingRect(QRect(0, 0, col - 8, 100000), Qt::TextWordWrap, text);
      EXPECT_GE(t->rowHeight(r), need.height()) << "row " << r << " cut: " << text.toStdString();
    }
  };
  {
    SCOPED_TRACE("as laid out");
    check();
  }
  // The pane narrowed: the words' column with it.
  auto* dock = w->findChild<QDockWidget*>("findingsDock");
  ASSERT_NE(dock, nullptr);
  w->resizeDocks({dock}, {dock->width() - 120}, Qt::Horizontal);
  QTest::qWait(100);
  SCOPED_TRACE("narrowed");
  check();
}

}  // namespace
}  // namespace barrow::ui
