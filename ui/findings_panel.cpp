#include "findings_panel.h"

#include <QEvent>
#include <QHeaderView>
#include <QLabel>
#include <QTableWidget>
#include <QTimer>
#include <QVBoxLayout>

#include "measure_style.h"
#include "palette.h"
#include "measures/registry.h"
#include "session_document.h"

namespace barrow::ui {

FindingsPanel::FindingsPanel(SessionDocument* doc, QWidget* parent)
    : QWidget(parent), doc_(doc), table_(new QTableWidget(this)), notice_(new QLabel(this)) {
  auto* layout = new QVBoxLayout(this);
  layout->setContentsMargins(2, 2, 2, 2);
  layout->setSpacing(2);
  notice_->setObjectName("findingsStaleNotice");
  notice_->setWordWrap(true);
  notice_->setText(tr("Out of date: the clouds or settings changed since this sweep. Run it again (Ctrl+R) "
                      "for findings that match."));
  notice_->setToolTip(tr("The verdicts below were found for the session as it was when the sweep ran"));
  notice_->setStyleSheet("QLabel { background: #fff1d6; color: #6b3a00; padding: 3px; border-radius: 3px; }");
  notice_->setVisible(false);
  layout->addWidget(notice_);
  layout->addWidget(table_);
  table_->setObjectName("findingsTable");
  table_->setColumnCount(3);
  table_->setHorizontalHeaderLabels({tr("Measure"), tr("Verdict"), tr("In words")});
  table_->horizontalHeaderItem(0)->setToolTip(tr("Click a row to highlight the measure on the plots and in the table"));
  table_->horizontalHeaderItem(1)->setToolTip(tr("continuous, the number of jumps found (confirmed by refinement), or unresolved "
                                                 "(a steep step the refinement budget could not settle); "
                                                 "flat: stretches with no gradient"));
  table_->horizontalHeaderItem(2)->setToolTip(tr("The finding in plain words, with the Lipschitz estimate"));
  table_->verticalHeader()->setVisible(false);
  table_->setSelectionBehavior(QAbstractItemView::SelectRows);
  table_->setSelectionMode(QAbstractItemView::SingleSelection);
  table_->setEditTriggers(QAbstractItemView::NoEditTriggers);
  table_->setWordWrap(true);
  table_->horizontalHeader()->setSectionResizeMode(0, QHeaderView::ResizeToContents);
  table_->horizontalHeader()->setSectionResizeMode(1, QHeaderView::Interactive);
  table_->horizontalHeader()->resizeSection(1, QFontMetrics(font()).horizontalAdvance("12 jumps, flat  "));
  table_->horizontalHeader()->setSectionResizeMode(2, QHeaderView::Stretch);
  connect(table_, &QTableWidget::itemSelectionChanged, this, [this] {
    const auto rows = table_->selectionModel()->selectedRows();
    if (rows.isEmpty()) {
      emit measureFocused(QString());
      return;
    }
    emit measureFocused(table_->item(rows.first().row(), 0)->data(Qt::UserRole).toString());
  });
  // Wrapped rows keep their whole text when the pane is narrowed or widened.
  connect(table_->horizontalHeader(), &QHeaderView::sectionResized, table_, &QTableWidget::resizeRowsToContents);
  connect(doc_, &SessionDocument::revisionChanged, this, &FindingsPanel::updateStale);
  clear(tr("Findings appear here after a sweep."));
}

void FindingsPanel::clear(const QString& hint) {
  hasFindings_ = false;
  stale_ = false;
  notice_->setVisible(false);
  table_->clearContents();
  table_->setRowCount(hint.isEmpty() ? 0 : 1);
  if (!hint.isEmpty()) {
    auto* item = new QTableWidgetItem(hint);
    item->setFlags(Qt::ItemIsEnabled);
    table_->setItem(0, 2, item);
  }
  table_->resizeRowsToContents();
}

void FindingsPanel::setFindings(const std::vector<Finding>& findings, quint64 revision) {
  const QSignalBlocker block(table_);
  table_->clearContents();
  table_->setRowCount(int(findings.size()));
  for (int r = 0; r < int(findings.size()); ++r) {
    const Finding& f = findings[std::size_t(r)];
    const Measure* m = MeasureRegistry::instance().find(f.id);
    auto* name = new QTableWidgetItem(QString::fromStdString(f.id));
    name->setData(Qt::UserRole, QString::fromStdString(f.id));
    name->setIcon(measureIcon(f.id));
    if (m) name->setToolTip(QString::fromStdString(m->displayName()));
    QString verdict = f.infiniteEverywhere   ? tr("+∞ throughout")
                      : !f.jumps.empty()       ? tr("%n jump(s)", "", int(f.jumps.size()))
                      : !f.unresolved.empty() ? tr("unresolved")
                                              : tr("continuous");
    if (!f.jumps.empty() && !f.unresolved.empty()) verdict += tr(", unresolved");
    if (!f.flat.empty() && !f.infiniteEverywhere) verdict += tr(", flat");
    auto* v = new QTableWidgetItem(verdict);
    const bool good = f.continuous && f.flat.empty();
    v->setData(Qt::UserRole + 3, good);
    v->setForeground(good ? palette::goodText() : palette::warnText());
    v->setData(Qt::UserRole + 2, v->foreground());
    v->setToolTip(tr("Lipschitz estimate %1").arg(f.lipschitz, 0, 'g', 3));
    auto* words = new QTableWidgetItem(QString::fromStdString(f.summary));
    words->setToolTip(QString::fromStdString(f.summary));
    table_->setItem(r, 0, name);
    table_->setItem(r, 1, v);
    table_->setItem(r, 2, words);
  }
  table_->resizeRowsToContents();
  hasFindings_ = true;
  revision_ = revision;
  stale_ = false;
  notice_->setVisible(false);
  updateStale();
}

void FindingsPanel::changeEvent(QEvent* e) {
  QWidget::changeEvent(e);
  if (e->type() != QEvent::PaletteChange) return;
  for (int r = 0; r < table_->rowCount(); ++r) {
    QTableWidgetItem* name = table_->item(r, 0);
    QTableWidgetItem* verdict = table_->item(r, 1);
    if (!name || !verdict) continue;
    name->setIcon(measureIcon(name->data(Qt::UserRole).toString().toStdString()));
    const QBrush colour(verdict->data(Qt::UserRole + 3).toBool() ? palette::goodText() : palette::warnText());
    verdict->setData(Qt::UserRole + 2, colour);
    if (!stale_) verdict->setForeground(colour);
  }
}

void FindingsPanel::updateStale() {
  const bool stale = hasFindings_ && !doc_->isCurrent(revision_);
  if (stale == stale_) return;
  stale_ = stale;
  notice_->setVisible(stale);
  // Greyed, with the reason in every row's tooltip: these verdicts belong to other clouds.
  for (int r = 0; r < table_->rowCount(); ++r)
    for (int c = 0; c < table_->columnCount(); ++c)
      if (QTableWidgetItem* item = table_->item(r, c)) {
        item->setData(Qt::UserRole + 1, stale);
        QFont f = item->font();
        f.setItalic(stale);
        item->setFont(f);
        // Back to the row's own colour (the verdict's, else the table's) when current again.
        if (stale) item->setForeground(QColor(130, 130, 130));
        else item->setData(Qt::ForegroundRole, item->data(Qt::UserRole + 2));
        if (c == 2)
          item->setToolTip(stale ? tr("Out of date: the clouds or settings changed since this sweep. ") + item->text()
                                 : item->text());
      }
}

// The words' column stretches with the pane; its rows follow once the table has its new width.
void FindingsPanel::resizeEvent(QResizeEvent* e) {
  QWidget::resizeEvent(e);
  QTimer::singleShot(0, table_, &QTableWidget::resizeRowsToContents);
}

void FindingsPanel::selectMeasure(const std::string& id) {
  const QSignalBlocker block(table_);
  for (int r = 0; r < table_->rowCount(); ++r) {
    QTableWidgetItem* it = table_->item(r, 0);
    if (it && it->data(Qt::UserRole).toString().toStdString() == id) {
      table_->selectRow(r);
      table_->scrollToItem(it);
      return;
    }
  }
  table_->clearSelection();
}

}  // namespace barrow::ui
