// Barrow's main window.
#pragma once

#include <QMainWindow>

#include "io/session_io.h"

namespace barrow::ui {

class FieldView;

class MainWindow : public QMainWindow {
  Q_OBJECT
 public:
  explicit MainWindow(QWidget* parent = nullptr);
  void setSession(const Session& s);
  const Session& session() const { return session_; }

 private:
  Session session_;
  FieldView* field_;
};

}  // namespace barrow::ui
