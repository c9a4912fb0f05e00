#include "field_view.h"

#include <QEvent>
#include <QLabel>
#include <QVBoxLayout>
#include <algorithm>
#include <qcustomplot.h>

#include "cloud_layer.h"
#include "palette.h"
#include "plot_theme.h"
#include "segment_layer.h"
#include "viridis.h"

namespace barrow::ui {

FieldView::FieldView(QWidget* parent)
    : QWidget(parent), plot_(new QCustomPlot(this)), readout_(new QLabel(this)) {
  auto* layout = new QVBoxLayout(this);
  layout->setContentsMargins(0, 0, 0, 0);
  layout->setSpacing(2);
  layout->addWidget(plot_, 1);
  layout->addWidget(readout_);
  readout_->setTextFormat(Qt::PlainText);
  readout_->setSizePolicy(QSizePolicy::Ignored, QSizePolicy::Preferred);  // long text must not widen the window
  readout_->setMinimumHeight(readout_->fontMetrics().height() + 4);
  readout_->setToolTip(tr("Hover a point to see where its mass goes under the exact plan"));
  plot_->setObjectName("fieldPlot");
  plot_->setFocusPolicy(Qt::ClickFocus);  // clicking the Field gives it the editing keys
  plot_->setToolTip(QString());
  plot_->setInteractions(QCP::iRangeZoom);
  plot_->setAntialiasedElements(QCP::aePlottables);
  plot_->xAxis->setLabel("x");
  plot_->yAxis->setLabel("y");
  plot_->installEventFilter(this);
  // Ranges are set after each layout pass, when the axis rect has its final size. Once the
  // user zooms or pans, resizing keeps their view instead of refitting.
  connect(plot_, &QCustomPlot::afterLayout, this, &FieldView::applyView);
  connect(plot_, &QCustomPlot::mouseWheel, this, [this] { userView_ = true; });
  connect(plot_, &QCustomPlot::mousePress, this, [this] {
    if (plot_->interactions().testFlag(QCP::iRangeDrag)) userView_ = true;
  });

  heat_ = new QCPColorMap(plot_->xAxis, plot_->yAxis);
  heat_->setGradient(viridisGradient());
  heat_->setInterpolate(true);
  heat_->setName(tr("W1 potential φ"));
  heat_->setVisible(false);
  scale_ = new QCPColorScale(plot_);
  scale_->setType(QCPAxis::atRight);
  scale_->setGradient(viridisGradient());
  scale_->axis()->setLabel(tr("φ (cost units)"));
  scale_->setBarWidth(10);
  scale_->setVisible(false);
  heat_->setColorScale(scale_);

  auto makeLayer = [&](const QColor& c, MarkerShape s, double size, const QString& name) {
    auto* l = new CloudLayer(plot_->xAxis, plot_->yAxis);
    l->setStyle(c, s, size);
    l->setName(name);
    return l;
  };
  ghost_ = makeLayer(palette::cloudA(), MarkerShape::Disc, 6, tr("A before the move"));
  ghost_->setHollow(true);
  ghost_->setVisible(false);
  entropic_ = new SegmentLayer(plot_->xAxis, plot_->yAxis);
  entropic_->setColor(palette::entropicPlan());
  entropic_->setDashed(true);
  entropic_->setVisible(false);
  exact_ = new SegmentLayer(plot_->xAxis, plot_->yAxis);
  exact_->setColor(palette::exactPlan());
  exact_->setVisible(false);
  cloudB_ = makeLayer(palette::cloudB(), MarkerShape::Triangle, 8, "B");
  cloudA_ = makeLayer(palette::cloudA(), MarkerShape::Disc, 7, "A");
  interp_ = makeLayer(palette::interpolation(), MarkerShape::Diamond, 6, tr("interpolation"));
  interp_->setVisible(false);

  plot_->legend->setVisible(true);
  // The plot, the plan's neutral colour, the legend's translucent box and the colour scale
  // in the application's scheme.
  auto colour = [this] {
    exact_->setColor(palette::exactPlan());
    QColor fill = palette::plotBackground(palette::currentScheme());
    fill.setAlpha(215);
    plot_->legend->setBrush(fill);
    applyAxisTheme(scale_->axis());
  };
  followScheme(plot_, colour);
  colour();
  plot_->legend->setFont(font());
  plot_->axisRect()->insetLayout()->setInsetAlignment(0, Qt::AlignTop | Qt::AlignLeft);
  refresh();
}

CloudLayer* FieldView::layer(Which w) const { return w == Which::A ? cloudA_ : cloudB_; }

void FieldView::setClouds(const Cloud& a, const Cloud& b) {
  a_ = a;
  b_ = b;
  cloudA_->setData(a.points, a.weights);
  cloudB_->setData(b.points, b.weights);
  // Keep drawn plans attached to the points they connect while the points move; the new plan
  // replaces them when it arrives.
  if (!exactPlan_.empty()) exact_->setPlan(exactPlan_, a_.points, b_.points);
  if (entropic_->visible()) entropic_->setPlan(entropicPlan_, a_.points, b_.points, SegmentLayer::kHazeBudget);
  cloudA_->setName(QString::fromStdString("A: " + (a.name.empty() ? std::string("cloud A") : a.name)));
  cloudB_->setName(QString::fromStdString("B: " + (b.name.empty() ? std::string("cloud B") : b.name)));
  if (!everFitted_ && (a.size() > 0 || b.size() > 0)) {
    everFitted_ = true;
    fitToData();
  }
  rebuildInterpolation();
  if (hoverIndex_ >= 0) readout_->setText(describePoint(hoverWhich_, hoverIndex_));
  refresh();
}

void FieldView::setGhost(const std::optional<Cloud>& a0) {
  if (!a0 && !ghost_->visible()) return;
  ghost_->setVisible(a0.has_value());
  if (a0) ghost_->setData(a0->points, a0->weights);
  refresh();
}

void FieldView::setExactPlan(const std::vector<PlanEntry>& plan, const QString& label) {
  exactPlan_ = plan;
  exact_->setPlan(plan, a_.points, b_.points);
  exact_->setLabel(label);
  exact_->setVisible(exactSegmentsShown_);
  rebuildInterpolation();
  refresh();
}

void FieldView::setEntropicPlan(const std::vector<PlanEntry>& plan, const QString& label) {
  entropicPlan_ = plan;
  entropic_->setPlan(plan, a_.points, b_.points, SegmentLayer::kHazeBudget);
  entropic_->setLabel(label);
  entropic_->setVisible(true);
  refresh();
}

void FieldView::setExactSegmentsShown(bool shown) {
  exactSegmentsShown_ = shown;
  exact_->setVisible(shown && !exactPlan_.empty());
  refresh();
}

void FieldView::clearExactPlan() {
  exactPlan_.clear();
  exact_->clearPlan();
  exact_->setVisible(false);
  rebuildInterpolation();
  refresh();
}

void FieldView::clearEntropicPlan() {
  entropicPlan_.clear();
  entropic_->clearPlan();
  entropic_->setVisible(false);
  refresh();
}

void FieldView::clearPlans() {
  exactPlan_.clear();
  exact_->clearPlan();
  exact_->setVisible(false);
  entropicPlan_.clear();
  entropic_->clearPlan();
  entropic_->setVisible(false);
  rebuildInterpolation();
  refresh();
}

void FieldView::setPlanThreshold(double fraction) {
  exact_->setThreshold(fraction);
  entropic_->setThreshold(fraction);
  plot_->replot(QCustomPlot::rpQueuedReplot);
}

void FieldView::setInterpolation(bool shown, double t) {
  interpShown_ = shown;
  interpT_ = std::clamp(t, 0.0, 1.0);
  rebuildInterpolation();
  refresh();
}

void FieldView::rebuildInterpolation() {
  Eigen::Index n = 0;
  if (interpShown_) {
    for (const auto& e : exactPlan_)
      if (e.i >= 0 && e.i < a_.size() && e.j >= 0 && e.j < b_.size() && e.mass > 0) ++n;
  }
  interp_->setVisible(n > 0);
  if (n == 0) return;
  Eigen::MatrixX2d p(n, 2);
  Eigen::VectorXd w(n);
  Eigen::Index k = 0;
  for (const auto& e : exactPlan_) {
    if (!(e.i >= 0 && e.i < a_.size() && e.j >= 0 && e.j < b_.size() && e.mass > 0)) continue;
    p.row(k) = (1 - interpT_) * a_.points.row(e.i) + interpT_ * b_.points.row(e.j);
    w(k) = e.mass;
    ++k;
  }
  interp_->setData(p, w);
  interp_->setName(tr("interpolation at t = %1").arg(interpT_, 0, 'f', 2));
}

Eigen::Index FieldView::interpolationCount() const {
  return interp_->visible() ? interp_->pointCount() : 0;
}

bool FieldView::potentialShown() const { return heat_->visible(); }

GridSpec FieldView::potentialGrid() const {
  GridSpec g;
  if (a_.empty() && b_.empty()) return g;
  Eigen::Vector2d lo(1e300, 1e300), hi(-1e300, -1e300);
  for (const Cloud* c : {&a_, &b_}) {
    if (c->empty()) continue;
    lo = lo.cwiseMin(c->points.colwise().minCoeff().transpose());
    hi = hi.cwiseMax(c->points.colwise().maxCoeff().transpose());
  }
  Eigen::Vector2d span = (hi - lo).cwiseMax(1e-9);
  const double pad = 0.25 * span.maxCoeff() + 1e-6;
  lo.array() -= pad;
  hi.array() += pad;
  span = hi - lo;
  // About 160 cells along the longer side; square cells.
  const double cell = span.maxCoeff() / 160.0;
  g.nx = std::max(2, int(std::ceil(span.x() / cell)));
  g.ny = std::max(2, int(std::ceil(span.y() / cell)));
  g.dx = g.dy = cell;
  g.x0 = lo.x() + cell / 2;
  g.y0 = lo.y() + cell / 2;
  return g;
}

void FieldView::setPotential(const Eigen::MatrixXd& values, const GridSpec& grid) {
  if (values.rows() != grid.ny || values.cols() != grid.nx) return;  // row = y, column = x
  heat_->data()->setSize(grid.nx, grid.ny);
  heat_->data()->setRange(QCPRange(grid.x0, grid.x0 + (grid.nx - 1) * grid.dx),
                          QCPRange(grid.y0, grid.y0 + (grid.ny - 1) * grid.dy));
  for (int i = 0; i < grid.nx; ++i)
    for (int j = 0; j < grid.ny; ++j) heat_->data()->setCell(i, j, values(j, i));
  heat_->rescaleDataRange(true);
  heat_->setVisible(true);
  if (!scale_->visible()) {
    scale_->setVisible(true);
    plot_->plotLayout()->addElement(0, 1, scale_);
    auto* group = new QCPMarginGroup(plot_);
    plot_->axisRect()->setMarginGroup(QCP::msBottom | QCP::msTop, group);
    scale_->setMarginGroup(QCP::msBottom | QCP::msTop, group);
  }
  refresh();
}

void FieldView::clearPotential() {
  heat_->setVisible(false);
  if (scale_->visible()) {
    scale_->setVisible(false);
    plot_->plotLayout()->take(scale_);
    plot_->plotLayout()->simplify();
  }
  refresh();
}

void FieldView::setSelection(const std::vector<bool>& selA, const std::vector<bool>& selB) {
  cloudA_->setSelectedPoints(selA);
  cloudB_->setSelectedPoints(selB);
  plot_->replot(QCustomPlot::rpQueuedReplot);
}

void FieldView::setHover(Which w, int index) {
  hoverWhich_ = w;
  hoverIndex_ = index;
  cloudA_->setHighlighted(w == Which::A ? index : -1);
  cloudB_->setHighlighted(w == Which::B ? index : -1);
  exact_->setHighlight(w == Which::A, index);
  entropic_->setHighlight(w == Which::A, index);
  readout_->setText(index >= 0 ? describePoint(w, index) : QString());
  plot_->replot(QCustomPlot::rpQueuedReplot);
}

void FieldView::setReadout(const QString& text) { readout_->setText(text); }
QString FieldView::readout() const { return readout_->text(); }

QString FieldView::describePoint(Which w, int index) const {
  const Cloud& c = w == Which::A ? a_ : b_;
  if (index < 0 || index >= c.size()) return {};
  const double share = c.weights.maxCoeff() > 0 ? normalizeWeights(c.weights)(index) : 0.0;
  const QString side = w == Which::A ? "A" : "B";
  QString s = tr("%1 #%2 at (%3, %4), mass %5")
                  .arg(side)
                  .arg(index + 1)
                  .arg(c.points(index, 0), 0, 'g', 4)
                  .arg(c.points(index, 1), 0, 'g', 4)
                  .arg(share, 0, 'g', 3);
  if (exact_->segmentCount() == 0) return s;
  const auto entries = exact_->entriesOf(w == Which::A, index);
  if (entries.empty()) return s + tr(" — no mass under the plan");
  s += w == Which::A ? tr(" → ") : tr(" ← ");
  const int shown = std::min<int>(int(entries.size()), 4);
  for (int k = 0; k < shown; ++k) {
    const auto& e = entries[std::size_t(k)];
    s += tr("%1 #%2: %3").arg(w == Which::A ? "B" : "A").arg((w == Which::A ? e.j : e.i) + 1)
             .arg(e.mass, 0, 'g', 3);
    if (k + 1 < shown) s += ", ";
  }
  if (int(entries.size()) > shown) s += tr(" and %1 more").arg(int(entries.size()) - shown);
  return s;
}

void FieldView::fitToData() {
  userView_ = false;
  fitPending_ = true;
  plot_->replot(QCustomPlot::rpQueuedReplot);
}

void FieldView::applyView() {
  const QRect r = plot_->axisRect()->rect();
  if (!fitPending_ || r.width() < 10 || r.height() < 10) {
    keepAspect();
    return;
  }
  fitPending_ = false;
  bool found = false;
  QCPRange xr, yr;
  for (auto* l : {cloudA_, cloudB_}) {
    bool f = false;
    const QCPRange kx = l->getKeyRange(f);
    if (!f) continue;
    const QCPRange ky = l->getValueRange(f);
    if (!found) {
      xr = kx;
      yr = ky;
      found = true;
    } else {
      xr.expand(kx);
      yr.expand(ky);
    }
  }
  if (!found) {
    xr = QCPRange(-1, 1);
    yr = QCPRange(-1, 1);
  }
  const double pad = 0.08 * std::max({xr.size(), yr.size(), 1e-6});
  xr = QCPRange(xr.lower - pad, xr.upper + pad);
  yr = QCPRange(yr.lower - pad, yr.upper + pad);
  // The legend sits in the top-left corner: a band of its height along the top is kept
  // free of points, so that it never covers one.
  int legendBand = 0;
  if (plot_->legend->visible()) {
    // From the top of the plot area to the legend's lower edge (inset margin included), and
    // half a marker more so that no marker touches it.
    const QRect l = plot_->legend->outerRect();
    const int h = l.height() > 0 ? l.bottom() - r.top() : plot_->legend->minimumOuterSizeHint().height() + 12;
    legendBand = std::min(r.height() / 3, h + 8);
  }
  const int usable = r.height() - legendBand;
  // Widen whichever axis needs it so that one unit has the same length on both.
  const double ux = xr.size() / r.width(), uy = yr.size() / usable;
  const double unit = std::max(ux, uy);
  if (ux > uy) yr = QCPRange(yr.center() - ux * usable / 2, yr.center() + ux * usable / 2);
  else xr = QCPRange(xr.center() - uy * r.width() / 2, xr.center() + uy * r.width() / 2);
  yr.upper += unit * legendBand;
  plot_->xAxis->setRange(xr);
  plot_->yAxis->setRange(yr);
}

void FieldView::keepAspect() { plot_->yAxis->setScaleRatio(plot_->xAxis, 1.0); }

bool FieldView::eventFilter(QObject* watched, QEvent* event) {
  if (watched == plot_ && event->type() == QEvent::Resize && !userView_) fitPending_ = true;
  return QWidget::eventFilter(watched, event);
}

void FieldView::refresh() {
  plot_->legend->clearItems();
  for (QCPAbstractPlottable* p : {static_cast<QCPAbstractPlottable*>(cloudA_),
                                  static_cast<QCPAbstractPlottable*>(cloudB_),
                                  static_cast<QCPAbstractPlottable*>(ghost_),
                                  static_cast<QCPAbstractPlottable*>(exact_),
                                  static_cast<QCPAbstractPlottable*>(entropic_),
                                  static_cast<QCPAbstractPlottable*>(interp_)})
    if (p->visible()) p->addToLegend();
  plot_->replot(QCustomPlot::rpQueuedReplot);
}

}  // namespace barrow::ui
