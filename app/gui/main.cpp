// barrow: the desktop application.
//   barrow                  opens the built-in demo scenario
//   barrow FILE             opens a session (.json/.barrow), or a cloud file (CSV/.npy) after
//                           asking which side it replaces (as A in --screenshot mode)
//   barrow --a A --b B      opens two cloud files as A and B
//   barrow --screenshot out.png [--size WxH] [FILE]
//   barrow --scheme dark|light|system   colour scheme (default: the system's palette)
//                           renders the window once every pending computation (live
//                           measures and the sweep) has finished, writes the PNG and exits
#include <QApplication>
#include <QCommandLineParser>
#include <QTimer>
#include <cstdio>

#include "main_window.h"
#include "palette.h"
#include "session_files.h"
#include "scenario/demo_scenario.h"

int main(int argc, char** argv) {
  QApplication app(argc, argv);
  QApplication::setApplicationName("Barrow");
  QApplication::setOrganizationName("Barrow");
  QApplication::setApplicationVersion("0.1.0");

  QCommandLineParser parser;
  parser.setApplicationDescription("Barrow: how distances between two 2-D distributions behave");
  parser.addHelpOption();
  parser.addVersionOption();
  QCommandLineOption shot("screenshot", "Render the window to this PNG once all computations finish, then exit.",
                          "file");
  QCommandLineOption size("size", "Window size for --screenshot, WxH.", "WxH", "1400x900");
  QCommandLineOption timeout("timeout", "Give up on --screenshot after this many seconds.", "s", "600");
  parser.addOption(shot);
  parser.addOption(size);
  parser.addOption(timeout);
  QCommandLineOption cloudA("a", "Cloud file (CSV/.npy) to open as A (with --b).", "file");
  QCommandLineOption cloudB("b", "Cloud file (CSV/.npy) to open as B (with --a).", "file");
  parser.addOption(cloudA);
  parser.addOption(cloudB);
  QCommandLineOption scheme("scheme", "Colour scheme: dark, light or system (the default: follow the system's palette).",
                            "scheme", "system");
  parser.addOption(scheme);
  parser.addPositionalArgument("file", "A session (.json) or a cloud (CSV/.npy) to open.");
  parser.process(app);

  const QString wanted = parser.value(scheme);
  if (wanted != "system" && wanted != "dark" && wanted != "light") {
    std::fprintf(stderr, "barrow: --scheme must be dark, light or system (got '%s')\n", wanted.toLocal8Bit().constData());
    return 2;
  }
  if (wanted != "system")
    barrow::ui::palette::applyScheme(wanted == "dark" ? barrow::ui::palette::Scheme::Dark : barrow::ui::palette::Scheme::Light);

  barrow::ui::MainWindow::Options options;
  options.screenshot = parser.isSet(shot);
  // The demo's sweep only when the demo is what stays open: a sweep of the demo under the
  // user's own clouds would only show up as out of date (and waste a core on large data).
  options.autoSweep = !parser.isSet(cloudA) && parser.positionalArguments().isEmpty();
  barrow::ui::MainWindow window(options);
  window.setSession(barrow::demoSession());
  if (parser.isSet(cloudA) != parser.isSet(cloudB)) {
    std::fprintf(stderr, "barrow: --a and --b go together (give both cloud files)\n");
    return 2;
  }
  if (parser.isSet(cloudA) && !parser.positionalArguments().isEmpty()) {
    std::fprintf(stderr, "barrow: give either a FILE or --a/--b, not both\n");
    return 2;
  }
  if (parser.isSet(cloudA)) {
    const QString e = window.openPair(parser.value(cloudA), parser.value(cloudB));
    if (!e.isEmpty() && options.screenshot) {
      std::fprintf(stderr, "barrow: %s\n", e.toLocal8Bit().constData());
      return 2;
    }
  } else if (!parser.positionalArguments().isEmpty()) {
    const QString path = parser.positionalArguments().first();
    if (options.screenshot) {
      // No dialogs in batch mode: a bad file is an error exit.
      const QString e = window.files()->openSession(path);
      if (!e.isEmpty()) {
        std::fprintf(stderr, "barrow: %s\n", e.toLocal8Bit().constData());
        return 2;
      }
      if (barrow::ui::SessionFiles::isSessionFile(path)) window.setSession(window.session(), path);
    } else {
      window.openFile(path);
    }
  }

  const auto wh = parser.value(size).split('x');
  const int w = wh.size() == 2 ? wh[0].toInt() : 0, h = wh.size() == 2 ? wh[1].toInt() : 0;
  if (options.screenshot || (w > 0 && h > 0 && parser.isSet(size)))
    window.resize(w > 0 ? w : 1400, h > 0 ? h : 900);
  window.show();

  if (options.screenshot) {
    const QString out = parser.value(shot);
    auto render = [&] {
      // Let queued replots run before grabbing.
      QTimer::singleShot(50, &window, [&] {
        const bool ok = window.grab().save(out, "PNG");
        std::fprintf(ok ? stdout : stderr, ok ? "wrote %s\n" : "barrow: cannot write %s\n",
                     out.toLocal8Bit().constData());
        QApplication::exit(ok ? 0 : 1);
      });
    };
    QTimer::singleShot(0, &window, [&] { window.whenIdle(render); });
    QTimer::singleShot(int(parser.value(timeout).toDouble() * 1000), &window, [&] {
      std::fprintf(stderr, "barrow: computations did not finish within %s s\n", parser.value(timeout).toLocal8Bit().constData());
      QApplication::exit(3);
    });
  }
  return app.exec();
}
