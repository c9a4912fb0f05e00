#include "main_window.h"

#include "field_view.h"

namespace barrow::ui {

MainWindow::MainWindow(QWidget* parent) : QMainWindow(parent), field_(new FieldView(this)) {
  setCentralWidget(field_);
  setWindowTitle("Barrow");
}

void MainWindow::setSession(const Session& s) {
  session_ = s;
  field_->setClouds(session_.a, session_.b);
}

}  // namespace barrow::ui
