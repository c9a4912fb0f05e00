#include "measure_style.h"

#include <QPixmap>
#include <qcustomplot.h>

#include "measures/registry.h"
#include "palette.h"

namespace barrow::ui {

std::size_t measureRank(const std::string& id) {
  const auto& all = MeasureRegistry::instance().all();
  for (std::size_t k = 0; k < all.size(); ++k)
    if (all[k]->id() == id) return k;
  return all.size();
}

QPen measurePen(const std::string& id, double width) { return palette::curvePen(int(measureRank(id)), width); }

QCPScatterStyle measureMarker(const std::string& id, const QPen& pen, double size) {
  static const QCPScatterStyle::ScatterShape shapes[palette::kCurveMarkers] = {
      QCPScatterStyle::ssCircle, QCPScatterStyle::ssSquare, QCPScatterStyle::ssDiamond,
      QCPScatterStyle::ssCross,  QCPScatterStyle::ssPlus,   QCPScatterStyle::ssStar};
  QPen outline(pen.color(), 1.3);
  outline.setStyle(Qt::SolidLine);
  return QCPScatterStyle(shapes[palette::curveMarker(int(measureRank(id)))], outline, Qt::NoBrush, size);
}

QIcon measureIcon(const std::string& id) {
  QPixmap pm(22, 12);
  pm.fill(Qt::transparent);
  QCPPainter p(&pm);
  p.setRenderHint(QPainter::Antialiasing);
  const QPen pen = measurePen(id, 2.0);
  p.setPen(pen);
  p.drawLine(QPointF(1, 6), QPointF(21, 6));
  const QCPScatterStyle marker = measureMarker(id, pen, 6);
  marker.applyTo(&p, pen);
  marker.drawShape(&p, QPointF(11, 6));
  return QIcon(pm);
}

}  // namespace barrow::ui
