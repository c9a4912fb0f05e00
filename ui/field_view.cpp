#include "field_view.h"

#include <QVBoxLayout>
#include <qcustomplot.h>

#include "palette.h"

namespace barrow::ui {

FieldView::FieldView(QWidget* parent) : QWidget(parent), plot_(new QCustomPlot(this)) {
  auto* layout = new QVBoxLayout(this);
  layout->setContentsMargins(0, 0, 0, 0);
  layout->addWidget(plot_);
  plot_->legend->setVisible(true);
}

void FieldView::setClouds(const Cloud& a, const Cloud& b) {
  plot_->clearGraphs();
  auto add = [&](const Cloud& c, const QColor& color, QCPScatterStyle::ScatterShape shape) {
    auto* g = plot_->addGraph();
    QVector<double> x(c.size()), y(c.size());
    for (Eigen::Index i = 0; i < c.size(); ++i) {
      x[i] = c.points(i, 0);
      y[i] = c.points(i, 1);
    }
    g->setData(x, y);
    g->setLineStyle(QCPGraph::lsNone);
    g->setScatterStyle(QCPScatterStyle(shape, color, color, 6));
    g->setName(QString::fromStdString(c.name));
  };
  add(a, palette::cloudA(), QCPScatterStyle::ssDisc);
  add(b, palette::cloudB(), QCPScatterStyle::ssTriangle);
  plot_->rescaleAxes();
  plot_->xAxis->scaleRange(1.1);
  plot_->yAxis->scaleRange(1.1);
  plot_->replot();
}

}  // namespace barrow::ui
