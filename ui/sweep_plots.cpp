#include "sweep_plots.h"

#include <QFontMetrics>
#include <QLabel>
#include <QToolTip>
#include <QVBoxLayout>
#include <algorithm>
#include <cmath>
#include <qcustomplot.h>

#include "marked_graph.h"
#include "measure_style.h"
#include "measures/registry.h"
#include "palette.h"
#include "plot_theme.h"

namespace barrow::ui {

namespace {

struct Scale {
  double lo = 0, span = 1;
};

// Min and span of the finite values (normalisation to [0, 1]).
Scale finiteScale(const std::vector<double>& v) {
  double lo = INFINITY, hi = -INFINITY;
  for (double x : v)
    if (std::isfinite(x)) {
      lo = std::min(lo, x);
      hi = std::max(hi, x);
    }
  if (!std::isfinite(lo)) return {};
  return {lo, hi > lo ? hi - lo : 1.0};
}

void placeLine(QCPItemStraightLine* l, double x) {
  l->point1->setCoords(x, 0);
  l->point2->setCoords(x, 1);
}

// A range for the slopes that is not crushed by the huge finite differences across a jump:
// the spikes run off the pane, the ordinary slopes stay readable.
QCPRange robustRange(const std::vector<double>& v) {
  std::vector<double> mag;
  double lo = INFINITY, hi = -INFINITY;
  for (double x : v) {
    if (!std::isfinite(x)) continue;
    mag.push_back(std::abs(x));
    lo = std::min(lo, x);
    hi = std::max(hi, x);
  }
  if (mag.empty()) return QCPRange(-1, 1);
  const std::size_t q = std::min(mag.size() - 1, std::size_t(0.9 * double(mag.size())));
  std::nth_element(mag.begin(), mag.begin() + std::ptrdiff_t(q), mag.end());
  const double limit = 3.0 * mag[q];
  if (limit > 0) {
    lo = std::max(lo, -limit);
    hi = std::min(hi, limit);
  }
  if (!(hi > lo)) {
    lo -= 0.5;
    hi += 0.5;
  }
  const double pad = 0.06 * (hi - lo);
  return QCPRange(lo - pad, hi + pad);
}

// The part of a polyline inside lo ≤ y ≤ hi: every segment cut where it leaves the band, a
// NaN break where it is outside. Vector exports (SVG) do not clip to the axis rect, so the
// data itself must stay inside it [D: a segment's part in a band of a linear axis is the
// parameter interval where y(t) = y0 + t·(y1 − y0) lies in it].
struct Clipped {
  QVector<double> x, y;
  std::vector<std::pair<double, bool>> marks;  // θ of the extreme of each run outside; true = above
};

Clipped clipToBand(const QVector<double>& x, const QVector<double>& y, double lo, double hi) {
  Clipped c;
  auto gap = [&](double at) {
    if (!c.y.isEmpty() && !std::isnan(c.y.back())) {
      c.x.push_back(at);
      c.y.push_back(qQNaN());
    }
  };
  auto put = [&](double px, double py) {
    if (!c.x.isEmpty() && c.x.back() == px && c.y.back() == py) return;
    c.x.push_back(px);
    c.y.push_back(py);
  };
  // Runs outside the band: one mark at the run's most extreme value.
  double runTheta = 0, runExtreme = 0;
  int runSide = 0;  // +1 above, -1 below, 0 none
  auto closeRun = [&] {
    if (runSide != 0) c.marks.emplace_back(runTheta, runSide > 0);
    runSide = 0;
  };
  for (int k = 0; k < x.size(); ++k) {
    const double yk = y[k];
    const int side = std::isnan(yk) ? 0 : yk > hi ? 1 : yk < lo ? -1 : 0;
    if (side != runSide) closeRun();
    if (side != 0 && (runSide == 0 || std::abs(yk) > std::abs(runExtreme))) {
      runSide = side;
      runTheta = x[k];
      runExtreme = yk;
    }
    if (std::isnan(yk)) {
      gap(x[k]);
      continue;
    }
    if (k == 0 || std::isnan(y[k - 1])) {
      if (side == 0) put(x[k], yk);
      continue;
    }
    const double x0 = x[k - 1], y0 = y[k - 1], dx = x[k] - x0, dy = yk - y0;
    double t0 = 0, t1 = 1;
    if (dy == 0) {
      if (y0 > hi || y0 < lo) t0 = 2;  // wholly outside
    } else {
      const double ta = (lo - y0) / dy, tb = (hi - y0) / dy;
      t0 = std::max(0.0, std::min(ta, tb));
      t1 = std::min(1.0, std::max(ta, tb));
    }
    if (t0 > t1) {
      gap(x[k]);
      continue;
    }
    const double sx = x0 + t0 * dx, sy = y0 + t0 * dy, ex = x0 + t1 * dx, ey = y0 + t1 * dy;
    if (t0 > 0) gap(sx);  // came in from outside
    put(sx, std::clamp(sy, lo, hi));
    put(ex, std::clamp(ey, lo, hi));
    if (t1 < 1) gap(ex);  // leaves the band
  }
  closeRun();
  return c;
}

}  // namespace

SweepPlots::SweepPlots(QWidget* parent) : QWidget(parent), plot_(new QCustomPlot(this)), hint_(new QLabel(this)) {
  auto* layout = new QVBoxLayout(this);
  layout->setContentsMargins(0, 0, 0, 0);
  layout->setSpacing(0);
  layout->addWidget(hint_);
  layout->addWidget(plot_, 1);
  hint_->setWordWrap(true);
  hint_->setVisible(false);
  hint_->setForegroundRole(QPalette::PlaceholderText);  // grey in either scheme
  plot_->setObjectName("sweepPlot");
  plot_->setToolTip(tr("Top: each measure against θ. Bottom: dD/dθ (analytic where the theory gives it, "
                       "finite differences otherwise). Click or drag to move the θ cursor; double-click releases it."));
  plot_->setInteractions(QCP::Interactions());
  plot_->setAntialiasedElements(QCP::aePlottables);
  plot_->setMinimumHeight(160);

  // Layout: value pane over slope pane in column 0, the legend beside the value pane.
  values_ = plot_->axisRect();
  slopes_ = new QCPAxisRect(plot_);
  plot_->plotLayout()->addElement(1, 0, slopes_);
  plot_->plotLayout()->setRowStretchFactor(0, 0.6);  // the slope pane's share can be dragged
  plot_->plotLayout()->setRowStretchFactor(1, 0.4);
  plot_->plotLayout()->setRowSpacing(0);
  values_->setMargins(QMargins(0, 0, 0, 0));
  auto* group = new QCPMarginGroup(plot_);
  values_->setMarginGroup(QCP::msLeft | QCP::msRight, group);
  slopes_->setMarginGroup(QCP::msLeft | QCP::msRight, group);
  for (QCPAxis* a : slopes_->axes()) a->setLayer("axes");
  for (QCPGrid* g : {slopes_->axis(QCPAxis::atBottom)->grid(), slopes_->axis(QCPAxis::atLeft)->grid()}) g->setLayer("grid");
  values_->axis(QCPAxis::atBottom)->setTickLabels(false);
  connect(values_->axis(QCPAxis::atBottom), qOverload<const QCPRange&>(&QCPAxis::rangeChanged),
          slopes_->axis(QCPAxis::atBottom), qOverload<const QCPRange&>(&QCPAxis::setRange));
  values_->axis(QCPAxis::atLeft)->setLabel(tr("D (normalised)"));
  slopes_->axis(QCPAxis::atLeft)->setLabel(tr("dD/dθ"));
  slopes_->axis(QCPAxis::atBottom)->setLabel("θ");

  QCPLegend* legend = plot_->legend;
  legend->setVisible(true);
  values_->insetLayout()->take(legend);
  plot_->plotLayout()->addElement(0, 1, legend);
  plot_->plotLayout()->setColumnStretchFactor(1, 0.001);
  legend->setFont(font());
  legend->setRowSpacing(0);  // negative spacing clipped the underscores of kl_ab, kl_ba
  legend->setBorderPen(Qt::NoPen);
  legend->setMargins(QMargins(4, 2, 4, 2));
  legend->setIconSize(22, 10);
  legend->setLayer("legend");

  connect(plot_, &QCustomPlot::mousePress, this, &SweepPlots::onPress);
  connect(plot_, &QCustomPlot::mouseMove, this, &SweepPlots::onMove);
  connect(plot_, &QCustomPlot::mouseRelease, this, [this] {
    dragging_ = false;
    resizingPanes_ = false;
  });
  connect(plot_, &QCustomPlot::mouseDoubleClick, this, [this] {
    setCursor(std::nullopt);
    emit thetaChanged(std::nullopt);
  });

  QPen refPen(QColor(110, 110, 110), 1, Qt::DashDotLine);
  refV_ = verticalLine(values_, refPen);
  refS_ = verticalLine(slopes_, refPen);
  // The cursor has a buffered layer of its own: dragging it repaints that layer only, not
  // every curve.
  plot_->addLayer("cursor", plot_->layer("main"), QCustomPlot::limAbove);
  plot_->layer("cursor")->setMode(QCPLayer::lmBuffered);
  QPen cur(palette::cursor(), 2.2);
  cursorV_ = verticalLine(values_, cur);
  cursorS_ = verticalLine(slopes_, cur);
  cursorV_->setLayer("cursor");
  cursorS_->setLayer("cursor");
  cursorLabel_ = new QCPItemText(plot_);
  cursorLabel_->setLayer("cursor");
  cursorLabel_->setClipAxisRect(values_);
  cursorLabel_->position->setAxes(values_->axis(QCPAxis::atBottom), values_->axis(QCPAxis::atLeft));
  cursorLabel_->position->setAxisRect(values_);
  cursorLabel_->position->setTypeX(QCPItemPosition::ptPlotCoords);
  cursorLabel_->position->setTypeY(QCPItemPosition::ptAxisRectRatio);
  cursorLabel_->setPositionAlignment(Qt::AlignLeft | Qt::AlignTop);
  cursorLabel_->setPadding(QMargins(3, 1, 3, 1));
  cursorLabel_->setBrush(QColor(255, 255, 255, 220));
  cursorLabel_->setColor(palette::cursor());
  cursorLabel_->setVisible(false);
  cursorV_->setVisible(false);
  cursorS_->setVisible(false);
  // A click on a curve's legend entry picks that measure (again: lets it go).
  connect(plot_, &QCustomPlot::legendClick, this, [this](QCPLegend*, QCPAbstractLegendItem* item, QMouseEvent*) {
    auto* entry = qobject_cast<QCPPlottableLegendItem*>(item);
    const QString id = entry ? entry->plottable()->property("measure").toString() : QString();
    if (id.isEmpty()) return;
    emit measurePicked(id.toStdString() == highlighted_ ? QString() : id);
  });
  followScheme(plot_, [this] {
    colourFixedMarks();
    rebuild();
  });
  colourFixedMarks();
  clear(tr("Run a sweep to see how each measure responds as A moves."));
}

// The cursor and θ₀ lines in the scheme's colours (curves take theirs in rebuild()).
void SweepPlots::colourFixedMarks() {
  const palette::Scheme s = palette::currentScheme();
  const QPen refPen(palette::neutralMark(s), 1, Qt::DashDotLine);
  refV_->setPen(refPen);
  refS_->setPen(refPen);
  const QPen cur(palette::cursor(s), 2.2);
  cursorV_->setPen(cur);
  cursorS_->setPen(cur);
  QColor labelFill = palette::plotBackground(s);
  labelFill.setAlpha(220);
  cursorLabel_->setBrush(labelFill);
  cursorLabel_->setColor(palette::cursor(s));
}

QCPItemStraightLine* SweepPlots::verticalLine(QCPAxisRect* rect, const QPen& pen) {
  auto* l = new QCPItemStraightLine(plot_);
  l->setPen(pen);
  l->setSelectable(false);
  l->setClipAxisRect(rect);
  for (QCPItemPosition* p : {l->point1, l->point2}) {
    p->setAxes(rect->axis(QCPAxis::atBottom), rect->axis(QCPAxis::atLeft));
    p->setAxisRect(rect);
    p->setTypeX(QCPItemPosition::ptPlotCoords);
    p->setTypeY(QCPItemPosition::ptAxisRectRatio);
  }
  placeLine(l, 0);
  return l;
}

void SweepPlots::showHint(const QString& text) {
  hint_->setText(text);
  hint_->setVisible(!text.isEmpty());
}

void SweepPlots::setAxisLabel(const QString& label) {
  slopes_->axis(QCPAxis::atBottom)->setLabel(label);
  plot_->replot(QCustomPlot::rpQueuedReplot);
}

void SweepPlots::setRange(double from, double to) {
  from_ = from;
  to_ = to;
  if (curves_.empty()) {
    values_->axis(QCPAxis::atBottom)->setRange(from, to);
    plot_->replot(QCustomPlot::rpQueuedReplot);
  }
}

void SweepPlots::setReference(double theta0) {
  placeLine(refV_, theta0);
  placeLine(refS_, theta0);
  plot_->replot(QCustomPlot::rpQueuedReplot);
}

void SweepPlots::clear(const QString& hint) {
  curves_.clear();
  findings_.clear();
  message_.clear();
  stale_ = false;
  showHint(hint);
  rebuild();
}

void SweepPlots::setResult(const std::vector<SweepResult>& parts, const std::vector<Finding>& findings) {
  curves_.clear();
  message_.clear();
  for (const SweepResult& r : parts) {
    for (const SweepSeries& s : r.series) curves_.push_back({s.id, r.theta, s.value, s.slope, s.low, s.high});
    if (!r.message.empty()) message_ += (message_.isEmpty() ? "" : "\n") + QString::fromStdString(r.message);
  }
  std::stable_sort(curves_.begin(), curves_.end(),
                   [](const Curve& x, const Curve& y) { return measureRank(x.id) < measureRank(y.id); });
  findings_ = findings;
  stale_ = false;
  showHint(message_);
  rebuild();
}

void SweepPlots::setStale(bool stale) {
  if (stale == stale_ || curves_.empty()) return;
  stale_ = stale;
  showHint(stale ? tr("The clouds or settings changed since this sweep: run it again to update the curves.")
                 : message_);
  hint_->setStyleSheet(stale ? "color: #8a4b00;" : "color: #555555;");
  rebuild();
}

void SweepPlots::setNormalised(bool on) {
  normalised_ = on;
  fitAxisLabels();
  rebuild();
}

void SweepPlots::fitAxisLabels() {
  // The left labels run up the axis: a label longer than its pane is tall gets clipped (seen in
  // a 1000×700 window), so the short form is used when the long one does not fit.
  // Each pane's share of the height is its row's stretch factor (set above, draggable).
  const int spare = std::max(0, plot_->height() - 60);  // less the bottom axis and margins
  const QList<double> rows = plot_->plotLayout()->rowStretchFactors();
  const double total = rows.size() >= 2 && rows[0] + rows[1] > 0 ? rows[0] + rows[1] : 1.0;
  const auto pick = [&](QCPAxis* axis, int row, const QString& full, const QString& shortForm) {
    const double share = rows.size() > row ? rows[row] / total : 0.5;
    const QFontMetrics fm(axis->labelFont());
    axis->setLabel(fm.horizontalAdvance(full) + 8 <= int(share * spare) ? full : shortForm);
  };
  pick(values_->axis(QCPAxis::atLeft), 0, normalised_ ? tr("D (normalised)") : tr("D"),
       normalised_ ? tr("D (norm.)") : tr("D"));
  pick(slopes_->axis(QCPAxis::atLeft), 1, normalised_ ? tr("dD/dθ (normalised)") : tr("dD/dθ"),
       normalised_ ? tr("dD/dθ (n.)") : tr("dD/dθ"));
}

void SweepPlots::highlight(const std::string& id) {
  if (id == highlighted_) return;
  highlighted_ = id;
  rebuild();
}

void SweepPlots::rebuild() {
  plot_->clearGraphs();
  // Keep the cursor and reference lines; drop the finding markers.
  for (int k = plot_->itemCount() - 1; k >= 0; --k) {
    QCPAbstractItem* it = plot_->item(k);
    if (it != cursorV_ && it != cursorS_ && it != cursorLabel_ && it != refV_ && it != refS_) plot_->removeItem(it);
  }
  QCPAxis* vx = values_->axis(QCPAxis::atBottom);
  QCPAxis* vy = values_->axis(QCPAxis::atLeft);
  QCPAxis* sx = slopes_->axis(QCPAxis::atBottom);
  QCPAxis* sy = slopes_->axis(QCPAxis::atLeft);
  double lo = INFINITY, hi = -INFINITY, ylo = INFINITY, yhi = -INFINITY;
  std::vector<double> allSlopes;
  struct SlopeGraph {
    QCPGraph* graph;
    QVector<double> x, y;
    std::string id;
  };
  std::vector<SlopeGraph> slopeGraphs;
  clipMarks_.clear();
  for (std::size_t s = 0; s < curves_.size(); ++s) {
    const Curve& c = curves_[s];
    const Scale sc = normalised_ ? finiteScale(c.value) : Scale{0, 1};
    QVector<double> x, y, dy;
    for (std::size_t k = 0; k < c.theta.size(); ++k) {
      const double v = k < c.value.size() ? c.value[k] : NAN;
      const double d = k < c.slope.size() ? c.slope[k] : NAN;
      x.push_back(c.theta[k]);
      y.push_back(std::isfinite(v) ? (v - sc.lo) / sc.span : qQNaN());  // gaps where ∞ or failed
      dy.push_back(std::isfinite(d) ? d / sc.span : qQNaN());
      if (std::isfinite(v)) {
        ylo = std::min(ylo, y.back());
        yhi = std::max(yhi, y.back());
      }
      if (std::isfinite(d)) allSlopes.push_back(dy.back());
    }
    if (!c.theta.empty()) {
      lo = std::min(lo, c.theta.front());
      hi = std::max(hi, c.theta.back());
    }
    const bool hiLite = !highlighted_.empty() && c.id == highlighted_;
    const bool faded = (!highlighted_.empty() && !hiLite) || stale_;
    QPen pen = measurePen(c.id, hiLite ? 3.2 : 1.7);
    if (faded) {
      QColor col = pen.color();
      col.setAlphaF(0.25);
      pen.setColor(col);
    }
    // The measure's marker about every eighth of the curve: a third cue besides colour and dash.
    const QCPScatterStyle marker = measureMarker(c.id, pen, hiLite ? 7 : 6);
    QString name = QString::fromStdString(c.id);
    if (std::any_of(c.value.begin(), c.value.end(), [](double v) { return std::isinf(v); })) name += " (∞)";
    if (c.low.size() == c.theta.size() && c.high.size() == c.theta.size() && !c.theta.empty()) {
      // Resampling band: the low edge filled up to the high edge, in the curve's colour.
      QVector<double> bl, bh;
      for (std::size_t k = 0; k < c.theta.size(); ++k) {
        bl.push_back(std::isfinite(c.low[k]) ? (c.low[k] - sc.lo) / sc.span : qQNaN());
        bh.push_back(std::isfinite(c.high[k]) ? (c.high[k] - sc.lo) / sc.span : qQNaN());
        if (std::isfinite(bl.back())) ylo = std::min(ylo, bl.back());
        if (std::isfinite(bh.back())) yhi = std::max(yhi, bh.back());
      }
      QColor fill = pen.color();
      fill.setAlphaF(faded ? 0.06 : (hiLite ? 0.28 : 0.14));
      auto* top = plot_->addGraph(vx, vy);
      top->setData(x, bh, true);
      top->setPen(Qt::NoPen);
      top->removeFromLegend();
      auto* bottom = plot_->addGraph(vx, vy);
      bottom->setData(x, bl, true);
      bottom->setPen(Qt::NoPen);
      bottom->setBrush(fill);
      bottom->setChannelFillGraph(top);
      bottom->removeFromLegend();
    }
    auto* g = new MarkedGraph(vx, vy);
    g->setData(x, y, true);
    g->setPen(pen);
    g->setScatterStyle(marker);
    g->setMarkerPhase(double(s) / double(curves_.size()));  // markers of different curves side by side
    g->setName(name);
    g->setProperty("measure", QString::fromStdString(c.id));
    if (!c.low.empty()) g->setName(name + tr(" ±band"));
    auto* gs = plot_->addGraph(sx, sy);
    gs->setPen(pen);
    gs->setProperty("measure", QString::fromStdString(c.id));
    gs->removeFromLegend();
    slopeGraphs.push_back({gs, x, dy, c.id});
    if (hiLite) {  // on top of the others
      g->setLayer("overlay");
      gs->setLayer("overlay");
    }
  }
  // Findings. Jumps of every measure as short ticks along the top edge; the highlighted
  // measure's jumps as full dashed lines and its flat stretches shaded.
  ticks_.clear();
  bool anyJump = false, anyUnresolved = false, anyFlat = false;
  for (const Finding& f : findings_) {
    if (std::none_of(curves_.begin(), curves_.end(), [&](const Curve& x) { return x.id == f.id; })) continue;
    const QColor c = measurePen(f.id).color();
    const bool full = f.id == highlighted_;
    for (const Jump& j : f.unresolved) {
      // Unresolved steps: dotted ticks (a suspect the refinement budget could not settle).
      ticks_.push_back({f.id, j.theta, false});
      auto* seg = new QCPItemLine(plot_);
      seg->setClipAxisRect(values_);
      seg->setPen(QPen(c, full ? 1.6 : 1.4, Qt::DotLine));
      for (QCPItemPosition* p : {seg->start, seg->end}) {
        p->setAxes(vx, vy);
        p->setAxisRect(values_);
        p->setTypeX(QCPItemPosition::ptPlotCoords);
        p->setTypeY(QCPItemPosition::ptAxisRectRatio);
      }
      seg->start->setCoords(j.theta, 0.0);
      seg->end->setCoords(j.theta, full ? 1.0 : 0.07);
      anyUnresolved = true;
    }
    for (const Jump& j : f.jumps) {
      ticks_.push_back({f.id, j.theta, true});
      anyJump = true;
      if (full) {
        for (QCPAxisRect* r : {values_, slopes_}) {
          auto* l = verticalLine(r, QPen(c, 1.4, Qt::DashLine));
          placeLine(l, j.theta);
        }
      } else {
        auto* seg = new QCPItemLine(plot_);
        seg->setClipAxisRect(values_);
        seg->setPen(QPen(c, 2.2));
        for (QCPItemPosition* p : {seg->start, seg->end}) {
          p->setAxes(vx, vy);
          p->setAxisRect(values_);
          p->setTypeX(QCPItemPosition::ptPlotCoords);
          p->setTypeY(QCPItemPosition::ptAxisRectRatio);
        }
        seg->start->setCoords(j.theta, 0.0);
        seg->end->setCoords(j.theta, 0.07);
      }
    }
    if (!full) continue;
    anyFlat = anyFlat || !f.flat.empty();
    for (const auto& [t0, t1] : f.flat) {
      auto* r = new QCPItemRect(plot_);
      r->setClipAxisRect(values_);
      for (QCPItemPosition* p : {r->topLeft, r->bottomRight}) {
        p->setAxes(vx, vy);
        p->setAxisRect(values_);
        p->setTypeX(QCPItemPosition::ptPlotCoords);
        p->setTypeY(QCPItemPosition::ptAxisRectRatio);
      }
      r->topLeft->setCoords(t0, 0);
      r->bottomRight->setCoords(t1, 1);
      QColor fill = c;
      fill.setAlphaF(0.15);
      r->setBrush(fill);
      r->setPen(Qt::NoPen);
      r->setLayer("background");
    }
  }
  if (curves_.empty() || !(hi > lo)) {
    vx->setRange(from_, to_);
    vy->setRange(0, 1);
    sy->setRange(-1, 1);
  } else {
    vx->setRange(lo, hi);
    if (!(yhi > ylo)) {
      ylo -= 0.5;
      yhi += 0.5;
    }
    const double pad = 0.05 * (yhi - ylo);
    vy->setRange(ylo - pad, yhi + pad);
    sy->setRange(robustRange(allSlopes));
  }
  sx->setRange(vx->range());
  // Slopes beyond the pane: cut at its edges, a triangle on the edge where each excursion peaks.
  const QCPRange sr = sy->range();
  for (const SlopeGraph& g : slopeGraphs) {
    const Clipped cl = clipToBand(g.x, g.y, sr.lower, sr.upper);
    g.graph->setData(cl.x, cl.y, true);
    if (cl.marks.empty()) continue;
    QVector<double> ux, uy, dx, dyv;
    const double inset = 0.04 * sr.size();  // the marker's centre inside the pane, so it is drawn whole
    for (const auto& [t, above] : cl.marks) {
      (above ? ux : dx).push_back(t);
      (above ? uy : dyv).push_back(above ? sr.upper - inset : sr.lower + inset);
      clipMarks_.push_back({g.id, t, above});
    }
    const QColor col = g.graph->pen().color();
    for (bool above : {true, false}) {
      auto* m = plot_->addGraph(sx, sy);
      m->setData(above ? ux : dx, above ? uy : dyv, true);
      m->setLineStyle(QCPGraph::lsNone);
      m->setScatterStyle(QCPScatterStyle(above ? QCPScatterStyle::ssTriangle : QCPScatterStyle::ssTriangleInverted,
                                         col, col, 6));
      m->removeFromLegend();
    }
  }
  // What the marks mean, as legend entries after the curves (only those present).
  auto explain = [&](const QString& text, const QPen& pen, const QCPScatterStyle& shape) {
    auto* g = plot_->addGraph(vx, vy);
    g->setPen(pen);
    g->setLineStyle(shape.isNone() ? QCPGraph::lsLine : QCPGraph::lsNone);
    g->setScatterStyle(shape);
    g->setName(text);
  };
  const QColor markGrey = palette::neutralMark(palette::currentScheme());
  if (anyJump) explain(tr("┃ top: jump"), QPen(markGrey, 2.2), QCPScatterStyle());
  if (anyUnresolved) explain(tr("┇ top: unresolved step"), QPen(markGrey, 1.4, Qt::DotLine), QCPScatterStyle());
  if (anyFlat) {
    QColor shade = markGrey;
    shade.setAlpha(90);
    explain(tr("shaded: flat"), QPen(shade, 6), QCPScatterStyle());
  }
  if (!clipMarks_.empty())
    explain(tr("▲▼ slope off the pane"), QPen(markGrey),
            QCPScatterStyle(QCPScatterStyle::ssTriangle, markGrey, markGrey, 6));
  // Lines outside the θ range would be drawn outside the panes in vector exports.
  const bool refInside = vx->range().contains(refV_->point1->coords().x());
  refV_->setVisible(refInside);
  refS_->setVisible(refInside);
  placeLegend();
  fitLegend();
  plot_->replot(QCustomPlot::rpQueuedReplot);
}

void SweepPlots::setCursor(std::optional<double> theta) {
  cursor_ = theta;
  cursorV_->setVisible(theta.has_value());
  cursorS_->setVisible(theta.has_value());
  cursorLabel_->setVisible(theta.has_value());
  if (theta) {
    placeLine(cursorV_, *theta);
    placeLine(cursorS_, *theta);
    cursorLabel_->position->setCoords(*theta, 0.0);
    cursorLabel_->setText(QString("θ = %1").arg(*theta, 0, 'g', 4));
    // Keep the label inside the pane near the right edge.
    const QCPRange r = values_->axis(QCPAxis::atBottom)->range();
    cursorLabel_->setPositionAlignment(*theta > r.lower + 0.8 * r.size() ? (Qt::AlignRight | Qt::AlignTop)
                                                                          : (Qt::AlignLeft | Qt::AlignTop));
  }
  plot_->layer("cursor")->replot();
}

void SweepPlots::placeCursor(double theta, bool notify) {
  const QCPRange r = values_->axis(QCPAxis::atBottom)->range();
  theta = std::clamp(theta, std::min(r.lower, r.upper), std::max(r.lower, r.upper));
  setCursor(theta);
  if (notify) emit thetaChanged(theta);
}

bool SweepPlots::onPaneBorder(const QPointF& px) const {
  // The band between the value pane's bottom edge and the slope pane's top edge, 4 px either side.
  const QRect v = values_->rect(), sl = slopes_->rect();
  return px.x() >= v.left() && px.x() <= v.right() && px.y() >= v.bottom() - 4 && px.y() <= sl.top() + 4;
}

void SweepPlots::setValueShare(double share) {
  share = std::clamp(share, 0.2, 0.85);
  plot_->plotLayout()->setRowStretchFactor(0, share);
  plot_->plotLayout()->setRowStretchFactor(1, 1.0 - share);
  fitLegend();  // the legend's rows follow the value pane's new height
  plot_->replot(QCustomPlot::rpQueuedReplot);
}

double SweepPlots::valueShare() const {
  const double v = plot_->plotLayout()->rowStretchFactors().at(0), s = plot_->plotLayout()->rowStretchFactors().at(1);
  return v / (v + s);
}

void SweepPlots::onPress(QMouseEvent* e) {
  if (e->button() != Qt::LeftButton) return;
  if (onPaneBorder(e->position())) {
    resizingPanes_ = true;
    return;
  }
  const QPoint p = e->position().toPoint();
  if (!values_->rect().contains(p) && !slopes_->rect().contains(p)) return;
  if (plot_->legend->visible() && plot_->legend->outerRect().contains(p)) return;  // a legend click
  dragging_ = true;
  placeCursor(values_->axis(QCPAxis::atBottom)->pixelToCoord(e->position().x()), true);
}

void SweepPlots::onMove(QMouseEvent* e) {
  if (resizingPanes_ && (e->buttons() & Qt::LeftButton)) {
    const double top = values_->outerRect().top(), bottom = slopes_->outerRect().bottom();
    if (bottom > top) setValueShare((e->position().y() - top) / (bottom - top));
    return;
  }
  if (onPaneBorder(e->position())) plot_->setCursor(Qt::SplitVCursor);
  else plot_->unsetCursor();
  if (!dragging_ || !(e->buttons() & Qt::LeftButton)) {
    const QString tip = toolTipAt(e->position());
    if (tip.isEmpty()) QToolTip::hideText();
    else QToolTip::showText(e->globalPosition().toPoint(), tip, plot_);
    return;
  }
  placeCursor(values_->axis(QCPAxis::atBottom)->pixelToCoord(e->position().x()), true);
}

QString SweepPlots::toolTipAt(const QPointF& px) const {
  constexpr double kNear = 5.0;  // pixels
  auto name = [](const std::string& id) {
    const Measure* m = MeasureRegistry::instance().find(id);
    return m ? QString::fromStdString(id + " — " + m->displayName()) : QString::fromStdString(id);
  };
  const QRect v = values_->rect(), sl = slopes_->rect();
  const QCPAxis* vx = values_->axis(QCPAxis::atBottom);
  // Finding ticks along the top of the value pane (the highlighted measure's run full height).
  if (v.contains(px.toPoint())) {
    const bool nearTop = px.y() <= v.top() + 0.1 * v.height() + kNear;
    for (const Mark& t : ticks_) {
      if (std::abs(vx->coordToPixel(t.theta) - px.x()) > kNear) continue;
      if (!nearTop && t.id != highlighted_) continue;
      for (const Finding& f : findings_)
        if (f.id == t.id)
          return tr("%1: %2 at θ = %3\n%4")
              .arg(name(t.id), t.flag ? tr("jump") : tr("unresolved step"))
              .arg(t.theta, 0, 'g', 4)
              .arg(QString::fromStdString(f.summary));
    }
  }
  if (sl.contains(px.toPoint())) {
    for (const Mark& m : clipMarks_) {
      const double edge = m.flag ? sl.top() : sl.bottom();
      if (std::abs(vx->coordToPixel(m.theta) - px.x()) <= kNear && std::abs(edge - px.y()) <= 2 * kNear)
        return tr("%1: the slope runs %2 the pane here (the pane's limits leave out the largest slopes so that the "
                  "others stay readable)")
            .arg(name(m.id), m.flag ? tr("above") : tr("below"));
    }
  }
  // The nearest curve within reach, in either pane.
  double best = kNear;
  QString found;
  for (int k = 0; k < plot_->graphCount(); ++k) {
    QCPGraph* g = plot_->graph(k);
    if (g->data()->isEmpty() || g->pen().style() == Qt::NoPen || g->lineStyle() == QCPGraph::lsNone) continue;
    const double d = g->selectTest(px, false);
    if (d >= 0 && d < best) {
      best = d;
      found = QString::fromStdString(g->property("measure").toString().toStdString());
    }
  }
  return found.isEmpty() ? QString() : name(found.toStdString());
}

// An empty legend would cap the height of the row it shares with the value pane (a layout
// row is no taller than its elements allow, and an empty legend allows only its margins):
// the value pane then collapses before the first curve arrives. It leaves the layout then.
void SweepPlots::placeLegend() {
  QCPLegend* legend = plot_->legend;
  QCPLayoutGrid* grid = plot_->plotLayout();
  const bool want = legend->itemCount() > 0;
  const bool placed = grid->hasElement(0, 1) && grid->element(0, 1) == legend;
  if (want && !placed) {
    grid->addElement(0, 1, legend);
    grid->setColumnStretchFactor(1, 0.001);
  } else if (!want && placed) {
    grid->take(legend);
    grid->simplify();
  }
  legend->setVisible(want);
}

// Fifteen legend rows do not fit beside a short value pane: they would be drawn over each
// other. Wrap the legend into as many columns as the pane's height needs.
void SweepPlots::fitLegend() {
  QCPLegend* legend = plot_->legend;
  const int items = legend->itemCount();
  if (items == 0) return;
  // A row is as tall as its item asks (text plus the item's margins); counting the font's height
  // alone squeezed the rows until the underscores of kl_ab, kl_ba were cut off (seen at a device
  // pixel ratio of 2).
  // QCustomPlot clips each layerable one pixel above its rectangle, which took the underscore
  // of kl_ab at a device pixel ratio of 2: every item gets two pixels of room below its text.
  int itemHeight = QFontMetrics(legend->font()).height();
  for (int i = 0; i < items; ++i) {
    QCPAbstractLegendItem* item = legend->item(i);
    if (!item) continue;
    QMargins m = item->margins();
    if (m.bottom() < 2) item->setMargins(QMargins(m.left(), m.top(), m.right(), 2));
    itemHeight = std::max(itemHeight, item->minimumOuterSizeHint().height());
  }
  const int rowHeight = std::max(1, itemHeight + legend->rowSpacing());
  // The value pane's share of the height by the layout's row stretch, less its axis margins.
  const QList<double> stretch = plot_->plotLayout()->rowStretchFactors();
  const double share = stretch.size() >= 2 ? stretch[0] / (stretch[0] + stretch[1]) : 1.0;
  const int available = int(plot_->height() * share) - 24;
  const int rows = std::max(1, available / rowHeight);
  const int wrap = items <= rows ? 0 : rows;
  if (legend->wrap() == wrap) return;
  legend->setWrap(wrap);
  legend->setFillOrder(QCPLayoutGrid::foRowsFirst, true);
}

void SweepPlots::resizeEvent(QResizeEvent* e) {
  QWidget::resizeEvent(e);
  const int before = plot_->legend->wrap();
  fitAxisLabels();
  fitLegend();
  if (plot_->legend->wrap() != before) plot_->replot(QCustomPlot::rpQueuedReplot);
}

}  // namespace barrow::ui
