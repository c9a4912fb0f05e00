#include "generator_dialog.h"

#include <QComboBox>
#include <QDialogButtonBox>
#include <QDoubleSpinBox>
#include <QFormLayout>
#include <QHBoxLayout>
#include <QRadioButton>
#include <QSpinBox>
#include <cmath>

namespace barrow::ui {

namespace {

QString shapeLabel(const std::string& s) {
  if (s == "gaussian") return QObject::tr("Gaussian blob");
  if (s == "mixture") return QObject::tr("Mixture of three blobs");
  if (s == "ring") return QObject::tr("Ring");
  if (s == "segment") return QObject::tr("Segment");
  if (s == "square") return QObject::tr("Uniform square");
  if (s == "arcs") return QObject::tr("Two interleaved arcs");
  return QString::fromStdString(s);
}

QDoubleSpinBox* spin(QWidget* p, double lo, double hi, double v, const QString& tip) {
  auto* s = new QDoubleSpinBox(p);
  s->setRange(lo, hi);
  s->setDecimals(3);
  s->setValue(v);
  s->setToolTip(tip);
  return s;
}

}  // namespace

GeneratorDialog::GeneratorDialog(Which target, QWidget* parent) : QDialog(parent) {
  setWindowTitle(tr("Generate a cloud"));
  shape_ = new QComboBox(this);
  for (const auto& s : shapeNames()) shape_->addItem(shapeLabel(s), QString::fromStdString(s));
  shape_->setToolTip(tr("Shape of the generated cloud"));
  count_ = new QSpinBox(this);
  count_->setRange(1, 200000);
  count_->setValue(200);
  count_->setToolTip(tr("Number of points (uniform weights)"));
  cx_ = spin(this, -1e6, 1e6, 0, tr("Centre, x"));
  cy_ = spin(this, -1e6, 1e6, 0, tr("Centre, y"));
  spread_ = spin(this, 1e-6, 1e6, 1, tr("Size of the shape: standard deviation, radius, half-length or half-side"));
  angle_ = spin(this, -360, 360, 0, tr("Orientation in degrees (segment, arcs, mixture)"));
  noise_ = spin(this, 0, 1e6, 0.03, tr("Extra Gaussian jitter for ring, segment and arcs (same units)"));
  seed_ = new QSpinBox(this);
  seed_->setRange(0, 2147483647);
  seed_->setValue(1);
  seed_->setToolTip(tr("Random seed: the same settings and seed give the same points"));
  target_ = new QComboBox(this);
  target_->addItems({tr("A"), tr("B")});
  target_->setCurrentIndex(target == Which::A ? 0 : 1);
  target_->setToolTip(tr("Which cloud receives the points"));
  replace_ = new QRadioButton(tr("replace the cloud"), this);
  append_ = new QRadioButton(tr("add to the cloud"), this);
  replace_->setChecked(true);
  replace_->setToolTip(tr("The generated points take the cloud's place"));
  append_->setToolTip(tr("The generated points join the existing ones (weights: the cloud's mean weight)"));
  auto* mode = new QWidget(this);
  auto* ml = new QHBoxLayout(mode);
  ml->setContentsMargins(0, 0, 0, 0);
  ml->addWidget(replace_);
  ml->addWidget(append_);
  auto* centre = new QWidget(this);
  auto* cl = new QHBoxLayout(centre);
  cl->setContentsMargins(0, 0, 0, 0);
  cl->addWidget(cx_);
  cl->addWidget(cy_);

  auto* form = new QFormLayout(this);
  form->addRow(tr("Shape"), shape_);
  form->addRow(tr("Points"), count_);
  form->addRow(tr("Centre (x, y)"), centre);
  form->addRow(tr("Spread"), spread_);
  form->addRow(tr("Angle (°)"), angle_);
  form->addRow(tr("Noise"), noise_);
  form->addRow(tr("Seed"), seed_);
  form->addRow(tr("Into"), target_);
  form->addRow(QString(), mode);
  auto* buttons = new QDialogButtonBox(QDialogButtonBox::Ok | QDialogButtonBox::Cancel, this);
  form->addRow(buttons);
  connect(buttons, &QDialogButtonBox::accepted, this, &QDialog::accept);
  connect(buttons, &QDialogButtonBox::rejected, this, &QDialog::reject);
}

ShapeSpec GeneratorDialog::spec() const {
  ShapeSpec s;
  s.shape = shape_->currentData().toString().toStdString();
  s.count = count_->value();
  s.center = {cx_->value(), cy_->value()};
  s.spread = spread_->value();
  s.angle = angle_->value() * M_PI / 180.0;
  s.noise = noise_->value();
  s.seed = std::uint64_t(seed_->value());
  return s;
}

void GeneratorDialog::setSpec(const ShapeSpec& s) {
  shape_->setCurrentIndex(std::max(0, shape_->findData(QString::fromStdString(s.shape))));
  count_->setValue(s.count);
  cx_->setValue(s.center.x());
  cy_->setValue(s.center.y());
  spread_->setValue(s.spread);
  angle_->setValue(s.angle * 180.0 / M_PI);
  noise_->setValue(s.noise);
  seed_->setValue(int(s.seed));
}

Which GeneratorDialog::target() const { return target_->currentIndex() == 0 ? Which::A : Which::B; }
bool GeneratorDialog::replace() const { return replace_->isChecked(); }

}  // namespace barrow::ui
