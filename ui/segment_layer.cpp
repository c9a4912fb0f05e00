#include "segment_layer.h"

#include <algorithm>
#include <array>
#include <cmath>
#include <QLocale>

#include "plan_thinning.h"

namespace barrow::ui {

SegmentLayer::SegmentLayer(QCPAxis* keyAxis, QCPAxis* valueAxis)
    : QCPAbstractPlottable(keyAxis, valueAxis) {
  setSelectable(QCP::stNone);
  setAntialiased(true);
}

void SegmentLayer::setPlan(const std::vector<PlanEntry>& plan, const Eigen::MatrixX2d& a,
                           const Eigen::MatrixX2d& b, std::size_t budget) {
  all_.clear();
  all_.reserve(plan.size());
  for (const auto& e : plan)
    if (e.i >= 0 && e.i < a.rows() && e.j >= 0 && e.j < b.rows() && e.mass > 0) all_.push_back(e);
  allSeg_.resize(all_.size());
  for (std::size_t k = 0; k < all_.size(); ++k)
    allSeg_[k] = {a(all_[k].i, 0), a(all_[k].i, 1), b(all_[k].j, 0), b(all_[k].j, 1)};
  const ThinnedPlan thin = thinByMass(all_, budget);
  totalMass_ = thin.totalMass;
  entries_.clear();
  entries_.reserve(thin.drawn.size());
  for (std::size_t k : thin.drawn) entries_.push_back(all_[k]);
  // Light segments first, so heavy ones are painted on top.
  std::stable_sort(entries_.begin(), entries_.end(),
                   [](const PlanEntry& x, const PlanEntry& y) { return x.mass < y.mass; });
  seg_.resize(entries_.size());
  mass_.resize(entries_.size());
  maxMass_ = 0;
  for (std::size_t k = 0; k < entries_.size(); ++k) {
    const auto& e = entries_[k];
    seg_[k] = {a(e.i, 0), a(e.i, 1), b(e.j, 0), b(e.j, 1)};
    mass_[k] = e.mass;
    maxMass_ = std::max(maxMass_, e.mass);
  }
  // A vertex of the transport polytope has at most n + m − 1 entries; a spread-out (entropic)
  // plan has many more of similar mass, whose segments would pile up into a solid sheet. The
  // effective number of drawn entries (Σm)²/Σm² measures the spread; opacities are scaled by
  // min(n + m, budget)/that, so the picture keeps showing where the mass goes.
  double sum = 0, sum2 = 0;
  for (double m : mass_) sum += m, sum2 += m * m;
  const double effective = sum2 > 0 ? sum * sum / sum2 : 1.0;
  const double sparse = double(std::min<std::size_t>(std::size_t(a.rows() + b.rows()), std::max<std::size_t>(budget, 1)));
  sparseness_ = std::min(1.0, sparse / effective);
  updateName();
}

void SegmentLayer::clearPlan() {
  all_.clear();
  allSeg_.clear();
  entries_.clear();
  seg_.clear();
  mass_.clear();
  maxMass_ = 0;
  totalMass_ = 0;
  updateName();
}

void SegmentLayer::setLabel(const QString& label) {
  label_ = label;
  updateName();
}

void SegmentLayer::setThreshold(double fraction) {
  threshold_ = fraction;
  updateName();
}

double SegmentLayer::shownMassShare() const {
  if (totalMass_ <= 0) return 0.0;
  const double cut = threshold_ * maxMass_;
  double shown = 0;
  for (double m : mass_)
    if (m >= cut) shown += m;
  return std::clamp(shown / totalMass_, 0.0, 1.0);
}

void SegmentLayer::updateName() {
  const std::size_t visible = visibleCount();
  if (all_.empty() || visible == all_.size()) {
    setName(label_);
    return;
  }
  // "12%" (or "0.4%" below one per cent) of the mass, and how many segments carry it.
  const double pct = 100.0 * shownMassShare();
  const QString share = pct >= 1.0 || pct == 0.0 ? QString::number(std::round(pct)) : QString::number(pct, 'f', 1);
  setName(tr("%1 — %2% of mass (%3 of %4 segments)")
              .arg(label_, share, QLocale().toString(qulonglong(visible)), QLocale().toString(qulonglong(all_.size()))));
}

void SegmentLayer::setHighlight(bool fromA, int index) {
  hiFromA_ = fromA;
  hiIndex_ = index;
}

std::size_t SegmentLayer::visibleCount() const {
  const double cut = threshold_ * maxMass_;
  return std::size_t(std::count_if(mass_.begin(), mass_.end(), [cut](double m) { return m >= cut; }));
}

std::vector<PlanEntry> SegmentLayer::entriesOf(bool fromA, int index) const {
  std::vector<PlanEntry> out;
  for (const auto& e : all_)
    if ((fromA ? e.i : e.j) == index) out.push_back(e);
  std::sort(out.begin(), out.end(), [](const PlanEntry& x, const PlanEntry& y) { return x.mass > y.mass; });
  return out;
}

QCPRange SegmentLayer::getKeyRange(bool& foundRange, QCP::SignDomain) const {
  foundRange = !allSeg_.empty();
  if (!foundRange) return {};
  QCPRange r(allSeg_[0][0], allSeg_[0][0]);
  for (const auto& s : allSeg_) {
    r.expand(s[0]);
    r.expand(s[2]);
  }
  return r;
}

QCPRange SegmentLayer::getValueRange(bool& foundRange, QCP::SignDomain, const QCPRange&) const {
  foundRange = !allSeg_.empty();
  if (!foundRange) return {};
  QCPRange r(allSeg_[0][1], allSeg_[0][1]);
  for (const auto& s : allSeg_) {
    r.expand(s[1]);
    r.expand(s[3]);
  }
  return r;
}

void SegmentLayer::draw(QCPPainter* painter) {
  if (seg_.empty() || maxMass_ <= 0) return;
  applyDefaultAntialiasingHint(painter);
  const double cut = threshold_ * maxMass_;
  const bool anyHighlight = hiIndex_ >= 0;
  // Opacity ∝ mass (at most 0.55, so dense plans do not hide the points), with a floor so
  // light segments stay faintly visible (all scaled down for spread-out plans); dimmed while a
  // point is hovered so that its own segments stand out. Opacities are binned into a few
  // levels and each level is drawn with one pen in one call: thousands of segments then
  // cost a few milliseconds instead of one pen change each.
  constexpr int kLevels = 24;
  std::array<QVector<QLineF>, kLevels> lines;
  double ink = 0.0;  // total length of the drawn lines, px
  QRectF box;
  for (std::size_t k = 0; k < seg_.size(); ++k) {
    if (mass_[k] < cut) continue;
    if (anyHighlight && (hiFromA_ ? entries_[k].i : entries_[k].j) == hiIndex_) continue;  // drawn last
    const int level = std::min(kLevels - 1, int(mass_[k] / maxMass_ * kLevels));
    const QLineF line(coordsToPixels(seg_[k][0], seg_[k][1]), coordsToPixels(seg_[k][2], seg_[k][3]));
    ink += line.length();
    box |= QRectF(line.p1(), line.p2()).normalized().adjusted(-0.5, -0.5, 0.5, 0.5);
    lines[std::size_t(level)].append(line);
  }
  // Coverage: how many one-pixel lines cross an average pixel of the region they span. Above
  // about one, opacities are scaled down so overlapping segments still show where mass runs
  // dense instead of merging into a solid sheet that hides both clouds.
  const QRectF region = box & QRectF(clipRect());
  const double coverage = region.isEmpty() ? 0.0 : ink / (region.width() * region.height());
  const double crowd = coverage > 1.0 ? 1.0 / coverage : 1.0;
  // A one-pixel cosmetic pen goes through the raster engine's fast line stroker, even
  // antialiased; wider pens take the general path stroker, ~20× slower per segment.
  QPen pen(color_, 1.0);
  pen.setCosmetic(true);
  if (dashed_) pen.setStyle(Qt::DashLine);
  for (int level = 0; level < kLevels; ++level) {
    if (lines[std::size_t(level)].isEmpty()) continue;
    QColor c = color_;
    const double share = (level + 0.5) / kLevels;
    c.setAlphaF(std::clamp((0.05 + 0.5 * share) * sparseness_ * crowd, 0.004, 1.0) * (anyHighlight ? 0.35 : 1.0));
    pen.setColor(c);
    painter->setPen(pen);
    painter->drawLines(lines[std::size_t(level)]);
  }
  if (!anyHighlight) return;
  // Every segment of the hovered point, drawn or thinned away.
  for (std::size_t k = 0; k < allSeg_.size(); ++k) {
    if ((hiFromA_ ? all_[k].i : all_[k].j) != hiIndex_) continue;
    QPen hp(color_, 1.0 + 3.0 * std::min(1.0, all_[k].mass / maxMass_));
    painter->setPen(hp);
    painter->drawLine(coordsToPixels(allSeg_[k][0], allSeg_[k][1]), coordsToPixels(allSeg_[k][2], allSeg_[k][3]));
  }
}

void SegmentLayer::drawLegendIcon(QCPPainter* painter, const QRectF& rect) const {
  QPen pen(color_, 1.6);
  if (dashed_) pen.setStyle(Qt::DashLine);
  painter->setPen(pen);
  painter->drawLine(QLineF(rect.left(), rect.center().y(), rect.right(), rect.center().y()));
}

}  // namespace barrow::ui
