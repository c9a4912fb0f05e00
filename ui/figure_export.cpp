#include "figure_export.h"

#include <QDialogButtonBox>
#include <QFileInfo>
#include <QFormLayout>
#include <QSpinBox>
#include <QSvgGenerator>
#include <qcustomplot.h>

namespace barrow::ui {

QString exportPlot(QCustomPlot* plot, const QString& path, int width, int height) {
  if (width < 16 || height < 16 || width > 20000 || height > 20000)
    return QObject::tr("%1: size %2×%3 is outside 16…20000 pixels").arg(path).arg(width).arg(height);
  const QString suffix = QFileInfo(path).suffix().toLower();
  bool ok = false;
  if (suffix == "png") {
    ok = plot->savePng(path, width, height, 1.0, -1, 96);
  } else if (suffix == "pdf") {
    ok = plot->savePdf(path, width, height, QCP::epNoCosmetic, "Barrow", plot->objectName());
  } else if (suffix == "svg") {
    QSvgGenerator gen;
    gen.setFileName(path);
    gen.setSize(QSize(width, height));
    gen.setViewBox(QRect(0, 0, width, height));
    gen.setTitle(plot->objectName());
    gen.setDescription(QObject::tr("Exported by Barrow"));
    QCPPainter painter;
    ok = painter.begin(&gen);
    if (ok) {
      plot->toPainter(&painter, width, height);
      ok = painter.end();
    }
    ok = ok && QFileInfo(path).size() > 0;
  } else {
    return QObject::tr("%1: unknown figure format '%2' (use .png, .svg or .pdf)").arg(path, suffix);
  }
  return ok ? QString() : QObject::tr("%1: could not be written (check the folder exists and is writable)").arg(path);
}

ExportSizeDialog::ExportSizeDialog(const QSize& current, QWidget* parent) : QDialog(parent) {
  setWindowTitle(tr("Figure size"));
  width_ = new QSpinBox(this);
  height_ = new QSpinBox(this);
  for (QSpinBox* s : {width_, height_}) {
    s->setRange(16, 20000);
    s->setSuffix(tr(" px"));
  }
  width_->setValue(current.width());
  height_->setValue(current.height());
  width_->setToolTip(tr("Width of the exported figure in pixels (points for PDF)"));
  height_->setToolTip(tr("Height of the exported figure in pixels (points for PDF)"));
  auto* form = new QFormLayout(this);
  form->addRow(tr("Width"), width_);
  form->addRow(tr("Height"), height_);
  auto* buttons = new QDialogButtonBox(QDialogButtonBox::Ok | QDialogButtonBox::Cancel, this);
  form->addRow(buttons);
  connect(buttons, &QDialogButtonBox::accepted, this, &QDialog::accept);
  connect(buttons, &QDialogButtonBox::rejected, this, &QDialog::reject);
}

QSize ExportSizeDialog::size() const { return {width_->value(), height_->value()}; }

}  // namespace barrow::ui
