// The Findings: one row per measure with the continuity verdict in plain words (from the
// engine's findContinuity), its Lipschitz estimate and jump count. Clicking a row
// highlights that measure on the Sweep plots and in the Measures table.
#pragma once

#include <QWidget>
#include <vector>

#include "sweep/findings.h"

class QLabel;
class QTableWidget;

namespace barrow::ui {

class SessionDocument;

class FindingsPanel : public QWidget {
  Q_OBJECT
 public:
  explicit FindingsPanel(SessionDocument* doc, QWidget* parent = nullptr);
  /// Findings of a sweep computed at session revision `revision`: greyed under a notice
  /// whenever the document is at another revision.
  void setFindings(const std::vector<Finding>& findings, quint64 revision);
  void clear(const QString& hint);
  QTableWidget* table() const { return table_; }
  void selectMeasure(const std::string& id);
  /// True while the rows belong to clouds or settings that have changed since (greyed, notice shown).
  bool stale() const { return stale_; }
  QLabel* staleNotice() const { return notice_; }

 signals:
  void measureFocused(const QString& id);

 protected:
  void resizeEvent(QResizeEvent* e) override;
  /// A switch between light and dark scheme recolours the verdicts and the swatches.
  void changeEvent(QEvent* e) override;

 private:
  void updateStale();

  SessionDocument* doc_;
  QTableWidget* table_;
  QLabel* notice_;
  quint64 revision_ = 0;
  bool hasFindings_ = false;
  bool stale_ = false;
};

}  // namespace barrow::ui
