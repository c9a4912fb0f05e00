// How the window keeps up while a point is dragged (the real MainWindow, offscreen).
//
// BM_DragToMeasures/n: time from one mouse-move event of a drag on the Field to the first
// update of the Measures table and the plan for the new position, applied to the widgets
// and painted: every cheap measure (Measure::cheap()) plus the exact plan when the W2
// measure is registered. n points in A and n in B. Reported: median, p90 and max in ms.
//
// BM_DragStall/n: a drag at 60 mouse moves per second for 3 s; a 1 ms timer on the GUI
// thread records the longest gap between its ticks, i.e. the longest time the event loop
// was blocked (a frozen window). Reported: max and p99 gap in ms, updates drawn.
//
// Run: build with -DBARROW_BUILD_BENCH=ON (and the UI), then
//   QT_QPA_PLATFORM=offscreen ./tests/bench/bench_ui_drag
#include <benchmark/benchmark.h>

#include <QApplication>
#include <QElapsedTimer>
#include <QMouseEvent>
#include <QSettings>
#include <QStandardPaths>
#include <QTimer>
#include <algorithm>
#include <chrono>
#include <qcustomplot.h>

#include "field_panel.h"
#include "field_view.h"
#include "segment_layer.h"
#include "live_evaluator.h"
#include "main_window.h"
#include "measures/registry.h"
#include "scenario/generators.h"

