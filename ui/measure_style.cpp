#include "measure_style.h"

#include <QPainter>
#include <QPixmap>

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

QIcon measureIcon(const std::string& id) {
  QPixmap pm(22, 12);
  pm.fill(Qt::transparent);
  QPainter p(&pm);
  p.setRenderHint(QPainter::Antialiasing);
  QPen pen = measurePen(id, 2.4);
  p.setPen(pen);
  p.drawLine(QPointF(1, 6), QPointF(21, 6));
  return QIcon(pm);
}

}  // namespace barrow::ui
