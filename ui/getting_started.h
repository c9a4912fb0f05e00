// A short first-run guide laid over the window: what the demo shows and the three things to
// try. Shown once (remembered in the settings), skippable, never under --screenshot.
#pragma once

#include <QFrame>

class QLabel;

namespace barrow::ui {

class GettingStarted : public QFrame {
  Q_OBJECT
 public:
  explicit GettingStarted(QWidget* parent);
  /// Whether the demo is what the window shows: the guide describes it only then, and speaks
  /// of "your clouds" otherwise.
  void setDemoShown(bool demo);
  QString text() const;

 signals:
  void dismissed();

 protected:
  bool eventFilter(QObject* watched, QEvent* event) override;

 private:
  void place();
  QLabel* text_;
};

}  // namespace barrow::ui
