#include "uncertainty_pane.h"

#include <QScrollArea>

#include <QHBoxLayout>
#include <QLabel>
#include <QProgressBar>
#include <QPushButton>
#include <QVBoxLayout>

#include "measures/registry.h"
#include "measures_panel.h"
#include "size_plot.h"

namespace barrow::ui {

UncertaintyPane::UncertaintyPane(SessionDocument* doc, MeasuresPanel* table, QWidget* parent)
    : QWidget(parent), doc_(doc), table_(table), runner_(new UncertaintyRunner(this)), sizes_(new SizePlot(this)),
      runButton_(new QPushButton(tr("Intervals and p-values"), this)), cancelButton_(new QPushButton(tr("Cancel"), this)),
      progress_(new QProgressBar(this)), status_(new QLabel(this)) {
  runButton_->setObjectName("uncertaintyRun");
  cancelButton_->setObjectName("uncertaintyCancel");
  progress_->setObjectName("uncertaintyProgress");
  status_->setObjectName("uncertaintyStatus");
  runButton_->setToolTip(tr("200 bootstrap resamples of both clouds (intervals), 199 permutations (p-values) and "
                            "subsamples of 25…n points (value versus size), for every measure but the entropic "
                            "ones; settings fixed once on the clouds as drawn"));
  cancelButton_->setToolTip(tr("Stop the resampling; the values already shown stay as they are"));
  cancelButton_->setEnabled(false);
  progress_->setRange(0, 1000);
  progress_->setTextVisible(false);
  progress_->setMaximumWidth(140);
  progress_->setVisible(false);
  status_->setWordWrap(true);
  status_->setText(tr("How sure is each value? Resample the clouds to see."));
  auto* row = new QHBoxLayout;
  row->addWidget(runButton_);
  row->addWidget(cancelButton_);
  row->addWidget(progress_);
  row->addStretch(1);
  // In a scroll area: in a short dock (a 700-pixel-high window) the plot keeps its minimum
  // height and the pane scrolls, instead of the caption being drawn over the plot.
  auto* inner = new QWidget;
  auto* layout = new QVBoxLayout(inner);
  layout->setContentsMargins(2, 2, 2, 2);
  layout->addLayout(row);
  layout->addWidget(status_);
  layout->addWidget(sizes_, 1);
  auto* scroll = new QScrollArea(this);
  scroll->setWidgetResizable(true);
  scroll->setFrameShape(QFrame::NoFrame);
  scroll->setWidget(inner);
  auto* outer = new QVBoxLayout(this);
  outer->setContentsMargins(0, 0, 0, 0);
  outer->addWidget(scroll);

  connect(runButton_, &QPushButton::clicked, this, &UncertaintyPane::run);
  connect(cancelButton_, &QPushButton::clicked, this, &UncertaintyPane::cancel);
  connect(runner_, &UncertaintyRunner::progress, this, [this](double f) { progress_->setValue(int(f * 1000)); });
  connect(runner_, &UncertaintyRunner::runningChanged, this, [this](bool on) {
    cancelButton_->setEnabled(on);
    progress_->setVisible(on);
    emit runningChanged(on);
  });
  connect(runner_, &UncertaintyRunner::finished, this, [this](const UncertaintyOutcome& o) {
    if (o.cancelled) {
      status_->setText(tr("Cancelled; the numbers shown (if any) are from the previous run."));
      emit finished();
      return;
    }
    outcome_ = o;
    stale_ = false;
    table_->setUncertainty(o.spread, o.permute);
    focusMeasure(focus_);
    status_->setText(tr("%1 resamples, %2 permutations, seed %3. Intervals show sample-to-sample variation, not "
                        "the estimator's bias: the plot below shows how the value moves with n.")
                         .arg(o.spread.request.resamples)
                         .arg(o.permute.request.permutations)
                         .arg(qulonglong(o.spread.request.seed)));
    // The clouds changed while this ran: it describes the old ones.
    if (runGeneration_ != generation_) markStale();
    emit finished();
  });
  auto changed = [this] {
    ++generation_;
    if (outcome_) markStale();
  };
  connect(doc_, &SessionDocument::cloudsChanged, this, [this, changed] {
    if (!doc_->previewing()) changed();
  });
  connect(doc_, &SessionDocument::paramsChanged, this, changed);
}

std::vector<const Measure*> UncertaintyPane::runMeasures() {
  std::vector<const Measure*> out;
  for (const Measure* m : MeasureRegistry::instance().defaults())
    if (m->id() != "entropic" && m->id() != "sinkhorn") out.push_back(m);
  return out;
}

void UncertaintyPane::run() {
  const Session& s = doc_->session();
  if (auto e = s.a.validate()) return status_->setText(tr("Cannot resample: A: %1").arg(QString::fromStdString(*e)));
  if (auto e = s.b.validate()) return status_->setText(tr("Cannot resample: B: %1").arg(QString::fromStdString(*e)));
  UncertaintyRequest req;
  req.a = s.a;
  req.b = s.b;
  req.params = s.params;
  req.measures = runMeasures();
  runGeneration_ = generation_;
  progress_->setValue(0);
  status_->setText(tr("Resampling %1 + %2 points…").arg(s.a.size()).arg(s.b.size()));
  runner_->start(std::move(req));
}

void UncertaintyPane::cancel() { runner_->cancel(); }

void UncertaintyPane::focusMeasure(const std::string& id) {
  focus_ = id;
  if (!outcome_ || !outcome_->sizes) return;
  sizes_->setResult(*outcome_->sizes, id.empty() ? outcome_->sizes->rows.front().id : id);
  sizes_->setStale(stale_);
}

void UncertaintyPane::markStale() {
  stale_ = true;
  table_->markUncertaintyStale();
  sizes_->setStale(true);
  status_->setText(tr("Stale: the clouds or settings changed after the last run (greyed). Run it again for "
                      "current numbers."));
}

QString UncertaintyPane::statusText() const { return status_->text(); }

}  // namespace barrow::ui
