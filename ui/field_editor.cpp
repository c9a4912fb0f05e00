#include "field_editor.h"

#include <QMouseEvent>
#include <QRubberBand>
#include <cmath>
#include <qcustomplot.h>

#include "cloud_layer.h"
#include "field_view.h"

namespace barrow::ui {

namespace {

constexpr double kPickRadiusPx = 8.0;

Cloud withPoints(const Cloud& c, const Eigen::MatrixX2d& pts, const Eigen::VectorXd& w) {
  Cloud out = c;
  out.points = pts;
  out.weights = w;
  return out;
}

double meanWeight(const Cloud& c) { return c.size() ? c.weights.mean() : 1.0; }

}  // namespace

FieldEditor::FieldEditor(FieldView* view, SessionDocument* doc, QObject* parent)
    : QObject(parent), view_(view), doc_(doc) {
  QCustomPlot* plot = view_->plot();
  connect(plot, &QCustomPlot::mousePress, this, &FieldEditor::onPress);
  connect(plot, &QCustomPlot::mouseMove, this, &FieldEditor::onMove);
  connect(plot, &QCustomPlot::mouseRelease, this, &FieldEditor::onRelease);
  connect(doc_, &SessionDocument::cloudsChanged, this, &FieldEditor::onCloudsChanged);
  plot->setMouseTracking(true);
  sprayTimer_.setInterval(70);
  connect(&sprayTimer_, &QTimer::timeout, this, [this] { sprayDab(sprayAt_); });
  onCloudsChanged();
}

void FieldEditor::setTool(FieldTool t) {
  cancelGesture();
  tool_ = t;
  view_->plot()->setInteraction(QCP::iRangeDrag, t == FieldTool::Pan);
  view_->plot()->setCursor(t == FieldTool::Pan     ? Qt::OpenHandCursor
                           : t == FieldTool::Select ? Qt::ArrowCursor
                                                    : Qt::CrossCursor);
}

void FieldEditor::setBrush(double radius, int perDab) {
  radius_ = std::max(radius, 1e-9);
  perDab_ = std::max(perDab, 1);
}

int FieldEditor::selectedCount() const {
  return int(std::count(selA_.begin(), selA_.end(), true) + std::count(selB_.begin(), selB_.end(), true));
}

void FieldEditor::pushSelection() {
  view_->setSelection(selA_, selB_);
  emit selectionChanged(int(std::count(selA_.begin(), selA_.end(), true)),
                        int(std::count(selB_.begin(), selB_.end(), true)));
}

void FieldEditor::selectAll() {
  selA_.assign(selA_.size(), true);
  selB_.assign(selB_.size(), true);
  pushSelection();
}

void FieldEditor::clearSelection() {
  selA_.assign(selA_.size(), false);
  selB_.assign(selB_.size(), false);
  pushSelection();
}

void FieldEditor::select(Which w, const std::vector<int>& indices) {
  selA_.assign(selA_.size(), false);
  selB_.assign(selB_.size(), false);
  auto& sel = w == Which::A ? selA_ : selB_;
  for (int i : indices)
    if (i >= 0 && i < int(sel.size())) sel[std::size_t(i)] = true;
  pushSelection();
}

void FieldEditor::onCloudsChanged() {
  const auto& s = doc_->session();
  // Our own edits keep the selection aligned; a change of size from elsewhere (undo, open)
  // makes old indices meaningless, so the selection is dropped.
  if (selA_.size() != std::size_t(s.a.size()) || selB_.size() != std::size_t(s.b.size())) {
    selA_.assign(std::size_t(s.a.size()), false);
    selB_.assign(std::size_t(s.b.size()), false);
    hoverIdx_ = -1;
    pushSelection();
  }
}

QPointF FieldEditor::toData(const QPointF& px) const {
  const QCustomPlot* plot = view_->plot();
  return {plot->xAxis->pixelToCoord(px.x()), plot->yAxis->pixelToCoord(px.y())};
}

QString FieldEditor::deleteSelection() {
  const int n = selectedCount();
  if (n == 0) return tr("Nothing is selected.");
  emit editStarting();
  const auto& s = doc_->session();
  auto keep = [](const Cloud& c, const std::vector<bool>& sel, QString* why, const char* label) {
    std::vector<Eigen::Index> rows;
    for (Eigen::Index i = 0; i < c.size(); ++i)
      if (!sel[std::size_t(i)]) rows.push_back(i);
    Cloud out = c;
    out.points.resize(Eigen::Index(rows.size()), 2);
    out.weights.resize(Eigen::Index(rows.size()));
    for (std::size_t k = 0; k < rows.size(); ++k) {
      out.points.row(Eigen::Index(k)) = c.points.row(rows[k]);
      out.weights(Eigen::Index(k)) = c.weights(rows[k]);
    }
    if (rows.empty() || !(out.weights.sum() > 0))
      *why = tr("Cloud %1 would have no point with positive weight left; keep at least one.").arg(label);
    return out;
  };
  QString why;
  Cloud a = keep(s.a, selA_, &why, "A");
  Cloud b = keep(s.b, selB_, &why, "B");
  if (!why.isEmpty()) {
    emit message(why);
    return why;
  }
  selA_.assign(std::size_t(a.size()), false);
  selB_.assign(std::size_t(b.size()), false);
  doc_->setClouds(a, b, tr("Delete %n point(s)", "", n));
  pushSelection();
  return {};
}

QString FieldEditor::setSelectionWeight(double w) {
  if (!(w >= 0) || !std::isfinite(w)) return tr("A weight must be a finite number ≥ 0.");
  const int n = selectedCount();
  if (n == 0) return tr("Nothing is selected.");
  emit editStarting();
  Cloud a = doc_->session().a, b = doc_->session().b;
  for (Eigen::Index i = 0; i < a.size(); ++i)
    if (selA_[std::size_t(i)]) a.weights(i) = w;
  for (Eigen::Index i = 0; i < b.size(); ++i)
    if (selB_[std::size_t(i)]) b.weights(i) = w;
  if (!(a.weights.sum() > 0) || !(b.weights.sum() > 0)) {
    const QString why = tr("Each cloud needs at least one point with positive weight.");
    emit message(why);
    return why;
  }
  doc_->setClouds(a, b, tr("Set weight of %n point(s)", "", n));
  return {};
}

void FieldEditor::moveSelection(double dx, double dy) {
  if (selectedCount() == 0) return;
  emit editStarting();
  Cloud a = doc_->session().a, b = doc_->session().b;
  for (Eigen::Index i = 0; i < a.size(); ++i)
    if (selA_[std::size_t(i)]) a.points.row(i) += Eigen::RowVector2d(dx, dy);
  for (Eigen::Index i = 0; i < b.size(); ++i)
    if (selB_[std::size_t(i)]) b.points.row(i) += Eigen::RowVector2d(dx, dy);
  doc_->setClouds(a, b, tr("Move %n point(s)", "", selectedCount()));
}

void FieldEditor::cancelGesture() {
  sprayTimer_.stop();
  if (band_) band_->hide();
  if (gesture_ == Gesture::Drag || gesture_ == Gesture::Spray) doc_->cancelPreview();
  gesture_ = Gesture::None;
}

void FieldEditor::onPress(QMouseEvent* e) {
  if (e->button() != Qt::LeftButton || tool_ == FieldTool::Pan) return;
  const QPointF px = e->position();
  pressPx_ = px;
  if (tool_ == FieldTool::Add) {
    emit editStarting();
    const QPointF d = toData(px);
    Cloud c = doc_->cloud(target_);
    const double w = meanWeight(c);
    c.points.conservativeResize(c.size() + 1, 2);
    c.weights.conservativeResize(c.points.rows());
    c.points.row(c.size() - 1) << d.x(), d.y();
    c.weights(c.size() - 1) = w;
    auto& sel = target_ == Which::A ? selA_ : selB_;
    sel.push_back(false);
    doc_->setCloud(target_, c, tr("Add a point to %1").arg(target_ == Which::A ? "A" : "B"));
    return;
  }
  if (tool_ == FieldTool::Spray) {
    emit editStarting();
    gesture_ = Gesture::Spray;
    sprayed_ = 0;
    doc_->beginPreview();
    lastDab_ = toData(px);
    sprayAt_ = lastDab_;
    sprayDab(lastDab_);
    sprayTimer_.start();
    return;
  }
  // Select tool: a point under the cursor starts a drag, empty space a rubber band.
  const bool additive = e->modifiers() & (Qt::ShiftModifier | Qt::ControlModifier);
  int idx = view_->layer(Which::A)->pointAt(px, kPickRadiusPx);
  Which w = Which::A;
  const int idxB = view_->layer(Which::B)->pointAt(px, kPickRadiusPx);
  if (idxB >= 0 && (idx < 0 || !view_->layer(Which::A)->visible())) {
    idx = idxB;
    w = Which::B;
  }
  if (idx >= 0) {
    emit editStarting();
    auto& sel = w == Which::A ? selA_ : selB_;
    if (!sel[std::size_t(idx)]) {
      if (!additive) {
        selA_.assign(selA_.size(), false);
        selB_.assign(selB_.size(), false);
      }
      sel[std::size_t(idx)] = true;
      pushSelection();
    } else if (additive) {
      sel[std::size_t(idx)] = false;
      pushSelection();
      return;
    }
    gesture_ = Gesture::Drag;
    pressData_ = toData(px);
    origA_ = doc_->session().a;
    origB_ = doc_->session().b;
    doc_->beginPreview();
    return;
  }
  gesture_ = Gesture::Band;
  bandAdditive_ = additive;
  if (!band_) band_ = new QRubberBand(QRubberBand::Rectangle, view_->plot());
  band_->setGeometry(QRect(px.toPoint(), QSize()));
  band_->show();
}

void FieldEditor::onMove(QMouseEvent* e) {
  const QPointF px = e->position();
  switch (gesture_) {
    case Gesture::Drag: {
      const QPointF d = toData(px) - pressData_;
      Cloud a = origA_, b = origB_;
      const Eigen::RowVector2d delta(d.x(), d.y());
      for (Eigen::Index i = 0; i < a.size(); ++i)
        if (selA_[std::size_t(i)]) a.points.row(i) += delta;
      for (Eigen::Index i = 0; i < b.size(); ++i)
        if (selB_[std::size_t(i)]) b.points.row(i) += delta;
      doc_->preview(a, b);
      return;
    }
    case Gesture::Band:
      band_->setGeometry(QRect(pressPx_.toPoint(), px.toPoint()).normalized());
      return;
    case Gesture::Spray: {
      sprayAt_ = toData(px);
      const QPointF step = sprayAt_ - lastDab_;
      if (std::hypot(step.x(), step.y()) >= radius_ / 2) {
        lastDab_ = sprayAt_;
        sprayDab(sprayAt_);
      }
      return;
    }
    case Gesture::None:
      break;
  }
  // Hover read-out.
  int idx = view_->layer(Which::A)->pointAt(px, kPickRadiusPx);
  Which w = Which::A;
  if (idx < 0) {
    idx = view_->layer(Which::B)->pointAt(px, kPickRadiusPx);
    w = Which::B;
  }
  if (idx != hoverIdx_ || w != hoverWhich_) {
    hoverIdx_ = idx;
    hoverWhich_ = w;
    view_->setHover(w, idx);
  }
}

void FieldEditor::onRelease(QMouseEvent* e) {
  if (e->button() != Qt::LeftButton) return;
  switch (gesture_) {
    case Gesture::Drag: {
      gesture_ = Gesture::None;
      doc_->commitPreview(tr("Move %n point(s)", "", selectedCount()));
      return;
    }
    case Gesture::Spray:
      gesture_ = Gesture::None;
      sprayTimer_.stop();
      doc_->commitPreview(tr("Spray %n point(s) into %1", "", sprayed_).arg(target_ == Which::A ? "A" : "B"));
      return;
    case Gesture::Band: {
      gesture_ = Gesture::None;
      const QRectF r = QRectF(pressPx_, e->position()).normalized();
      band_->hide();
      if (!bandAdditive_) {
        selA_.assign(selA_.size(), false);
        selB_.assign(selB_.size(), false);
      }
      const auto& s = doc_->session();
      auto pick = [&](const Cloud& c, std::vector<bool>& sel) {
        for (Eigen::Index i = 0; i < c.size(); ++i) {
          const QPointF p(view_->plot()->xAxis->coordToPixel(c.points(i, 0)),
                          view_->plot()->yAxis->coordToPixel(c.points(i, 1)));
          if (r.contains(p)) sel[std::size_t(i)] = true;
        }
      };
      if (view_->layer(Which::A)->visible()) pick(s.a, selA_);
      if (view_->layer(Which::B)->visible()) pick(s.b, selB_);
      pushSelection();
      return;
    }
    case Gesture::None:
      return;
  }
}

void FieldEditor::sprayDab(const QPointF& at) {
  if (gesture_ != Gesture::Spray) return;
  Cloud a = doc_->session().a, b = doc_->session().b;
  Cloud& c = target_ == Which::A ? a : b;
  const double w = meanWeight(c);
  std::uniform_real_distribution<double> u(0.0, 1.0);
  const Eigen::Index n0 = c.size();
  Eigen::MatrixX2d pts = c.points;
  Eigen::VectorXd ws = c.weights;
  pts.conservativeResize(n0 + perDab_, 2);
  ws.conservativeResize(n0 + perDab_);
  for (int k = 0; k < perDab_; ++k) {
    // Uniform in the disc: radius ∝ sqrt(U).
    const double r = radius_ * std::sqrt(u(rng_)), t = 2 * M_PI * u(rng_);
    pts.row(n0 + k) << at.x() + r * std::cos(t), at.y() + r * std::sin(t);
    ws(n0 + k) = w;
  }
  c = withPoints(c, pts, ws);
  auto& sel = target_ == Which::A ? selA_ : selB_;
  sel.resize(std::size_t(c.size()), false);
  sprayed_ += perDab_;
  doc_->preview(a, b);
}

}  // namespace barrow::ui
