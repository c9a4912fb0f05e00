// Asks for a generated cloud: shape (Gaussian, mixture, ring, segment, uniform square, two
// interleaved arcs), count, centre, spread, angle, noise, seed, and whether it replaces or
// extends A or B. The engine's generate() makes the points.
#pragma once

#include <QDialog>

#include "scenario/generators.h"
#include "session_document.h"

class QComboBox;
class QSpinBox;
class QDoubleSpinBox;
class QRadioButton;

namespace barrow::ui {

class GeneratorDialog : public QDialog {
  Q_OBJECT
 public:
  GeneratorDialog(Which target, QWidget* parent = nullptr);
  ShapeSpec spec() const;
  Which target() const;
  bool replace() const;
  void setSpec(const ShapeSpec& s);

 private:
  QComboBox* shape_;
  QSpinBox* count_;
  QDoubleSpinBox* cx_;
  QDoubleSpinBox* cy_;
  QDoubleSpinBox* spread_;
  QDoubleSpinBox* angle_;
  QDoubleSpinBox* noise_;
  QSpinBox* seed_;
  QComboBox* target_;
  QRadioButton* replace_;
  QRadioButton* append_;
};

}  // namespace barrow::ui
