// The window never shows results as current when they are not: a drag marks the sweep and the
// findings stale (and moving the point back makes them current again); opening a single cloud
// file asks which side it replaces, as a drop does.
#include <gtest/gtest.h>

#include "findings_panel.h"
#include "io/cloud_file.h"
#include "session_document.h"
#include "scenario/demo_scenario.h"
#include "support/test_support.h"
#include "sweep_panel.h"
#include "sweep_plots.h"
#include "ui_test_support.h"

namespace barrow::ui {
namespace {

using test::makeWindow;
using test::sameCloud;
using test::waitIdle;

TEST(WindowTrustTest, DraggingAPointMarksSweepAndFindingsStaleUntilTheyMatchAgain) {
  Session s = demoSession();
  s.sweep.steps = 11;
  s.selected = {"w1", "hausdorff"};
  auto w = makeWindow(s);
  w->sweep()->run();
  ASSERT_TRUE(waitIdle(*w));
  ASSERT_FALSE(w->sweep()->plots()->stale());
  ASSERT_FALSE(w->findings()->stale());
  ASSERT_TRUE(w->sweep()->resultsCurrent());

  // A drag is a preview, then one committed edit; both leave the results out of date.
  SessionDocument* doc = w->document();
  Cloud moved = doc->session().a;
  moved.points(0, 0) += 0.25;
  doc->beginPreview();
  doc->preview(moved, doc->session().b);
  EXPECT_TRUE(w->sweep()->plots()->stale());
  EXPECT_TRUE(w->findings()->stale());
  doc->commitPreview("drag");
  ASSERT_TRUE(waitIdle(*w));
  EXPECT_TRUE(w->sweep()->plots()->stale());
  EXPECT_TRUE(w->findings()->stale());

  // Undo restores the clouds the sweep was computed from: current again.
  doc->undoStack()->undo();
  ASSERT_TRUE(waitIdle(*w));
  EXPECT_TRUE(w->sweep()->resultsCurrent());
  EXPECT_FALSE(w->sweep()->plots()->stale());
  EXPECT_FALSE(w->findings()->stale());
}

TEST(WindowTrustTest, OpeningOneCloudFileAsksWhichSideItReplaces) {
  auto w = makeWindow(demoSession());
  const Session before = w->session();
  const QString path = QString::fromStdString(barrow::test::tempPath("one_side.csv"));
  barrow::test::writeText(path.toStdString(), "x,y\n5,5\n6,6\n");
  int asked = 0;
  w->setDropChooser([&](const QString&) {
    ++asked;
    return std::optional<Which>(Which::B);
  });
  EXPECT_TRUE(w->openFile(path).isEmpty()) << w->lastError().toStdString();
  EXPECT_EQ(asked, 1);
  EXPECT_EQ(w->session().b.size(), 2);
  EXPECT_TRUE(sameCloud(w->session().a, before.a));
  // Cancelling the question changes nothing.
  w->setDropChooser([](const QString&) { return std::optional<Which>(); });
  const Session now = w->session();
  EXPECT_FALSE(w->openFile(path).isEmpty());
  EXPECT_TRUE(sameCloud(w->session().a, now.a));
  EXPECT_TRUE(sameCloud(w->session().b, now.b));
  ASSERT_TRUE(waitIdle(*w));
}

TEST(WindowTrustTest, OpenPairLoadsBothSides) {
  auto w = makeWindow(demoSession());
  const QString a = QString::fromStdString(barrow::test::samplesDir() + "/ring_vs_blob/a.csv");
  const QString b = QString::fromStdString(barrow::test::samplesDir() + "/ring_vs_blob/b.csv");
  EXPECT_TRUE(w->openPair(a, b).isEmpty());
  auto la = readCloudFile(a.toStdString()), lb = readCloudFile(b.toStdString());
  ASSERT_TRUE(la && lb);
  EXPECT_EQ(w->session().a.points, la.value->points);
  EXPECT_EQ(w->session().b.points, lb.value->points);
  ASSERT_TRUE(waitIdle(*w));
}

}  // namespace
}  // namespace barrow::ui

#include "result_text.h"

namespace barrow::ui {
namespace {

// A change between two infinite values is undefined; showing 0 would say "no change" [D].
TEST(WindowTrustTest, ChangeBetweenTwoInfinitiesIsNotZero) {
  EXPECT_EQ(changeText(Result::ok(INFINITY), Result::ok(INFINITY)).toStdString(), "∞ → ∞");
  EXPECT_EQ(changeText(Result::ok(INFINITY), Result::ok(1.0)).toStdString(), "+∞");
  EXPECT_EQ(changeText(Result::ok(2.0), Result::ok(2.0)).toStdString(), "0");
  // ln 2 computed two ways differs in the last bit: that is rounding, not a change.
  EXPECT_EQ(changeText(Result::ok(0.69314718055994529), Result::ok(0.69314718055994506)).toStdString(), "0");
  EXPECT_EQ(changeText(Result::ok(0.6932), Result::ok(0.6931)).toStdString(), "+0.0001");
}

}  // namespace
}  // namespace barrow::ui
