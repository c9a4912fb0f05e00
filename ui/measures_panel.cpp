#include "measures_panel.h"

#include <QResizeEvent>

#include <QHeaderView>
#include <QStyle>
#include <algorithm>
#include <QTextBrowser>
#include <QTreeWidget>
#include <QVBoxLayout>
#include <cmath>
#include <sstream>

#include "measure_style.h"
#include "base/param_text.h"
#include "measures/time_estimate.h"
#include "measures/units.h"
#include "param_editor.h"
#include "result_text.h"
#include "uncertainty/permutation_test.h"
#include "uncertainty/spread.h"

namespace barrow::ui {

namespace {

enum Column { kName = 0, kValue, kChange, kUnit, kStatus, kTime, kInterval, kPValue, kColumns };
constexpr int kIdRole = Qt::UserRole + 1;
constexpr int kKeyRole = Qt::UserRole + 2;
constexpr int kFullRole = Qt::UserRole + 3;  // "id — full name", shown when it fits

// The fixed width of every column but the name's (which stretches).
int fixedWidth(const QFontMetrics& fm, int c) {
  switch (c) {
    case kValue: return fm.horizontalAdvance("0.000000  ");
    case kChange: return fm.horizontalAdvance("+0.000000  ");
    case kUnit: return fm.horizontalAdvance("length^0.5   ");  // "dimensionless" elides readably
    case kStatus: return fm.horizontalAdvance("infinite   ");
    case kTime: return fm.horizontalAdvance("000.0 ms ");
    case kInterval: return fm.horizontalAdvance("0.000 [0.000, 0.000]  ");
    case kPValue: return fm.horizontalAdvance("0.0000  ");
    default: return 0;
  }
}

}  // namespace

MeasuresPanel::MeasuresPanel(SessionDocument* doc, std::vector<const Measure*> measures, QWidget* parent)
    : QWidget(parent), doc_(doc), measures_(std::move(measures)), tree_(new QTreeWidget(this)),
      details_(new QTextBrowser(this)) {
  auto* layout = new QVBoxLayout(this);
  layout->setContentsMargins(2, 2, 2, 2);
  layout->addWidget(tree_, 3);
  layout->addWidget(details_, 1);
  tree_->setObjectName("measuresTable");
  tree_->setColumnCount(kColumns);
  tree_->setHeaderLabels({tr("Measure"), tr("Value"), tr("Δ from θ₀"), tr("Unit"), tr("Status"), tr("Time"),
                          tr("Interval"), tr("p (same?)")});
  tree_->headerItem()->setToolTip(kName, tr("Tick a measure to put it on the Sweep plots; unfold it to edit its parameters"));
  tree_->headerItem()->setToolTip(kValue, tr("D(A, B) as defined in DEVELOPERS.md (Measure conventions), for the clouds on the Field"));
  tree_->headerItem()->setToolTip(kChange, tr("Value minus the value with A at the reference θ₀ of the sweep"));
  tree_->headerItem()->setToolTip(kUnit, tr("Unit of the value and of its change: length is the unit of the "
                                           "coordinates; nats for KL and JS (see the details below)"));
  tree_->headerItem()->setToolTip(kStatus, tr("ok, infinite, not converged (with the marginal error) or invalid (with the reason)"));
  tree_->headerItem()->setToolTip(kTime, tr("Wall time of the last evaluation"));
  tree_->headerItem()->setToolTip(kInterval, tr("Value [95 % percentile interval over bootstrap resamples of both clouds]: "
                                                "how much the value moves from sample to sample. It does not show the "
                                                "estimator's bias (see the value-versus-size plot)."));
  tree_->headerItem()->setToolTip(kPValue, tr("Permutation test p-value: could A and B come from one distribution? "
                                              "p = (1 + #{T_perm ≥ T_obs}) / (1 + P)"));
  tree_->setAlternatingRowColors(true);
  tree_->setUniformRowHeights(true);
  tree_->setRootIsDecorated(true);
  tree_->setEditTriggers(QAbstractItemView::DoubleClicked | QAbstractItemView::SelectedClicked |
                         QAbstractItemView::EditKeyPressed);
  tree_->header()->setStretchLastSection(false);
  tree_->header()->setSectionResizeMode(kName, QHeaderView::Stretch);
  connect(tree_->header(), &QHeaderView::sectionResized, this, [this](int section) {
    if (section == kName) fitNames();
  });
  // Fixed widths from the font: resizing to contents would measure every row on every
  // update, which is most of the cost of a table refresh while points are dragged.
  const QFontMetrics fm(font());
  int widths[kColumns];
  for (int c = 0; c < kColumns; ++c) widths[c] = fixedWidth(fm, c);
  for (int c = kValue; c < kColumns; ++c) {
    tree_->header()->setSectionResizeMode(c, QHeaderView::Interactive);
    tree_->header()->resizeSection(c, widths[c]);
  }
  // The interval and p-value columns appear once there is something to show: empty, they
  // would take the width the measure names need in a narrow pane.
  tree_->setColumnHidden(kInterval, true);
  tree_->setColumnHidden(kPValue, true);
  details_->setObjectName("measureDetails");
  details_->setOpenLinks(false);
  details_->setToolTip(tr("Formula of the selected measure and the settings it used"));

  auto* delegate = new ParamDelegate(
      [this](const QModelIndex& index) -> std::optional<ParamSpec> {
        if (index.column() != kValue) return std::nullopt;
        const QString key = index.data(kKeyRole).toString();
        if (key.isEmpty()) return std::nullopt;
        for (const Measure* m : measures_)
          for (const auto& p : m->params())
            if (p.key == key.toStdString()) return p;
        return std::nullopt;
      },
      this);
  tree_->setItemDelegateForColumn(kValue, delegate);
  connect(delegate, &ParamDelegate::committed, this,
          [this](const QString& key, const QString& value, const QString& error) {
            if (!error.isEmpty()) {
              emit message(tr("Not changed: %1").arg(error));
              return;
            }
            doc_->setParam(key.toStdString(), value.toStdString());
          });
  connect(tree_, &QTreeWidget::currentItemChanged, this, [this](QTreeWidgetItem* item) {
    if (!item) return;
    const std::string id = item->data(kName, kIdRole).toString().toStdString();
    showDetails(id);
    emit measureFocused(QString::fromStdString(id));
  });
  connect(tree_, &QTreeWidget::itemChanged, this, [this](QTreeWidgetItem* item, int column) {
    if (updatingUi_ || column != kName || item->parent()) return;
    std::vector<std::string> ids;
    for (int r = 0; r < tree_->topLevelItemCount(); ++r) {
      QTreeWidgetItem* it = tree_->topLevelItem(r);
      if (it->checkState(kName) == Qt::Checked) ids.push_back(it->data(kName, kIdRole).toString().toStdString());
    }
    if (ids.empty()) {
      emit message(tr("At least one measure stays on the Sweep plots."));
      refreshSelection();
      return;
    }
    if (ids.size() == measures_.size()) ids.clear();  // the session's way of saying "all"
    doc_->setSelected(ids);
  });
  connect(doc_, &SessionDocument::paramsChanged, this, &MeasuresPanel::refreshParams);
  connect(doc_, &SessionDocument::selectionChanged, this, &MeasuresPanel::refreshSelection);
  build();
}

void MeasuresPanel::build() {
  updatingUi_ = true;
  tree_->clear();
  if (measures_.empty()) {
    auto* item = new QTreeWidgetItem(tree_);
    item->setText(kName, tr("No measures are registered in this build yet."));
    item->setFlags(Qt::ItemIsEnabled);
  }
  for (const Measure* m : measures_) {
    auto* item = new QTreeWidgetItem(tree_);
    const QString id = QString::fromStdString(m->id());
    // "id — name" where it fits, else the id alone (short and unique; fitNames): a name is
    // never elided, so w1 and w2 never look alike. The full name is always in the tooltip.
    item->setText(kName, id + QStringLiteral(" — ") + QString::fromStdString(m->displayName()));
    item->setData(kName, kFullRole, item->text(kName));
    item->setData(kName, kIdRole, id);
    item->setIcon(kName, measureIcon(m->id()));
    item->setToolTip(kName, QString::fromStdString(m->displayName() + "\n" + m->formula()));
    item->setFlags(Qt::ItemIsEnabled | Qt::ItemIsSelectable | Qt::ItemIsUserCheckable);
    item->setCheckState(kName, Qt::Checked);
    item->setTextAlignment(kValue, Qt::AlignRight | Qt::AlignVCenter);
    item->setTextAlignment(kChange, Qt::AlignRight | Qt::AlignVCenter);
    item->setTextAlignment(kTime, Qt::AlignRight | Qt::AlignVCenter);
    item->setTextAlignment(kInterval, Qt::AlignRight | Qt::AlignVCenter);
    item->setTextAlignment(kPValue, Qt::AlignRight | Qt::AlignVCenter);
    item->setText(kStatus, m->cheap() ? tr("waiting") : tr("waiting (slow)"));
    for (const auto& p : m->params()) {
      auto* child = new QTreeWidgetItem(item);
      const QString key = QString::fromStdString(p.key);
      child->setText(kName, key);
      child->setData(kName, kIdRole, id);
      child->setData(kValue, kKeyRole, key);
      child->setText(kUnit, QString::fromStdString(p.unit));
      child->setText(kStatus, QString::fromStdString(barrow::rangeShort(p)));
      const QString tip = QString::fromStdString(p.help) + "\n" + tr("Valid: %1").arg(describeRange(p)) +
                          "\n" + tr("Default: %1").arg(QString::fromStdString(p.defaultValue)) +
                          "\n" + tr("Double-click the value to change it.");
      for (int c = 0; c < kColumns; ++c) child->setToolTip(c, tip);
      child->setFlags(Qt::ItemIsEnabled | Qt::ItemIsSelectable | Qt::ItemIsEditable);
    }
  }
  updatingUi_ = false;
  refreshParams();
  refreshSelection();
  if (tree_->topLevelItemCount() > 0) tree_->setCurrentItem(tree_->topLevelItem(0));
}

QTreeWidgetItem* MeasuresPanel::rowOf(const std::string& id) const {
  for (int r = 0; r < tree_->topLevelItemCount(); ++r) {
    QTreeWidgetItem* it = tree_->topLevelItem(r);
    if (it->data(kName, kIdRole).toString().toStdString() == id) return it;
  }
  return nullptr;
}

void MeasuresPanel::refreshParams() {
  updatingUi_ = true;
  const auto& user = doc_->session().params;
  for (const Measure* m : measures_) {
    QTreeWidgetItem* row = rowOf(m->id());
    if (!row) continue;
    row->setText(kUnit, QString::fromStdString(measureUnit(*m, user)));
    row->setToolTip(kUnit, QString::fromStdString(m->unitRule()));
    const auto specs = m->params();
    for (int c = 0; c < row->childCount(); ++c) {
      QTreeWidgetItem* child = row->child(c);
      const std::string key = child->data(kValue, kKeyRole).toString().toStdString();
      for (const auto& p : specs) {
        if (p.key != key) continue;
        const bool set = user.has(key);
        child->setText(kValue, QString::fromStdString(set ? user.text(key) : p.defaultValue));
        QFont f = child->font(kValue);
        f.setItalic(!set);  // italic: the default, not a user setting
        child->setFont(kValue, f);
      }
    }
  }
  updatingUi_ = false;
}

void MeasuresPanel::refreshSelection() {
  updatingUi_ = true;
  const auto& sel = doc_->session().selected;
  for (int r = 0; r < tree_->topLevelItemCount(); ++r) {
    QTreeWidgetItem* it = tree_->topLevelItem(r);
    if (!(it->flags() & Qt::ItemIsUserCheckable)) continue;
    const std::string id = it->data(kName, kIdRole).toString().toStdString();
    const bool on = sel.empty() || std::find(sel.begin(), sel.end(), id) != sel.end();
    it->setCheckState(kName, on ? Qt::Checked : Qt::Unchecked);
  }
  updatingUi_ = false;
}

void MeasuresPanel::markUpdating() {
  const auto& sel = doc_->session().selected;
  for (int r = 0; r < tree_->topLevelItemCount(); ++r) {
    QTreeWidgetItem* it = tree_->topLevelItem(r);
    const std::string id = it->data(kName, kIdRole).toString().toStdString();
    if (id.empty()) continue;
    if (!sel.empty() && std::find(sel.begin(), sel.end(), id) == sel.end()) {
      // Unticked: not computed (the window evaluates only the ticked measures).
      results_.erase(id);
      references_.erase(id);
      for (int c : {kValue, kChange, kTime}) it->setText(c, QString());
      it->setText(kStatus, tr("off"));
      it->setToolTip(kStatus, tr("Not computed: tick the box to compute this measure"));
      continue;
    }
    for (int c = kValue; c < kInterval; ++c) it->setForeground(c, QColor(120, 120, 120));
  }
}

void MeasuresPanel::applyUpdate(const LiveUpdate& u) {
  for (const auto& item : u.items) {
    results_[item.id] = item.result;
    references_[item.id] = item.reference;
    QTreeWidgetItem* row = rowOf(item.id);
    if (!row) continue;
    const Result& r = item.result;
    row->setText(kValue, valueText(r));
    row->setText(kChange, item.reference ? changeText(r, *item.reference) : QString("—"));
    row->setText(kStatus, statusText(r));
    row->setToolTip(kStatus, statusTooltip(r) + tr("\nComputed in %1").arg(secondsText(r.seconds)));
    row->setText(kTime, secondsText(r.seconds));
    for (int c = kValue; c < kInterval; ++c) row->setForeground(c, QBrush());
    if (r.status == Status::InvalidInput || r.status == Status::NotConverged)
      row->setForeground(kStatus, QColor(213, 94, 0));
  }
  // A measure still running says how long it may take when that is more than a second (the
  // CLI's forecast, measures/time_estimate.h), so a slow one on large clouds is not a mystery.
  const std::size_t na = doc_->session().a.size(), nb = doc_->session().b.size();
  for (const auto& id : u.pending)
    if (QTreeWidgetItem* row = rowOf(id)) {
      const auto e = estimateTime(id, na, nb, 0);
      const bool say = e && e->seconds >= 1.0;
      row->setText(kStatus, say ? tr("updating… ~%1").arg(QString::fromStdString(estimateText(e->seconds))) : tr("updating…"));
      row->setToolTip(kStatus, say ? tr("Still computing; forecast about %1 for %2 + %3 points (grows as %4)")
                                         .arg(QString::fromStdString(estimateText(e->seconds)))
                                         .arg(na)
                                         .arg(nb)
                                         .arg(QString::fromStdString(e->growth))
                                   : tr("Still computing"));
    }
  if (QTreeWidgetItem* cur = tree_->currentItem())
    showDetails(cur->data(kName, kIdRole).toString().toStdString());
}

void MeasuresPanel::changeEvent(QEvent* e) {
  QWidget::changeEvent(e);
  if (e->type() != QEvent::PaletteChange) return;
  for (int r = 0; r < tree_->topLevelItemCount(); ++r) {
    QTreeWidgetItem* item = tree_->topLevelItem(r);
    item->setIcon(kName, measureIcon(item->data(kName, kIdRole).toString().toStdString()));
  }
}

void MeasuresPanel::resizeEvent(QResizeEvent* e) {
  QWidget::resizeEvent(e);
  fitColumns();
}

void MeasuresPanel::fitColumns() {
  // The name column must hold the longest id whole (after the branch, check box and line
  // sample); below that the Time column steps aside (its value is in the Status tooltip), then
  // the change column. Time also steps aside while intervals are shown, and when the names
  // would be cut to less than "hellinger — Hell…".
  const QFontMetrics fm(font());
  int longestId = 0;
  for (const Measure* m : measures_) longestId = std::max(longestId, fm.horizontalAdvance(QString::fromStdString(m->id())));
  const int decoration = tree_->indentation() + 64;
  const int idRoom = longestId + decoration;
  const int wideRoom = fm.horizontalAdvance("hellinger — Hell…") + decoration;
  int fixed = 0;
  for (int c = kValue; c < kColumns; ++c)
    if (c != kTime && c != kChange && !(c == kInterval || c == kPValue ? !intervalsShown_ : false))
      fixed += fixedWidth(fm, c);
  const int room = tree_->viewport()->width() - fixed;
  const bool showChange = room - fixedWidth(fm, kChange) >= idRoom;
  const bool showTime = !intervalsShown_ && showChange && room - fixedWidth(fm, kChange) - fixedWidth(fm, kTime) >= wideRoom;
  tree_->setColumnHidden(kChange, !showChange);
  tree_->setColumnHidden(kTime, !showTime);
  fitNames();
}

int MeasuresPanel::nameTextWidth(QTreeWidgetItem* item) const {
  // The cell after the branch, less check box and line sample with the style's item margins
  // and the text's own (how the style lays out a view item), less 2 px to spare.
  QStyle* st = tree_->style();
  const int margin = st->pixelMetric(QStyle::PM_FocusFrameHMargin, nullptr, tree_) + 1;
  // The name column's right edge once the header has stretched it (its own width may still be
  // the old one right after a column was hidden or shown): the viewport less the other columns.
  int others = 0;
  for (int c = kValue; c < kColumns; ++c)
    if (!tree_->isColumnHidden(c)) others += tree_->header()->sectionSize(c);
  const int right = tree_->viewport()->width() - others;
  const int cell = right - tree_->visualItemRect(item).left();
  const int check = st->pixelMetric(QStyle::PM_IndicatorWidth, nullptr, tree_) + 2 * margin;
  const int icon = (tree_->iconSize().isValid() ? tree_->iconSize().width() : 16) + 2 * margin;
  return cell - check - icon - 2 * margin - 2;
}

void MeasuresPanel::fitNames() {
  // All rows in one form: "id — name" when every one fits, else ids alone (a table that
  // mixes both reads as if some rows were different in kind).
  const QFontMetrics fm(tree_->font());
  bool allFit = true;
  for (int r = 0; r < tree_->topLevelItemCount() && allFit; ++r) {
    QTreeWidgetItem* it = tree_->topLevelItem(r);
    const QString full = it->data(kName, kFullRole).toString();
    if (!full.isEmpty() && fm.horizontalAdvance(full) > nameTextWidth(it)) allFit = false;
  }
  for (int r = 0; r < tree_->topLevelItemCount(); ++r) {
    QTreeWidgetItem* it = tree_->topLevelItem(r);
    const QString full = it->data(kName, kFullRole).toString();
    if (full.isEmpty()) continue;
    const QString want = allFit ? full : it->data(kName, kIdRole).toString();
    // A relabelling is not a tick: without the guard itemChanged would re-read the check
    // boxes into the session's selection (and undo an opened session's choice).
    const bool was = updatingUi_;
    updatingUi_ = true;
    if (it->text(kName) != want) it->setText(kName, want);
    updatingUi_ = was;
  }
}

int MeasuresPanel::intervalColumn() { return kInterval; }
int MeasuresPanel::pValueColumn() { return kPValue; }

namespace {

QString three(double v) {
  if (std::isnan(v)) return QStringLiteral("—");
  if (std::isinf(v)) return v > 0 ? QStringLiteral("∞") : QStringLiteral("−∞");
  return QString::number(v, 'g', 3);
}

}  // namespace

void MeasuresPanel::setUncertainty(const SpreadResult& spread, const PermuteResult& permute) {
  uncertaintyStale_ = false;
  tree_->setColumnHidden(kInterval, false);
  tree_->setColumnHidden(kPValue, false);
  intervalsShown_ = true;
  fitColumns();
  for (int r = 0; r < tree_->topLevelItemCount(); ++r) {
    QTreeWidgetItem* it = tree_->topLevelItem(r);
    it->setText(kInterval, QString());
    it->setText(kPValue, QString());
    it->setForeground(kInterval, QBrush());
    it->setForeground(kPValue, QBrush());
  }
  const auto& sr = spread.request;
  for (const SpreadRow& row : spread.rows) {
    QTreeWidgetItem* it = rowOf(row.id);
    if (!it) continue;
    const bool ok = !std::isnan(row.low);
    it->setText(kInterval, ok ? three(row.value) + " [" + three(row.low) + ", " + three(row.high) + "]"
                              : QString::fromUtf8(statusName(row.status)));
    it->setToolTip(kInterval, tr("%1 % %2 interval from %3 resamples (seed %4); resample sd %5%6")
                                  .arg(sr.level * 100, 0, 'g', 3)
                                  .arg(QString::fromUtf8(intervalKindName(sr.interval)))
                                  .arg(sr.resamples)
                                  .arg(qulonglong(sr.seed))
                                  .arg(three(row.sd))
                                  .arg(row.message.empty() ? QString() : "\n" + QString::fromStdString(row.message)));
  }
  for (const PermuteRow& row : permute.rows) {
    QTreeWidgetItem* it = rowOf(row.id);
    if (!it) continue;
    it->setText(kPValue, std::isnan(row.pValue) ? QString::fromUtf8(statusName(row.status))
                                                : QString::number(row.pValue, 'g', 3));
    it->setToolTip(kPValue, tr("%1 permutations (seed %2): %3 scored at least the observed value; the smallest "
                               "possible p is %4")
                                .arg(permute.request.permutations)
                                .arg(qulonglong(permute.request.seed))
                                .arg(row.exceed)
                                .arg(three(1.0 / (1.0 + permute.request.permutations))));
  }
}

void MeasuresPanel::markUncertaintyStale() {
  if (uncertaintyStale_) return;
  uncertaintyStale_ = true;
  for (int r = 0; r < tree_->topLevelItemCount(); ++r) {
    QTreeWidgetItem* it = tree_->topLevelItem(r);
    for (int c : {int(kInterval), int(kPValue)}) {
      if (it->text(c).isEmpty()) continue;
      it->setForeground(c, QColor(160, 160, 160));
      it->setToolTip(c, tr("Stale: the clouds or settings changed after this was computed. Run the resampling again."));
    }
  }
}

const Result* MeasuresPanel::result(const std::string& id) const {
  auto it = results_.find(id);
  return it == results_.end() ? nullptr : &it->second;
}

QString MeasuresPanel::cellText(const std::string& id, int column) const {
  const QTreeWidgetItem* row = rowOf(id);
  return row ? row->text(column) : QString();
}

void MeasuresPanel::focusMeasure(const std::string& id) {
  if (QTreeWidgetItem* row = rowOf(id)) tree_->setCurrentItem(row);
}

void MeasuresPanel::showDetails(const std::string& id) {
  const Measure* m = nullptr;
  for (const Measure* x : measures_)
    if (x->id() == id) m = x;
  if (!m) {
    details_->clear();
    return;
  }
  auto it = results_.find(id);
  details_->setHtml(detailsHtml(*m, it == results_.end() ? nullptr : &it->second));
}

std::string MeasuresPanel::toCsv() const {
  std::ostringstream o;
  o << "id,name,value,unit,change,status,seconds\n";
  for (const Measure* m : measures_) {
    auto it = results_.find(m->id());
    if (it == results_.end()) continue;
    const Result& r = it->second;
    const auto ref = references_.find(m->id());
    o << m->id() << ",\"" << m->displayName() << "\"," << csvNumber(r) << ',' << measureUnit(*m, doc_->session().params)
      << ',';
    if (ref != references_.end() && ref->second && r.usable() && ref->second->usable())
      o << csvDifference(r.value, ref->second->value);
    o << ',' << statusName(r.status) << ',' << r.seconds << '\n';
  }
  return o.str();
}

}  // namespace barrow::ui
