// The slope pane can be given more room (issue 19, item 3): dragging the border between the
// value pane and the slope pane moves it, within limits, and a drag elsewhere still moves the
// θ cursor. Mouse events are sent to the plot widget as a user's drag would produce them.
#include <gtest/gtest.h>

#include <QApplication>
#include <QMouseEvent>
#include <QTest>
#include <qcustomplot.h>

#include "sweep_plots.h"

namespace barrow::ui {
namespace {

void send(QWidget* w, QEvent::Type type, QPointF at, Qt::MouseButtons buttons) {
  QMouseEvent e(type, at, w->mapToGlobal(at), type == QEvent::MouseMove ? Qt::NoButton : Qt::LeftButton, buttons,
                Qt::NoModifier);
  QApplication::sendEvent(w, &e);
}

TEST(SlopePaneTest, DraggingTheBorderBetweenThePanesResizesThem) {
  SweepPlots plots;
  plots.setRange(0.0, 1.0);
  plots.resize(700, 360);
  plots.show();
  ASSERT_TRUE(QTest::qWaitForWindowExposed(&plots));
  plots.plot()->replot();
  const int before = plots.slopeRect()->rect().height();
  const QRect v = plots.valueRect()->rect();
  const QPointF border(v.center().x(), (v.bottom() + plots.slopeRect()->rect().top()) / 2.0);
  send(plots.plot(), QEvent::MouseButtonPress, border, Qt::LeftButton);
  send(plots.plot(), QEvent::MouseMove, border - QPointF(0, 60), Qt::LeftButton);
  send(plots.plot(), QEvent::MouseButtonRelease, border - QPointF(0, 60), Qt::NoButton);
  plots.plot()->replot();
  EXPECT_GT(plots.slopeRect()->rect().height(), before + 30);  // the slope pane grew by the drag
  EXPECT_FALSE(plots.cursor().has_value());                     // a border drag does not move θ
  // Limits: the value pane keeps at least a fifth of the height.
  plots.setValueShare(0.01);
  EXPECT_NEAR(plots.valueShare(), 0.2, 1e-12);
  // A press inside the value pane still places the θ cursor.
  send(plots.plot(), QEvent::MouseButtonPress, QPointF(v.center().x(), v.top() + 10), Qt::LeftButton);
  send(plots.plot(), QEvent::MouseButtonRelease, QPointF(v.center().x(), v.top() + 10), Qt::NoButton);
  EXPECT_TRUE(plots.cursor().has_value());
}

}  // namespace
}  // namespace barrow::ui
