// The Measures table: one row per registered measure with its value, the change from the
// reference θ, the unit of both, its status (with the reason), compute time, the resampling
// interval and the permutation p-value once computed, and a check box that puts it on
// the Sweep plots. Each row unfolds into its parameters, editable in place with units and
// valid ranges from the measure's ParamSpec. Below, the selected measure's formula and the
// settings it actually used.
#pragma once

#include <QWidget>
#include <map>
#include <optional>
#include <vector>

#include "live_evaluator.h"
#include "session_document.h"

class QTreeWidget;
class QTreeWidgetItem;
class QTextBrowser;
class QLabel;

namespace barrow {
struct SpreadResult;
struct PermuteResult;
}  // namespace barrow

namespace barrow::ui {

class MeasuresPanel : public QWidget {
  Q_OBJECT
 public:
  MeasuresPanel(SessionDocument* doc, std::vector<const Measure*> measures, QWidget* parent = nullptr);

  /// A new request went out: keep the old numbers but mark every row as updating.
  void markUpdating();
  void applyUpdate(const LiveUpdate& u);
  /// Interval ("0.412 [0.388, 0.441]") and p-value cells from a finished resampling run.
  void setUncertainty(const SpreadResult& spread, const PermuteResult& permute);
  /// The clouds or settings changed after the run: grey the interval and p-value cells and
  /// say so in their tooltips (they describe the old clouds).
  void markUncertaintyStale();
  bool uncertaintyStale() const { return uncertaintyStale_; }
  /// Column numbers of the interval and p-value cells (for cellText).
  static int intervalColumn();
  static int pValueColumn();

  /// Cell texts, for tests and the CSV export: column 0..5 of a measure's row (name, value,
  /// change, unit, status, time).
  QString cellText(const std::string& id, int column) const;
  /// The latest result of a measure for the current request, if it arrived.
  const Result* result(const std::string& id) const;
  /// Table as CSV (id, name, value, unit, change, status, seconds).
  std::string toCsv() const;
  QTreeWidget* tree() const { return tree_; }
  void focusMeasure(const std::string& id);

 signals:
  void measureFocused(const QString& id);
  void message(const QString& text);

 protected:
  void resizeEvent(QResizeEvent* e) override;
  void changeEvent(QEvent* e) override;  // a new colour scheme redraws the series icons

 private:
  // Hides the Time column when the pane is too narrow for the measure names beside it
  // (its value stays in the Status tooltip), and whenever the interval columns are shown.
  void fitColumns();
  /// Each row shows "id — name" when the column has room for all of it, else the id alone.
  void fitNames();
  int nameTextWidth(QTreeWidgetItem* item) const;
  void build();
  void refreshParams();
  void refreshSelection();
  void showDetails(const std::string& id);
  QTreeWidgetItem* rowOf(const std::string& id) const;

  SessionDocument* doc_;
  std::vector<const Measure*> measures_;
  QTreeWidget* tree_;
  QTextBrowser* details_;
  std::map<std::string, Result> results_;
  std::map<std::string, std::optional<Result>> references_;
  bool updatingUi_ = false;
  bool uncertaintyStale_ = false;
  bool intervalsShown_ = false;
};

}  // namespace barrow::ui
