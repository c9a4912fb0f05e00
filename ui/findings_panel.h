// The Findings: one row per measure with the continuity verdict in plain words (from the
// engine's findContinuity), its Lipschitz estimate and jump count. Clicking a row
// highlights that measure on the Sweep plots and in the Measures table.
#pragma once

#include <QWidget>
#include <vector>

#include "sweep/findings.h"

class QTableWidget;

namespace barrow::ui {

class FindingsPanel : public QWidget {
  Q_OBJECT
 public:
  explicit FindingsPanel(QWidget* parent = nullptr);
  void setFindings(const std::vector<Finding>& findings);
  void clear(const QString& hint);
  QTableWidget* table() const { return table_; }
  void selectMeasure(const std::string& id);
  /// Marks the rows as belonging to clouds or settings that have changed since (greyed).
  void setStale(bool stale);
  bool stale() const { return stale_; }

 signals:
  void measureFocused(const QString& id);

 private:
  QTableWidget* table_;
  bool stale_ = false;
};

}  // namespace barrow::ui
