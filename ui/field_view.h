// The Field: draws clouds A and B (Okabe–Ito colours, two marker shapes).
#pragma once

#include <QWidget>

#include "cloud/cloud.h"

class QCustomPlot;

namespace barrow::ui {

class FieldView : public QWidget {
  Q_OBJECT
 public:
  explicit FieldView(QWidget* parent = nullptr);
  void setClouds(const Cloud& a, const Cloud& b);

 private:
  QCustomPlot* plot_;
};

}  // namespace barrow::ui
