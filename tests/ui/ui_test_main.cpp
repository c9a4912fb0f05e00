// Entry point of the widget tests: a QApplication (offscreen under CTest) around GoogleTest.
// CTest runs many test processes at once; each one gets its own private configuration and
// data folders, so settings (the first-run guide flag) and the recovery file are neither the
// user's nor shared with a neighbouring test process.
#include <QApplication>
#include <QTemporaryDir>
#include <gtest/gtest.h>

int main(int argc, char** argv) {
  if (qEnvironmentVariableIsEmpty("QT_QPA_PLATFORM")) qputenv("QT_QPA_PLATFORM", "offscreen");
  QTemporaryDir home;  // removed with everything in it when the process ends
  if (!home.isValid()) return 3;
  for (const char* var : {"XDG_CONFIG_HOME", "XDG_DATA_HOME", "XDG_CACHE_HOME", "XDG_STATE_HOME"})
    qputenv(var, (home.path() + "/" + var).toLocal8Bit());
  QApplication app(argc, argv);
  QApplication::setOrganizationName("BarrowTests");
  QApplication::setApplicationName("barrow_ui_tests");
  ::testing::InitGoogleTest(&argc, argv);
  return RUN_ALL_TESTS();
}
