// Exports a plot as PNG, SVG or PDF at a chosen size in pixels (points for PDF), the format
// chosen by the file's extension. Vector formats keep lines and text sharp for reports.
#pragma once

#include <QDialog>
#include <QString>

class QCustomPlot;
class QSpinBox;

namespace barrow::ui {

/// Returns the reason on failure (naming the file), empty on success.
QString exportPlot(QCustomPlot* plot, const QString& path, int width, int height);

/// Asks for the exported figure's size, starting from `current`.
class ExportSizeDialog : public QDialog {
  Q_OBJECT
 public:
  ExportSizeDialog(const QSize& current, QWidget* parent = nullptr);
  QSize size() const;

 private:
  QSpinBox* width_;
  QSpinBox* height_;
};

}  // namespace barrow::ui
