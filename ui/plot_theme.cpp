#include "plot_theme.h"

#include <QEvent>
#include <qcustomplot.h>

#include "palette.h"

namespace barrow::ui {

namespace {

// Re-applies the theme on palette changes that switch the scheme (not on every change).
class SchemeFollower : public QObject {
 public:
  SchemeFollower(QCustomPlot* plot, std::function<void()> changed)
      : QObject(plot), plot_(plot), changed_(std::move(changed)), scheme_(palette::currentScheme()) {}

  bool eventFilter(QObject* o, QEvent* e) override {
    if (o == plot_ && (e->type() == QEvent::PaletteChange || e->type() == QEvent::ApplicationPaletteChange)) {
      const palette::Scheme now = palette::currentScheme();
      if (now != scheme_) {
        scheme_ = now;
        applyPlotTheme(plot_);
        if (changed_) changed_();
        plot_->replot(QCustomPlot::rpQueuedReplot);
      }
    }
    return false;
  }

 private:
  QCustomPlot* plot_;
  std::function<void()> changed_;
  palette::Scheme scheme_;
};

}  // namespace

void applyAxisTheme(QCPAxis* a) {
  const palette::Scheme s = palette::currentScheme();
  const QColor text = palette::plotText(s), grid = palette::plotGrid(s);
  a->setBasePen(QPen(text, 0));
  a->setTickPen(QPen(text, 0));
  a->setSubTickPen(QPen(text, 0));
  a->setTickLabelColor(text);
  a->setLabelColor(text);
  a->grid()->setPen(QPen(grid, 0, Qt::DotLine));
  a->grid()->setZeroLinePen(QPen(grid, 0, Qt::SolidLine));
  QColor sub = grid;
  sub.setAlpha(120);
  a->grid()->setSubGridPen(QPen(sub, 0, Qt::DotLine));
}

void applyPlotTheme(QCustomPlot* plot) {
  const palette::Scheme s = palette::currentScheme();
  const QColor bg = palette::plotBackground(s), text = palette::plotText(s);
  plot->setBackground(bg);
  for (QCPAxisRect* r : plot->axisRects()) {
    r->setBackground(Qt::NoBrush);
    for (QCPAxis* a : r->axes()) applyAxisTheme(a);
  }
  if (plot->legend) {
    plot->legend->setBrush(bg);
    plot->legend->setTextColor(text);
    for (int k = 0; k < plot->legend->itemCount(); ++k)
      if (QCPAbstractLegendItem* it = plot->legend->item(k)) it->setTextColor(text);
  }
}

void followScheme(QCustomPlot* plot, std::function<void()> changed) {
  applyPlotTheme(plot);
  plot->installEventFilter(new SchemeFollower(plot, std::move(changed)));
}

}  // namespace barrow::ui
