// The Critic pane: training runs off the GUI thread with a live curve, then the maps and the
// summary show the critic beside the exact W1; the certified bound stays below W1 (Critic C1
// in tests/REFERENCES.md). Also renders the window with the pane raised at 1400×900 and
// 1000×700 (PNGs kept under the build tree for a look).
#include <gtest/gtest.h>

#include <QDockWidget>
#include <QSignalSpy>
#include <QSpinBox>

#include "critic_panel.h"
#include "critic_runner.h"
#include "session_document.h"
#include "support/test_support.h"
#include "ui_test_support.h"

namespace barrow::ui {
namespace {

Session twoBlobs() {
  Session s;
  s.a = barrow::test::gaussianCloud(60, 1, 0.0, 0.5);
  s.b = barrow::test::gaussianCloud(50, 2, 2.0, 0.5);
  return s;
}

bool waitFinished(CriticPanel* p, int timeoutMs = 120000) {
  QSignalSpy spy(p->runner(), &CriticRunner::finished);
  return spy.count() > 0 || spy.wait(timeoutMs);
}

TEST(CriticPanelTest, TrainingDrawsCurveMapsAndBoundBelowW1) {
  auto w = test::makeWindow(twoBlobs());
  CriticPanel* p = w->critic();
  ASSERT_NE(p, nullptr);
  w->findChild<QDockWidget*>("criticDock")->raise();
  p->findChild<QSpinBox*>("criticSteps")->setValue(300);  // steps
  QSignalSpy curve(p->runner(), &CriticRunner::curvePoint);
  p->train();
  EXPECT_TRUE(p->runner()->running());  // returned before the training ended: off the GUI thread
  ASSERT_TRUE(waitFinished(p));
  QApplication::processEvents();
  ASSERT_NE(p->outcome(), nullptr);
  const auto& c = p->outcome()->check;
  ASSERT_EQ(c.status, Status::Ok);
  EXPECT_EQ(c.steps, 300);
  EXPECT_LE(c.lowerBound, c.w1 * (1 + 1e-12));  // [P] KR duality
  EXPECT_GT(curve.count(), 10);
  EXPECT_EQ(p->curvePlot()->graph(0)->dataCount(), curve.count());
  EXPECT_EQ(p->curvePlot()->graph(2)->dataCount(), 2);  // the exact W1 line
  EXPECT_EQ(p->outcome()->gradNorm.rows(), p->outcome()->frame.ny);
  EXPECT_TRUE(p->summary()->text().contains("certified bound"));

  for (QSize size : {QSize(1400, 900), QSize(1000, 700)}) {
    w->resize(size);
    QApplication::processEvents();
    QTest::qWait(50);
    const QImage img = w->grab().toImage();
    EXPECT_EQ(img.size(), size);
    img.save(QString::fromStdString(barrow::test::tempPath("critic_pane_" + std::to_string(size.width()) + ".png")));
  }
}

TEST(CriticPanelTest, NewerRunReplacesOlderAndStopCancels) {
  auto w = test::makeWindow(twoBlobs());
  CriticPanel* p = w->critic();
  p->findChild<QSpinBox*>("criticSteps")->setValue(200000);
  p->train();
  const quint64 first = p->runner()->latest();
  p->train();  // supersedes the first: its results are never drawn
  EXPECT_EQ(p->runner()->latest(), first + 1);
  QTest::qWait(200);
  p->runner()->cancel();
  ASSERT_TRUE(waitFinished(p, 60000));
  QApplication::processEvents();
  ASSERT_NE(p->outcome(), nullptr);
  EXPECT_EQ(p->outcome()->check.status, Status::Cancelled);
  EXPECT_LT(p->outcome()->check.steps, 200000);
  EXPECT_FALSE(p->runner()->running());
}

// The critic belongs to the clouds it was trained on: an edit makes the pane say so (the one
// "current for this session revision" test every pane uses), and undo makes it current again.
TEST(CriticPanelTest, AnEditMarksTheTrainedCriticOutOfDateAndUndoRestoresIt) {
  auto w = test::makeWindow(twoBlobs());
  CriticPanel* p = w->critic();
  p->findChild<QSpinBox*>("criticSteps")->setValue(50);
  p->train();
  ASSERT_TRUE(waitFinished(p));
  QApplication::processEvents();
  EXPECT_FALSE(p->stale());
  EXPECT_FALSE(p->summary()->text().contains("Out of date"));
  Cloud moved = w->document()->session().a;
  moved.points(0, 0) += 0.5;
  w->document()->setClouds(moved, w->document()->session().b, "move a point");
  EXPECT_TRUE(p->stale());
  EXPECT_TRUE(p->summary()->text().contains("Out of date"));
  w->document()->undoStack()->undo();
  EXPECT_FALSE(p->stale());
  EXPECT_FALSE(p->summary()->text().contains("Out of date"));
}

}  // namespace
}  // namespace barrow::ui
