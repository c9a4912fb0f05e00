// A short first-run guide laid over the window: what the demo shows and the three things to
// try. Shown once (remembered in the settings), skippable, never under --screenshot.
#pragma once

#include <QFrame>

namespace barrow::ui {

class GettingStarted : public QFrame {
  Q_OBJECT
 public:
  explicit GettingStarted(QWidget* parent);

 signals:
  void dismissed();

 protected:
  bool eventFilter(QObject* watched, QEvent* event) override;

 private:
  void place();
};

}  // namespace barrow::ui
