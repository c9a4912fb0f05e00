#include "size_plot.h"

#include <QLabel>
#include <QVBoxLayout>
#include <cmath>
#include <qcustomplot.h>

#include "measure_style.h"
#include "plot_theme.h"

namespace barrow::ui {

SizePlot::SizePlot(QWidget* parent) : QWidget(parent), plot_(new QCustomPlot(this)), caption_(new QLabel(this)) {
  auto* layout = new QVBoxLayout(this);
  layout->setContentsMargins(2, 2, 2, 2);
  layout->addWidget(plot_, 1);
  layout->addWidget(caption_);
  plot_->setObjectName("sizePlot");
  caption_->setObjectName("sizeCaption");
  caption_->setWordWrap(true);
  auto log = QSharedPointer<QCPAxisTickerLog>(new QCPAxisTickerLog);
  plot_->xAxis->setScaleType(QCPAxis::stLogarithmic);
  plot_->xAxis->setTicker(log);
  plot_->yAxis->setScaleType(QCPAxis::stLogarithmic);
  plot_->yAxis->setTicker(QSharedPointer<QCPAxisTickerLog>(new QCPAxisTickerLog));
  plot_->xAxis->setLabel(tr("points per cloud n"));
  plot_->yAxis->setLabel(tr("mean value"));
  plot_->setMinimumHeight(140);
  followScheme(plot_);
  clear(tr("Run Resampling ▸ Intervals and p-values to see how the selected measure changes with n."));
}

void SizePlot::clear(const QString& hint) {
  plot_->clearGraphs();
  plot_->clearPlottables();
  plot_->replot();
  text_ = hint;
  caption_->setText(hint);
}

void SizePlot::setResult(const SizesResult& r, const std::string& id) {
  plot_->clearGraphs();
  plot_->clearPlottables();
  const SizesRow* row = nullptr;
  for (const auto& x : r.rows)
    if (x.id == id) row = &x;
  if (!row) {
    clear(tr("No size ladder for %1 yet.").arg(QString::fromStdString(id)));
    return;
  }
  QVector<double> n, mean, err;
  for (std::size_t s = 0; s < r.sizes.size() && s < row->mean.size(); ++s) {
    if (!(std::isfinite(row->mean[s]) && row->mean[s] > 0)) continue;
    n.push_back(r.sizes[s]);
    mean.push_back(row->mean[s]);
    err.push_back(std::isfinite(row->sd[s]) ? row->sd[s] : 0.0);
  }
  auto* g = plot_->addGraph();
  g->setData(n, mean, true);
  QPen pen = measurePen(id, 2.0);
  g->setPen(pen);
  g->setScatterStyle(QCPScatterStyle(QCPScatterStyle::ssDisc, 6));
  auto* bars = new QCPErrorBars(plot_->xAxis, plot_->yAxis);
  bars->setDataPlottable(g);
  bars->setData(err);
  bars->setPen(pen);
  plot_->rescaleAxes();
  plot_->xAxis->scaleRange(1.15, plot_->xAxis->range().center());
  plot_->yAxis->scaleRange(1.3, plot_->yAxis->range().center());
  plot_->replot();
  const QString slope = std::isfinite(row->slope) ? QString::number(row->slope, 'f', 2) : QString("—");
  text_ = tr("%1: log–log slope %2 over n = %3…%4 (%5 subsamples per n, ±1 sd). A slope below 0 means the "
             "value on these clouds still falls as points are added: part of it is sample-size bias.")
              .arg(QString::fromStdString(id), slope)
              .arg(r.sizes.empty() ? 0 : r.sizes.front())
              .arg(r.sizes.empty() ? 0 : r.sizes.back())
              .arg(r.request.repeats);
  caption_->setText(stale_ ? tr("(stale: the clouds changed) ") + text_ : text_);
}

void SizePlot::setStale(bool stale) {
  stale_ = stale;
  caption_->setText(stale_ ? tr("(stale: the clouds changed) ") + text_ : text_);
  for (int k = 0; k < plot_->plottableCount(); ++k) {
    QPen p = plot_->plottable(k)->pen();
    QColor c = p.color();
    c.setAlphaF(stale ? 0.3 : 1.0);
    p.setColor(c);
    plot_->plottable(k)->setPen(p);
  }
  plot_->replot();
}

QString SizePlot::caption() const { return caption_->text(); }

}  // namespace barrow::ui