namespace {

using barrow::Session;
using barrow::ui::MainWindow;

Session pair(int n) {
  Session s;
  barrow::ShapeSpec spec;
  spec.shape = "gaussian";
  spec.count = n;
  spec.spread = 0.5;
  spec.seed = 11;
  s.a = barrow::generate(spec, "A");
  spec.shape = "ring";
  spec.center = {1.5, 0.0};
  spec.spread = 0.8;
  spec.noise = 0.05;
  spec.seed = 12;
  s.b = barrow::generate(spec, "B");
  s.sweep.from = -1;
  s.sweep.to = 3;
  s.sweep.reference = 0.0;
  return s;
}

std::unique_ptr<MainWindow> bareWindow() {
  MainWindow::Options o;
  o.screenshot = true;  // no first-run guide, no autosave
  o.quiet = true;
  o.autoSweep = false;
  auto w = std::make_unique<MainWindow>(o);
  w->resize(1400, 900);
  w->show();
  return w;
}

// Up to 10^4 points the window is left to finish everything (the plan included); above, only
// until the quick measures are on screen (the slow ones take minutes at 10^5; a drag abandons
// them).
std::unique_ptr<MainWindow> window(int n) {
  auto w = bareWindow();
  bool quick = false;
  auto c = QObject::connect(w.get(), &MainWindow::liveUpdated, w.get(),
                            [&](const barrow::ui::LiveUpdate& u) { quick = quick || !u.items.empty(); });
  w->setSession(pair(n));
  if (n <= 10000) {
    while (w->busy()) QApplication::processEvents(QEventLoop::AllEvents, 10);
  } else {
    while (!quick) QApplication::processEvents(QEventLoop::AllEvents, 10);
  }
  QObject::disconnect(c);
  QApplication::processEvents();
  return w;
}

void sendMouse(QWidget* target, QEvent::Type type, const QPointF& pos, Qt::MouseButtons buttons) {
  const Qt::MouseButton button = type == QEvent::MouseMove ? Qt::NoButton : Qt::LeftButton;
  QMouseEvent e(type, pos, target->mapToGlobal(pos), button, buttons, Qt::NoModifier);
  QApplication::sendEvent(target, &e);
}

double quantile(std::vector<double> v, double q) {
  if (v.empty()) return 0;
  std::sort(v.begin(), v.end());
  return v[std::min(v.size() - 1, std::size_t(q * double(v.size() - 1) + 0.5))];
}

QPointF pixelOfA0(MainWindow& w) {
  const auto* view = w.field()->view();
  const auto& a = w.session().a;
  return QPointF(view->plot()->xAxis->coordToPixel(a.points(0, 0)), view->plot()->yAxis->coordToPixel(a.points(0, 1)));
}

void BM_DragToMeasures(benchmark::State& state) {
  const int n = int(state.range(0));
  auto w = window(n);
  QWidget* plot = w->field()->view()->plot();
  const QPointF p0 = pixelOfA0(*w);
  sendMouse(plot, QEvent::MouseButtonPress, p0, Qt::LeftButton);
  quint64 waitingFor = 0;
  bool arrived = false;
  std::vector<double> ms, worker;
  QObject::connect(w.get(), &MainWindow::liveUpdated, w.get(), [&](const barrow::ui::LiveUpdate& u) {
    if (u.request < waitingFor || u.items.empty() || arrived) return;
    arrived = true;
    worker.push_back(1e3 * u.secondsSinceSubmit);
  });
  int k = 0;
  for (auto _ : state) {
    ++k;
    const QPointF to = p0 + QPointF(3.0 * (k % 25), 2.0 * (k % 7));
    waitingFor = w->liveRequest() + 1;  // the request this move will cause
    arrived = false;
    const auto t0 = std::chrono::steady_clock::now();
    sendMouse(plot, QEvent::MouseMove, to, Qt::LeftButton);
    while (!arrived) QApplication::processEvents(QEventLoop::WaitForMoreEvents, 5);
    QApplication::processEvents();  // queued replots and paints of the new values
    const double s = std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count();
    state.SetIterationTime(s);
    ms.push_back(1e3 * s);
  }
  sendMouse(plot, QEvent::MouseButtonRelease, p0, Qt::NoButton);
  while (w->busy()) QApplication::processEvents(QEventLoop::AllEvents, 10);
  state.counters["median_ms"] = quantile(ms, 0.5);
  state.counters["p90_ms"] = quantile(ms, 0.9);
  state.counters["max_ms"] = quantile(ms, 1.0);
  // The worker's share: from the request leaving the GUI thread to the update leaving the
  // worker (the rest is the event loop, the widgets and painting).
  state.counters["worker_median_ms"] = quantile(worker, 0.5);
  int cheap = 0;
  for (const auto* m : barrow::MeasureRegistry::instance().all()) cheap += m->cheap() ? 1 : 0;
  state.counters["cheap_measures"] = cheap;
  state.counters["exact_plan"] = barrow::MeasureRegistry::instance().find("w2") ? 1 : 0;
}

void BM_DragStall(benchmark::State& state) {
  const int n = int(state.range(0));
  auto w = window(n);
  QWidget* plot = w->field()->view()->plot();
  const QPointF p0 = pixelOfA0(*w);
  std::vector<double> gaps, moveMs;  // moveMs: the move event's own handler (synchronous part)
  int updates = 0;
  QObject::connect(w.get(), &MainWindow::liveUpdated, w.get(), [&](const barrow::ui::LiveUpdate& u) {
    if (!u.items.empty()) ++updates;
  });
  for (auto _ : state) {
    gaps.clear();
    moveMs.clear();
    updates = 0;
    sendMouse(plot, QEvent::MouseButtonPress, p0, Qt::LeftButton);
    QElapsedTimer clock;
    clock.start();
    qint64 last = clock.nsecsElapsed();
    QTimer tick;
    tick.setTimerType(Qt::PreciseTimer);
    QObject::connect(&tick, &QTimer::timeout, [&] {
      const qint64 now = clock.nsecsElapsed();
      gaps.push_back(1e-6 * double(now - last));
      last = now;
    });
    int k = 0;
    QTimer mover;
    mover.setTimerType(Qt::PreciseTimer);
    QObject::connect(&mover, &QTimer::timeout, [&] {
      ++k;
      QElapsedTimer handler;
      handler.start();
      sendMouse(plot, QEvent::MouseMove, p0 + QPointF(2.0 * (k % 40), 1.0 * (k % 9)), Qt::LeftButton);
      moveMs.push_back(1e-6 * double(handler.nsecsElapsed()));
    });
    tick.start(1);
    mover.start(16);
    while (clock.elapsed() < 3000) QApplication::processEvents(QEventLoop::WaitForMoreEvents, 5);
    mover.stop();
    tick.stop();
    sendMouse(plot, QEvent::MouseButtonRelease, p0, Qt::NoButton);
    if (n <= 10000)
      while (w->busy()) QApplication::processEvents(QEventLoop::AllEvents, 10);
  }
  state.counters["max_gap_ms"] = quantile(gaps, 1.0);
  state.counters["p99_gap_ms"] = quantile(gaps, 0.99);
  state.counters["updates_drawn"] = updates;
  state.counters["move_handler_max_ms"] = quantile(moveMs, 1.0);
  state.counters["move_handler_median_ms"] = quantile(moveMs, 0.5);
}

// BM_LoadToQuickMeasures/n: from handing the window two new clouds of n points (as Open does
// after reading the files) to the first Measures update painted: the measures forecast to take
// under a quarter of a second on these clouds (the rest stream in afterwards).
void BM_LoadToQuickMeasures(benchmark::State& state) {
  const int n = int(state.range(0));
  const Session s = pair(n);
  std::vector<double> ms, worker;
  int shown = 0;
  for (auto _ : state) {
    auto w = bareWindow();
    QApplication::processEvents();
    bool arrived = false;
    QObject::connect(w.get(), &MainWindow::liveUpdated, w.get(), [&](const barrow::ui::LiveUpdate& u) {
      if (arrived || u.items.empty()) return;
      arrived = true;
      shown = int(u.items.size());
      worker.push_back(1e3 * u.secondsSinceSubmit);
    });
    const auto t0 = std::chrono::steady_clock::now();
    w->setSession(s);
    while (!arrived) QApplication::processEvents(QEventLoop::WaitForMoreEvents, 5);
    QApplication::processEvents();  // the table and the Field painted
    const double sec = std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count();
    state.SetIterationTime(sec);
    ms.push_back(1e3 * sec);
  }
  state.counters["median_ms"] = quantile(ms, 0.5);
  state.counters["worker_median_ms"] = quantile(worker, 0.5);  // request submitted → update sent
  state.counters["first_update_measures"] = shown;
}

// BM_FieldReplot/n: one full redraw of the Field (both clouds, the exact plan's segments,
// legend, axes) with nothing else running: the GUI thread's share of a drag step.
void BM_FieldReplot(benchmark::State& state) {
  auto w = window(int(state.range(0)));
  QCustomPlot* plot = w->field()->view()->plot();
  for (auto _ : state) plot->replot(QCustomPlot::rpImmediateRefresh);
  state.counters["segments"] = double(w->field()->view()->exactLayer()->segmentCount());
}

BENCHMARK(BM_FieldReplot)->Arg(300)->Arg(2000)->Arg(10000)->Arg(100000)->Unit(benchmark::kMillisecond);
BENCHMARK(BM_LoadToQuickMeasures)->Arg(10000)->Arg(100000)->UseManualTime()->Iterations(3)->Unit(benchmark::kMillisecond);
BENCHMARK(BM_DragToMeasures)->Arg(300)->Arg(2000)->Arg(10000)->UseManualTime()->Iterations(20)->Unit(benchmark::kMillisecond);
BENCHMARK(BM_DragStall)->Arg(300)->Arg(2000)->Arg(10000)->Arg(100000)->Iterations(1)->Unit(benchmark::kMillisecond);

}  // namespace

int main(int argc, char** argv) {
  if (qEnvironmentVariableIsEmpty("QT_QPA_PLATFORM")) qputenv("QT_QPA_PLATFORM", "offscreen");
  QStandardPaths::setTestModeEnabled(true);
  QApplication app(argc, argv);
  QApplication::setOrganizationName("BarrowBench");
  benchmark::Initialize(&argc, argv);
  benchmark::RunSpecifiedBenchmarks();
  benchmark::Shutdown();
  return 0;
}
