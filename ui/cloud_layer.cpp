#include "cloud_layer.h"

#include <cmath>

#include "cloud/cloud.h"

#include <algorithm>
#include <cmath>

namespace barrow::ui {

CloudLayer::CloudLayer(QCPAxis* keyAxis, QCPAxis* valueAxis)
    : QCPAbstractPlottable(keyAxis, valueAxis) {
  setSelectable(QCP::stNone);
  setAntialiased(true);
}

void CloudLayer::setData(const Eigen::MatrixX2d& points, const Eigen::VectorXd& weights) {
  points_ = points;
  const bool massive = weights.size() > 0 && weights.maxCoeff() > 0 && std::isfinite(weights.maxCoeff());
  share_ = massive ? Eigen::VectorXd(normalizeWeights(weights) * double(weights.size()))
                   : Eigen::VectorXd::Ones(points.rows());
  if (Eigen::Index(selected_.size()) != points.rows()) selected_.assign(std::size_t(points.rows()), false);
  if (highlighted_ >= points.rows()) highlighted_ = -1;
}

void CloudLayer::setStyle(const QColor& color, MarkerShape shape, double baseSize) {
  color_ = color;
  shape_ = shape;
  baseSize_ = baseSize;
  sprites_.clear();
}

void CloudLayer::setSelectedPoints(const std::vector<bool>& selected) { selected_ = selected; }
void CloudLayer::setHighlighted(int index) { highlighted_ = index; }
void CloudLayer::setHollow(bool hollow) {
  hollow_ = hollow;
  sprites_.clear();
}

double CloudLayer::markerSize(Eigen::Index i) const {
  // Area proportional to the share of mass: diameter ∝ sqrt(share). Clamped so that a
  // zero-weight point stays visible and a heavy one does not hide the rest.
  const double s = share_.size() > i ? share_(i) : 1.0;
  return std::clamp(baseSize_ * crowdScale_ * std::sqrt(std::max(s, 0.0)), 3.0, 5.0 * baseSize_);
}

int CloudLayer::pointAt(const QPointF& pos, double radiusPx) const {
  int best = -1;
  double bestD = radiusPx * radiusPx;
  for (Eigen::Index i = 0; i < points_.rows(); ++i) {
    const QPointF p = coordsToPixels(points_(i, 0), points_(i, 1));
    const double dx = p.x() - pos.x(), dy = p.y() - pos.y();
    const double d = dx * dx + dy * dy;
    if (d <= bestD) {
      bestD = d;
      best = int(i);
    }
  }
  return best;
}

double CloudLayer::selectTest(const QPointF& pos, bool onlySelectable, QVariant*) const {
  if (onlySelectable) return -1;
  const int i = pointAt(pos, 10);
  if (i < 0) return -1;
  const QPointF p = coordsToPixels(points_(i, 0), points_(i, 1));
  return std::hypot(p.x() - pos.x(), p.y() - pos.y());
}

QCPRange CloudLayer::getKeyRange(bool& foundRange, QCP::SignDomain) const {
  foundRange = points_.rows() > 0;
  if (!foundRange) return {};
  return QCPRange(points_.col(0).minCoeff(), points_.col(0).maxCoeff());
}

QCPRange CloudLayer::getValueRange(bool& foundRange, QCP::SignDomain, const QCPRange&) const {
  foundRange = points_.rows() > 0;
  if (!foundRange) return {};
  return QCPRange(points_.col(1).minCoeff(), points_.col(1).maxCoeff());
}

const QPixmap& CloudLayer::markerPixmap(double size, double dpr) {
  if (dpr != spriteDpr_) {
    sprites_.clear();
    spriteDpr_ = dpr;
  }
  const int key = int(std::lround(size * 4));
  auto it = sprites_.find(key);
  if (it != sprites_.end()) return it->second;
  const double s = key / 4.0;
  const int side = int(std::ceil(s * 1.5 + 4));
  QPixmap pm(int(std::ceil(side * dpr)), int(std::ceil(side * dpr)));
  pm.setDevicePixelRatio(dpr);
  pm.fill(Qt::transparent);
  QPainter p(&pm);
  p.setRenderHint(QPainter::Antialiasing);
  QColor fill = color_;
  fill.setAlphaF(hollow_ ? 0.0 : alpha_);
  if (hollow_ || outlined_) p.setPen(QPen(hollow_ ? ringColor() : color_.darker(135), hollow_ ? 1.2 : 0.8));
  else p.setPen(Qt::NoPen);
  p.setBrush(hollow_ ? Qt::NoBrush : QBrush(fill));
  drawMarker(&p, QPointF(side / 2.0, side / 2.0), s);
  return sprites_.emplace(key, pm).first->second;
}

void CloudLayer::drawMarker(QPainter* painter, const QPointF& c, double size) const {
  const double r = size / 2;
  switch (shape_) {
    case MarkerShape::Disc:
      painter->drawEllipse(c, r, r);
      break;
    case MarkerShape::Square:
      painter->drawRect(QRectF(c.x() - r * 0.9, c.y() - r * 0.9, 1.8 * r, 1.8 * r));
      break;
    case MarkerShape::Triangle: {
      const double h = r * 1.15;
      const QPointF tri[3] = {{c.x(), c.y() - h}, {c.x() + h * 0.92, c.y() + h * 0.6},
                              {c.x() - h * 0.92, c.y() + h * 0.6}};
      painter->drawPolygon(tri, 3);
      break;
    }
    case MarkerShape::Diamond: {
      const double h = r * 1.2;
      const QPointF dia[4] = {{c.x(), c.y() - h}, {c.x() + h, c.y()}, {c.x(), c.y() + h}, {c.x() - h, c.y()}};
      painter->drawPolygon(dia, 4);
      break;
    }
  }
}

constexpr Eigen::Index kCrowd = 1000;
constexpr Eigen::Index kStampAll = 20000;

void CloudLayer::adaptToCrowd() {
  // Coverage: how many markers of the base size land on an average pixel of the cloud's
  // on-screen extent. Above about one, opaque markers hide whatever was drawn before (the
  // other cloud); the fill is made faint enough that all markers over a pixel together
  // cover about 60 % of it, and markers shrink (to half) from 2 000 points on; clouds of up to
  // kCrowd points are drawn as before [CP].
  const QRectF clip = clipRect();
  double left = INFINITY, right = -INFINITY, top = INFINITY, bottom = -INFINITY;
  Eigen::Index visible = 0;
  for (Eigen::Index i = 0; i < points_.rows(); ++i) {
    const QPointF p = coordsToPixels(points_(i, 0), points_(i, 1));
    if (!clip.contains(p)) continue;
    ++visible;
    left = std::min(left, p.x());
    right = std::max(right, p.x());
    top = std::min(top, p.y());
    bottom = std::max(bottom, p.y());
  }
  visible_ = visible;
  const double scale = visible > 2000 ? std::max(0.5, std::sqrt(2000.0 / double(visible))) : 1.0;
  double alpha = 0.78;
  if (visible > kCrowd) {  // a few hundred points keep their look, however tightly packed
    const double d = std::max(3.0, baseSize_ * scale);
    const double area = std::max(1.0, (right - left + d) * (bottom - top + d));
    const double coverage = double(visible) * 0.785 * d * d / area;
    alpha = std::clamp(0.6 / coverage, 0.05, 0.78);
  }
  alpha = std::round(alpha * 64.0) / 64.0;  // a few sprite sets, not one per frame
  const bool outlined = visible <= kCrowd;
  if (alpha != alpha_ || scale != crowdScale_ || outlined != outlined_) sprites_.clear();
  alpha_ = alpha;
  crowdScale_ = scale;
  outlined_ = outlined;
}

QColor CloudLayer::ringColor() const {
  // Hollow rings (the unmoved A) fade with the crowd like the fills, a little less.
  QColor c = color_;
  c.setAlphaF(std::min(1.0, alpha_ / 0.78 * 1.2));
  return c;
}

// x·a/255 for the four 8-bit channels of a premultiplied pixel at once (two channels per
// multiply, rounded) [CP].
static inline quint32 scaleChannels(quint32 x, quint32 a) {
  quint32 lo = (x & 0x00ff00ffu) * a;
  lo = ((lo + ((lo >> 8) & 0x00ff00ffu) + 0x00800080u) >> 8) & 0x00ff00ffu;
  quint32 hi = ((x >> 8) & 0x00ff00ffu) * a;
  hi = (hi + ((hi >> 8) & 0x00ff00ffu) + 0x00800080u) & 0xff00ff00u;
  return hi | lo;
}

// Above some 2·10^4 visible points one drawPixmap call per marker dominates a redraw (~12 ms
// at 10^5 points, on every frame of a drag). The same sprites are blended here with "source
// over" straight into one premultiplied image, snapped to whole device pixels, which is then
// drawn once: the markers are 2–4 px and translucent at that size, so the half-pixel
// placement is not visible.
void CloudLayer::stampAll(QCPPainter* painter, const QRectF& clip, double dpr) {
  const QRect area = clip.toAlignedRect();
  QImage canvas(int(std::ceil(area.width() * dpr)), int(std::ceil(area.height() * dpr)),
                QImage::Format_ARGB32_Premultiplied);
  if (canvas.isNull()) return;
  canvas.fill(Qt::transparent);
  struct Sprite {
    int w = 0, h = 0;
    double dx = 0, dy = 0;  // top-left corner relative to the marker's centre, device px
    std::vector<quint32> px;
  };
  std::map<qint64, Sprite> sprites;  // by the pixmap's cache key
  const int W = canvas.width(), H = canvas.height();
  auto* base = reinterpret_cast<quint32*>(canvas.bits());
  const qsizetype stride = canvas.bytesPerLine() / 4;
  const double ox = area.left(), oy = area.top();
  for (Eigen::Index i = 0; i < points_.rows(); ++i) {
    const QPointF p = coordsToPixels(points_(i, 0), points_(i, 1));
    if (!clip.contains(p)) continue;
    const QPixmap& pm = markerPixmap(markerSize(i), dpr);
    auto it = sprites.find(pm.cacheKey());
    if (it == sprites.end()) {
      // The sprite's pixels cropped to its visible part (the pixmap has a margin for the
      // antialiased edge), with the offset of that part from the pixmap's centre.
      const QImage img = pm.toImage().convertToFormat(QImage::Format_ARGB32_Premultiplied);
      int left = img.width(), right = -1, top = img.height(), bottom = -1;
      for (int y = 0; y < img.height(); ++y) {
        const auto* row = reinterpret_cast<const quint32*>(img.constScanLine(y));
        for (int x = 0; x < img.width(); ++x)
          if (row[x] != 0) left = std::min(left, x), right = std::max(right, x), top = std::min(top, y), bottom = std::max(bottom, y);
      }
      Sprite sp;
      if (right >= left) {
        sp.w = right - left + 1;
        sp.h = bottom - top + 1;
        sp.dx = left - img.width() / 2.0;
        sp.dy = top - img.height() / 2.0;
        for (int y = top; y <= bottom; ++y) {
          const auto* row = reinterpret_cast<const quint32*>(img.constScanLine(y));
          sp.px.insert(sp.px.end(), row + left, row + right + 1);
        }
      }
      it = sprites.emplace(pm.cacheKey(), std::move(sp)).first;
    }
    const Sprite& sp = it->second;
    const int x0 = int(std::floor((p.x() - ox) * dpr + sp.dx + 0.5));
    const int y0 = int(std::floor((p.y() - oy) * dpr + sp.dy + 0.5));
    const int xa = std::max(0, -x0), xb = std::min(sp.w, W - x0);
    for (int y = std::max(0, -y0); y < std::min(sp.h, H - y0); ++y) {
      const quint32* src = sp.px.data() + std::size_t(y * sp.w);
      quint32* dst = base + qsizetype(y0 + y) * stride + x0;
      for (int x = xa; x < xb; ++x) {
        const quint32 c = src[x];
        if (c != 0) dst[x] = c + scaleChannels(dst[x], 255u - (c >> 24));
      }
    }
  }
  canvas.setDevicePixelRatio(dpr);
  painter->drawImage(QPointF(area.topLeft()), canvas);
}

void CloudLayer::draw(QCPPainter* painter) {
  if (points_.rows() == 0) return;
  applyDefaultAntialiasingHint(painter);
  adaptToCrowd();
  const QRectF clip = clipRect().adjusted(-20, -20, 20, 20);
  QColor fill = color_;
  fill.setAlphaF(hollow_ ? 0.0 : alpha_);
  const QPen outline(hollow_ ? ringColor() : color_.darker(135), hollow_ ? 1.2 : 0.8);
  painter->setPen(hollow_ || outlined_ ? outline : QPen(Qt::NoPen));
  painter->setBrush(hollow_ ? Qt::NoBrush : QBrush(fill));
  // On screen, stamp pre-rendered markers (several times faster for thousands of points);
  // in vector exports (PDF, SVG) draw real shapes.
  const bool vector = painter->modes().testFlag(QCPPainter::pmVectorized) ||
                      painter->modes().testFlag(QCPPainter::pmNoCaching);
  const double dpr = painter->device() ? painter->device()->devicePixelRatioF() : 1.0;
  if (!vector && visible_ > kStampAll) {
    stampAll(painter, clip, dpr);
  } else for (Eigen::Index i = 0; i < points_.rows(); ++i) {
    const QPointF p = coordsToPixels(points_(i, 0), points_(i, 1));
    if (!clip.contains(p)) continue;
    if (vector) {
      drawMarker(painter, p, markerSize(i));
    } else {
      const QPixmap& pm = markerPixmap(markerSize(i), dpr);
      const double half = pm.width() / pm.devicePixelRatio() / 2.0;
      painter->drawPixmap(QPointF(p.x() - half, p.y() - half), pm);
    }
  }
  // Selection and hover rings on top, so they are never hidden under other markers.
  painter->setBrush(Qt::NoBrush);
  painter->setPen(QPen(QColor(0, 0, 0), 1.6));
  for (Eigen::Index i = 0; i < points_.rows(); ++i) {
    if (!selected_[std::size_t(i)]) continue;
    const QPointF p = coordsToPixels(points_(i, 0), points_(i, 1));
    const double r = markerSize(i) / 2 + 3;
    painter->drawEllipse(p, r, r);
  }
  if (highlighted_ >= 0 && highlighted_ < points_.rows()) {
    const QPointF p = coordsToPixels(points_(highlighted_, 0), points_(highlighted_, 1));
    painter->setPen(QPen(QColor(0, 0, 0), 2.2));
    const double r = markerSize(highlighted_) / 2 + 5;
    painter->drawEllipse(p, r, r);
  }
}

void CloudLayer::drawLegendIcon(QCPPainter* painter, const QRectF& rect) const {
  applyDefaultAntialiasingHint(painter);
  QColor fill = color_;
  fill.setAlphaF(hollow_ ? 0.0 : 0.78);
  painter->setPen(QPen(hollow_ ? color_ : color_.darker(135), hollow_ ? 1.2 : 0.8));
  painter->setBrush(hollow_ ? Qt::NoBrush : QBrush(fill));
  drawMarker(painter, rect.center(), std::min(rect.height(), baseSize_ * 1.4));
}

}  // namespace barrow::ui
