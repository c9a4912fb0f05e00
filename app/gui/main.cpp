// barrow: the desktop application.
//   barrow                 opens the built-in demo scenario
//   barrow FILE            opens a session (.json) or a cloud pair is not given: a cloud as A
//   barrow --screenshot out.png [--size WxH] [FILE]   renders the window and exits
#include <QApplication>
#include <QCommandLineParser>
#include <QScreen>
#include <QTimer>
#include <cstdio>

#include "io/session_io.h"
#include "main_window.h"
#include "scenario/demo_scenario.h"

int main(int argc, char** argv) {
  QApplication app(argc, argv);
  QApplication::setApplicationName("Barrow");
  QApplication::setOrganizationName("Barrow");

  QCommandLineParser parser;
  parser.setApplicationDescription("Barrow: how distances between two 2-D distributions behave");
  parser.addHelpOption();
  QCommandLineOption shot("screenshot", "Render the window to this PNG and exit.", "file");
  QCommandLineOption size("size", "Window size for --screenshot, WxH.", "WxH", "1400x900");
  parser.addOption(shot);
  parser.addOption(size);
  parser.addPositionalArgument("file", "A session (.json) to open.");
  parser.process(app);

  barrow::Session session = barrow::demoSession();
  if (!parser.positionalArguments().isEmpty()) {
    const auto path = parser.positionalArguments().first().toStdString();
    auto loaded = barrow::readSession(path);
    if (!loaded) {
      std::fprintf(stderr, "barrow: %s\n", loaded.error.text().c_str());
      return 2;
    }
    session = *loaded.value;
  }

  barrow::ui::MainWindow window;
  window.setSession(session);
  const auto wh = parser.value(size).split('x');
  if (wh.size() == 2) window.resize(wh[0].toInt(), wh[1].toInt());
  else window.resize(1400, 900);
  window.show();

  if (parser.isSet(shot)) {
    const QString out = parser.value(shot);
    QTimer::singleShot(300, [&] {
      const bool ok = window.grab().save(out, "PNG");
      std::fprintf(ok ? stdout : stderr, ok ? "wrote %s\n" : "barrow: cannot write %s\n",
                   out.toLocal8Bit().constData());
      QApplication::exit(ok ? 0 : 1);
    });
  }
  return app.exec();
}
