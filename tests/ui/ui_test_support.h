// Helpers for the widget tests: a main window without dialogs, waiting for the workers, and
// mouse positions on the Field in data coordinates.
#pragma once

#include <QApplication>
#include <QElapsedTimer>
#include <QSettings>
#include <QTest>
#include <gtest/gtest.h>
#include <memory>
#include <qcustomplot.h>

#include "field_view.h"
#include "main_window.h"

namespace barrow::ui::test {

/// A window as a user gets it, but reporting errors without modal dialogs, without the
/// first-run guide, and sweeping only when asked.
inline std::unique_ptr<MainWindow> makeWindow(const Session& s, bool autoSweep = false) {
  QSettings().setValue("ui/gettingStartedShown", true);
  // Each window starts from the default layout, not from one an earlier test left behind.
  QSettings().remove("ui/geometry");
  QSettings().remove("ui/state");
  MainWindow::Options o;
  o.quiet = true;
  o.autoSweep = autoSweep;
  auto w = std::make_unique<MainWindow>(o);
  w->resize(1400, 900);
  w->setSession(s);
  w->show();
  EXPECT_TRUE(QTest::qWaitForWindowExposed(w.get()));
  return w;
}

/// Processes events until nothing is computing (or the time runs out; returns false then).
inline bool waitIdle(MainWindow& w, int timeoutMs = 120000) {
  QElapsedTimer t;
  t.start();
  do {
    QApplication::processEvents(QEventLoop::AllEvents, 20);
    if (!w.busy()) {
      QApplication::processEvents();  // queued replots
      if (!w.busy()) return true;
    }
    QTest::qWait(5);
  } while (t.elapsed() < timeoutMs);
  return false;
}

/// Pixel of the data point (x, y) on the Field's plot widget.
inline QPoint fieldPixel(const FieldView& v, double x, double y) {
  return QPoint(int(std::lround(v.plot()->xAxis->coordToPixel(x))),
                int(std::lround(v.plot()->yAxis->coordToPixel(y))));
}

inline bool sameCloud(const Cloud& x, const Cloud& y) {
  return x.points.rows() == y.points.rows() && x.weights.size() == y.weights.size() && x.points == y.points &&
         x.weights == y.weights;
}

}  // namespace barrow::ui::test
