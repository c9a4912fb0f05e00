#include "segment_layer.h"

#include <algorithm>
#include <array>

namespace barrow::ui {

SegmentLayer::SegmentLayer(QCPAxis* keyAxis, QCPAxis* valueAxis)
    : QCPAbstractPlottable(keyAxis, valueAxis) {
  setSelectable(QCP::stNone);
  setAntialiased(true);
}

void SegmentLayer::setPlan(const std::vector<PlanEntry>& plan, const Eigen::MatrixX2d& a,
                           const Eigen::MatrixX2d& b, std::size_t maxSegments) {
  entries_.clear();
  entries_.reserve(plan.size());
  for (const auto& e : plan)
    if (e.i >= 0 && e.i < a.rows() && e.j >= 0 && e.j < b.rows() && e.mass > 0) entries_.push_back(e);
  if (entries_.size() > maxSegments) {
    std::nth_element(entries_.begin(), entries_.begin() + std::ptrdiff_t(maxSegments), entries_.end(),
                     [](const PlanEntry& x, const PlanEntry& y) { return x.mass > y.mass; });
    entries_.resize(maxSegments);
  }
  // Light segments first, so heavy ones are painted on top.
  std::sort(entries_.begin(), entries_.end(),
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
  // effective number of entries (Σm)²/Σm² measures the spread; opacities are scaled by
  // (n + m)/that, so the picture keeps showing where the mass goes.
  double sum = 0, sum2 = 0;
  for (double m : mass_) sum += m, sum2 += m * m;
  const double effective = sum2 > 0 ? sum * sum / sum2 : 1.0;
  sparseness_ = std::min(1.0, double(a.rows() + b.rows()) / effective);
}

void SegmentLayer::clearPlan() {
  entries_.clear();
  seg_.clear();
  mass_.clear();
  maxMass_ = 0;
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
  for (const auto& e : entries_)
    if ((fromA ? e.i : e.j) == index) out.push_back(e);
  std::sort(out.begin(), out.end(), [](const PlanEntry& x, const PlanEntry& y) { return x.mass > y.mass; });
  return out;
}

QCPRange SegmentLayer::getKeyRange(bool& foundRange, QCP::SignDomain) const {
  foundRange = !seg_.empty();
  if (!foundRange) return {};
  QCPRange r(seg_[0][0], seg_[0][0]);
  for (const auto& s : seg_) {
    r.expand(s[0]);
    r.expand(s[2]);
  }
  return r;
}

QCPRange SegmentLayer::getValueRange(bool& foundRange, QCP::SignDomain, const QCPRange&) const {
  foundRange = !seg_.empty();
  if (!foundRange) return {};
  QCPRange r(seg_[0][1], seg_[0][1]);
  for (const auto& s : seg_) {
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
  for (std::size_t k = 0; k < seg_.size(); ++k) {
    if (mass_[k] < cut) continue;
    if (anyHighlight && (hiFromA_ ? entries_[k].i : entries_[k].j) == hiIndex_) continue;  // drawn last
    const int level = std::min(kLevels - 1, int(mass_[k] / maxMass_ * kLevels));
    lines[std::size_t(level)].append(
        QLineF(coordsToPixels(seg_[k][0], seg_[k][1]), coordsToPixels(seg_[k][2], seg_[k][3])));
  }
  // A one-pixel cosmetic pen goes through the raster engine's fast line stroker, even
  // antialiased; wider pens take the general path stroker, ~20× slower per segment.
  QPen pen(color_, 1.0);
  pen.setCosmetic(true);
  if (dashed_) pen.setStyle(Qt::DashLine);
  for (int level = 0; level < kLevels; ++level) {
    if (lines[std::size_t(level)].isEmpty()) continue;
    QColor c = color_;
    const double share = (level + 0.5) / kLevels;
    c.setAlphaF(std::clamp((0.05 + 0.5 * share) * sparseness_, 0.0, 1.0) * (anyHighlight ? 0.35 : 1.0));
    pen.setColor(c);
    painter->setPen(pen);
    painter->drawLines(lines[std::size_t(level)]);
  }
  if (!anyHighlight) return;
  for (std::size_t k = 0; k < seg_.size(); ++k) {
    if ((hiFromA_ ? entries_[k].i : entries_[k].j) != hiIndex_) continue;
    QPen hp(color_, 1.0 + 3.0 * mass_[k] / maxMass_);
    painter->setPen(hp);
    painter->drawLine(coordsToPixels(seg_[k][0], seg_[k][1]), coordsToPixels(seg_[k][2], seg_[k][3]));
  }
}

void SegmentLayer::drawLegendIcon(QCPPainter* painter, const QRectF& rect) const {
  QPen pen(color_, 1.6);
  if (dashed_) pen.setStyle(Qt::DashLine);
  painter->setPen(pen);
  painter->drawLine(QLineF(rect.left(), rect.center().y(), rect.right(), rect.center().y()));
}

}  // namespace barrow::ui
