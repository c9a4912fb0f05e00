// Files from the window's side: a saved session reopens with the same clouds, settings and
// view options; a malformed dropped file is reported with file, line and reason and changes
// nothing; autosave leaves a recovery file that holds the unsaved work.
#include <gtest/gtest.h>

#include <QDropEvent>
#include <QElapsedTimer>
#include <QFile>
#include <QMimeData>
#include <QTest>
#include <QUrl>

#include "field_panel.h"
#include "scenario/demo_scenario.h"
#include "session_files.h"
#include "sweep_panel.h"
#include "sweep_plots.h"
#include "support/test_support.h"
#include "ui_test_support.h"

namespace barrow::ui {
namespace {

using test::makeWindow;
using test::sameCloud;
using test::waitIdle;

// [D] save → open is a round trip: every part the session holds comes back unchanged.
TEST(SessionFileTest, SavedSessionReopensWithSameCloudsSettingsAndView) {
  auto w = makeWindow(demoSession());
  SessionDocument* doc = w->document();
  // Edits of every kind the session holds.
  Cloud b = doc->session().b;
  b.weights(3) = 0.0123;
  b.points(7, 1) = 1.0 / 3.0;  // not representable in few digits
  doc->setCloud(Which::B, b, "edit");
  doc->setParam("mmd.sigma", "0.37");
  SweepSettings sw = doc->session().sweep;
  sw.family = Family::Rotate;
  sw.center = std::array<double, 2>{0.25, -0.5};
  sw.from = -90;
  sw.to = 90;
  sw.steps = 37;
  sw.reference = 10.0;
  doc->setSweep(sw);
  doc->setSelected({"js", "tv"});
  w->field()->setEntropicShown(true);
  w->field()->setThreshold(0.3);
  w->setTheta(12.5);
  w->sweep()->plots()->highlight("js");
  const QString path = QString::fromStdString(barrow::test::tempPath("roundtrip.json"));
  ASSERT_TRUE(w->saveTo(path).isEmpty()) << w->lastError().toStdString();
  EXPECT_FALSE(doc->isModified());
  const Session saved = doc->session();
  ASSERT_TRUE(waitIdle(*w));

  auto w2 = makeWindow(demoSession());
  ASSERT_TRUE(w2->openFile(path).isEmpty()) << w2->lastError().toStdString();
  const Session& r = w2->session();
  EXPECT_TRUE(sameCloud(r.a, saved.a));
  EXPECT_TRUE(sameCloud(r.b, saved.b));  // bit for bit: JSON numbers round-trip
  EXPECT_EQ(r.a.name, saved.a.name);
  EXPECT_EQ(r.params.values(), saved.params.values());
  EXPECT_EQ(r.selected, saved.selected);
  EXPECT_EQ(r.sweep.family, Family::Rotate);
  EXPECT_EQ(r.sweep.center, sw.center);
  EXPECT_EQ(r.sweep.from, -90);
  EXPECT_EQ(r.sweep.to, 90);
  EXPECT_EQ(r.sweep.steps, 37);
  EXPECT_EQ(r.sweep.reference, 10.0);
  EXPECT_TRUE(w2->field()->entropicPlanShown());
  EXPECT_EQ(w2->theta(), std::optional<double>(12.5));
  EXPECT_EQ(w2->sweep()->plots()->highlighted(), "js");
  EXPECT_DOUBLE_EQ(w2->field()->viewOptions()["threshold"].get<double>(), 0.3);
  EXPECT_EQ(w2->document()->path(), path);
  EXPECT_FALSE(w2->document()->isModified());
  ASSERT_TRUE(waitIdle(*w2));
}

// The drop path as Qt delivers it: a QDropEvent with a file URL; the window asks A or B
// (answered by the chooser), then reads the file.
void dropOn(MainWindow& w, const QString& path) {
  QMimeData mime;
  mime.setUrls({QUrl::fromLocalFile(path)});
  QDragEnterEvent enter(QPoint(50, 50), Qt::CopyAction, &mime, Qt::LeftButton, Qt::NoModifier);
  QApplication::sendEvent(&w, &enter);
  QDropEvent drop(QPointF(50, 50), Qt::CopyAction, &mime, Qt::LeftButton, Qt::NoModifier);
  QApplication::sendEvent(&w, &drop);
  QApplication::processEvents();  // the import runs after the drop returns
}

TEST(SessionFileTest, DroppingMalformedCsvReportsFileLineReasonAndChangesNothing) {
  auto w = makeWindow(demoSession());
  const Session before = w->session();
  const QString path = QString::fromStdString(barrow::test::tempPath("bad_row.csv"));
  barrow::test::writeText(path.toStdString(), "x,y\n0,1\n2,3\n4,five\n6,7\n");
  w->setDropChooser([](const QString&) { return std::optional<Which>(Which::A); });
  dropOn(*w, path);
  const QString e = w->lastError();
  EXPECT_TRUE(e.contains(path)) << e.toStdString();   // the file
  EXPECT_TRUE(e.contains(":4")) << e.toStdString();   // its 4th line holds "five"
  EXPECT_TRUE(e.contains("five")) << e.toStdString();  // and the reason names the text
  EXPECT_TRUE(sameCloud(w->session().a, before.a));
  EXPECT_TRUE(sameCloud(w->session().b, before.b));
  EXPECT_EQ(w->document()->undoStack()->count(), 0);
  EXPECT_FALSE(w->document()->isModified());
}

TEST(SessionFileTest, DroppingGoodCsvAsBReplacesBAsOneUndoStep) {
  auto w = makeWindow(demoSession());
  const Session before = w->session();
  const QString path = QString::fromStdString(barrow::test::tempPath("good.csv"));
  barrow::test::writeText(path.toStdString(), "x,y,w\n0,1,1\n2,3,3\n");
  w->setDropChooser([](const QString&) { return std::optional<Which>(Which::B); });
  dropOn(*w, path);
  EXPECT_TRUE(w->lastError().isEmpty()) << w->lastError().toStdString();
  ASSERT_EQ(w->session().b.size(), 2);
  EXPECT_EQ(w->session().b.points(1, 0), 2.0);
  EXPECT_EQ(w->session().b.weights(1), 3.0);
  EXPECT_TRUE(sameCloud(w->session().a, before.a));
  w->document()->undoStack()->undo();
  EXPECT_TRUE(sameCloud(w->session().b, before.b));
  ASSERT_TRUE(waitIdle(*w));
}

TEST(SessionFileTest, AutosaveKeepsUnsavedWorkForRecovery) {
  auto w = makeWindow(demoSession());
  SessionFiles* files = w->files();
  files->discardRecovery();
  files->autosaveNow();
  EXPECT_FALSE(QFile::exists(files->recoveryPath()));  // nothing unsaved, nothing written
  Cloud a = w->session().a;
  a.points(0, 0) += 0.5;
  w->document()->setCloud(Which::A, a, "edit");
  files->autosaveNow();
  QString error;
  const auto rec = files->pendingRecovery(&error);
  ASSERT_TRUE(rec.has_value()) << error.toStdString();
  EXPECT_TRUE(sameCloud(rec->a, w->session().a));
  EXPECT_TRUE(sameCloud(rec->b, w->session().b));
  // Saving makes the recovery file pointless.
  const QString path = QString::fromStdString(barrow::test::tempPath("saved.json"));
  ASSERT_TRUE(w->saveTo(path).isEmpty());
  EXPECT_FALSE(QFile::exists(files->recoveryPath()));
  ASSERT_TRUE(waitIdle(*w));
}

// An edit reaches the recovery file within SessionFiles::kEditAutosaveMs, without waiting
// for the autosave interval; what the next start offers to restore is that file, byte for
// byte (the kill-during-save and kill-during-edit cases are in tests/core/crash_safety_test).
TEST(SessionFileTest, EditIsAutosavedSoonAndTheNextStartRestoresItByteForByte) {
  auto w = makeWindow(demoSession());
  SessionFiles* files = w->files();
  files->discardRecovery();
  Cloud a = w->session().a;
  a.points(1, 1) = 1.0 / 7.0;
  w->document()->setCloud(Which::A, a, "edit");
  QElapsedTimer t;
  t.start();
  while (!QFile::exists(files->recoveryPath()) && t.elapsed() < 10 * SessionFiles::kEditAutosaveMs) QTest::qWait(20);
  ASSERT_TRUE(QFile::exists(files->recoveryPath())) << "no autosave after an edit";
  const std::string onDisk = barrow::test::readText(files->recoveryPath().toStdString());
  ASSERT_TRUE(waitIdle(*w));
  w.reset();  // the window goes away without a clean close (no discardRecovery)

  auto next = makeWindow(demoSession());
  QString error;
  const auto rec = next->files()->pendingRecovery(&error);
  ASSERT_TRUE(rec.has_value()) << error.toStdString();
  EXPECT_EQ(formatSession(*rec), onDisk);
  EXPECT_TRUE(sameCloud(rec->a, a));
  next->files()->discardRecovery();
  ASSERT_TRUE(waitIdle(*next));
}

// A save that fails part-way (a full disk, through the write-fault hook) names the file and
// the reason, keeps the previous file as it was and leaves the work marked unsaved.
TEST(SessionFileTest, FailedSaveSaysWhyAndKeepsThePreviousFile) {
  auto w = makeWindow(demoSession());
  const QString path = QString::fromStdString(barrow::test::tempPath("kept.json"));
  ASSERT_TRUE(w->saveTo(path).isEmpty()) << w->lastError().toStdString();
  const std::string before = barrow::test::readText(path.toStdString());
  Cloud a = w->session().a;
  a.points(0, 0) += 1.0;
  w->document()->setCloud(Which::A, a, "edit");
  const WriteFault fault{64};
  w->files()->setSaveFault(&fault);
  const QString e = w->saveTo(path);
  w->files()->setSaveFault(nullptr);
  EXPECT_TRUE(e.startsWith(path)) << e.toStdString();
  EXPECT_TRUE(e.contains("write failed")) << e.toStdString();
  EXPECT_EQ(w->lastError(), e);
  EXPECT_EQ(barrow::test::readText(path.toStdString()), before);
  EXPECT_TRUE(w->document()->isModified());
  w->files()->discardRecovery();
  ASSERT_TRUE(waitIdle(*w));
}

}  // namespace
}  // namespace barrow::ui
