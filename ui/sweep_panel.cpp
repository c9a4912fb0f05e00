#include "sweep_panel.h"

#include <QCheckBox>
#include <QComboBox>
#include <QDoubleSpinBox>
#include <QHBoxLayout>
#include <QLabel>
#include <QProgressBar>
#include <QPushButton>
#include <QSpinBox>
#include <QVBoxLayout>
#include <algorithm>
#include <cmath>
#include <sstream>

#include "families/family_spec.h"
#include "io/findings_json.h"
#include "io/sweep_csv.h"
#include "measures/registry.h"
#include "sweep/sweep_merge.h"
#include "sweep_plots.h"

namespace barrow::ui {

namespace {

QDoubleSpinBox* number(QWidget* parent, double lo, double hi, int decimals, const QString& tip) {
  auto* s = new QDoubleSpinBox(parent);
  s->setRange(lo, hi);
  s->setDecimals(decimals);
  s->setKeyboardTracking(false);
  s->setToolTip(tip);
  s->setMaximumWidth(80);
  return s;
}

QWidget* row(QWidget* parent, std::initializer_list<QWidget*> widgets) {
  auto* w = new QWidget(parent);
  auto* l = new QHBoxLayout(w);
  l->setContentsMargins(0, 0, 0, 0);
  l->setSpacing(4);
  for (QWidget* x : widgets) l->addWidget(x);
  return w;
}

}  // namespace

QString SweepPanel::thetaLabel(const SweepSettings& s) {
  const FamilySpec& f = familySpec(s.family);
  QString label = tr("θ: %1").arg(QString::fromUtf8(f.label));
  if (f.usesDirection) label += QString(" (%1, %2)").arg(s.direction[0], 0, 'g', 3).arg(s.direction[1], 0, 'g', 3);
  return label + QString(" [%1]").arg(QString::fromUtf8(f.thetaUnit));
}

SweepPanel::SweepPanel(SessionDocument* doc, QWidget* parent)
    : QWidget(parent), doc_(doc), plots_(new SweepPlots(this)) {
  family_ = new QComboBox(this);
  for (const auto& f : familyNames()) family_->addItem(QString::fromStdString(f));
  family_->setToolTip(tr("How A moves along the sweep (B stays fixed)"));
  dirX_ = number(this, -1e6, 1e6, 3, tr("Shift direction, x component (normalised at use)"));
  dirY_ = number(this, -1e6, 1e6, 3, tr("Shift direction, y component (normalised at use)"));
  autoCenter_ = new QCheckBox(tr("centroid"), this);
  autoCenter_->setToolTip(tr("Rotate or scale about A's weighted centroid; untick to give a pivot"));
  centerX_ = number(this, -1e6, 1e6, 3, tr("Pivot x"));
  centerY_ = number(this, -1e6, 1e6, 3, tr("Pivot y"));
  from_ = number(this, -1e6, 1e6, 3, tr("First θ of the sweep"));
  to_ = number(this, -1e6, 1e6, 3, tr("Last θ of the sweep"));
  steps_ = new QSpinBox(this);
  steps_->setRange(2, 100001);
  steps_->setKeyboardTracking(false);
  steps_->setToolTip(tr("Number of θ values (refinement near jumps adds more)"));
  resamples_ = new QSpinBox(this);
  resamples_->setObjectName("sweepResamples");
  resamples_->setRange(0, 2000);
  resamples_->setSingleStep(50);
  resamples_->setSpecialValueText(tr("none"));
  resamples_->setToolTip(tr("Resampling bands: this many bootstrap resamples of both clouds at every θ give a "
                            "95 % band around each curve (0 = none). Shows whether a jump is larger than the "
                            "sample-to-sample variation; costs that many sweeps."));
  reference_ = number(this, -1e6, 1e6, 3,
                      tr("Reference θ₀: data-dependent settings (bandwidths, grids) are frozen here, "
                         "and the Measures table shows changes from the values at θ₀"));
  normalise_ = new QCheckBox(tr("Normalise to [0, 1]"), this);
  normalise_->setChecked(true);
  normalise_->setToolTip(tr("Map each curve to [0, 1] so that measures of different scales share one axis"));
  runButton_ = new QPushButton(tr("Run sweep"), this);
  runButton_->setToolTip(tr("Evaluate every ticked measure along the θ range (Ctrl+R)"));
  cancelButton_ = new QPushButton(tr("Cancel"), this);
  cancelButton_->setToolTip(tr("Stop the running sweep"));
  cancelButton_->setEnabled(false);
  progress_ = new QProgressBar(this);
  progress_->setRange(0, 1000);
  progress_->setTextVisible(false);
  progress_->setMaximumWidth(120);
  progress_->setToolTip(tr("Progress of the current pass"));
  progress_->setVisible(false);
  status_ = new QLabel(this);
  status_->setToolTip(tr("Outcome of the last sweep"));

  shiftBox_ = row(this, {new QLabel(tr("direction"), this), dirX_, dirY_});
  centerBox_ = row(this, {new QLabel(tr("pivot"), this), autoCenter_, centerX_, centerY_});
  // Two short rows rather than one long one, so the panel can be narrow.
  auto* familyRow = new QHBoxLayout();
  familyRow->setSpacing(6);
  familyRow->addWidget(new QLabel(tr("Family"), this));
  familyRow->addWidget(family_);
  familyRow->addWidget(shiftBox_);
  familyRow->addWidget(centerBox_);
  familyRow->addStretch(1);
  familyRow->addWidget(normalise_);
  auto* rangeRow = new QHBoxLayout();
  rangeRow->setSpacing(6);
  rangeRow->addWidget(new QLabel(tr("θ from"), this));
  rangeRow->addWidget(from_);
  rangeRow->addWidget(new QLabel(tr("to"), this));
  rangeRow->addWidget(to_);
  rangeRow->addWidget(new QLabel(tr("steps"), this));
  rangeRow->addWidget(steps_);
  rangeRow->addWidget(new QLabel(tr("θ₀"), this));
  rangeRow->addWidget(reference_);
  rangeRow->addWidget(new QLabel(tr("bands"), this));
  rangeRow->addWidget(resamples_);
  rangeRow->addStretch(1);
  auto* actions = new QHBoxLayout();
  actions->addWidget(runButton_);
  actions->addWidget(cancelButton_);
  actions->addWidget(progress_);
  actions->addWidget(status_, 1);
  status_->setSizePolicy(QSizePolicy::Ignored, QSizePolicy::Preferred);
  auto* top = new QHBoxLayout();
  auto* settings = new QVBoxLayout();
  settings->setSpacing(2);
  settings->addLayout(familyRow);
  settings->addLayout(rangeRow);
  top->addLayout(settings, 1);
  auto* layout = new QVBoxLayout(this);
  layout->setContentsMargins(4, 2, 4, 2);
  layout->setSpacing(2);
  layout->addLayout(top);
  layout->addLayout(actions);
  layout->addWidget(plots_, 1);

  connect(family_, &QComboBox::currentTextChanged, this, [this](const QString& f) {
    if (loading_) return;
    // A new family gets its natural range unless the current one still fits it.
    SweepSettings s = doc_->session().sweep;
    const FamilySpec* spec = findFamily(f.toStdString());
    if (!spec) return;
    s.family = spec->family;
    const double lo = spec->from, hi = spec->to;
    if (s.validate()) {
      s.from = lo;
      s.to = hi;
    }
    s.reference.reset();  // the new family's identity (SweepSettings::referenceTheta)
    doc_->setSweep(s, tr("Sweep family: %1").arg(f));
  });
  for (QDoubleSpinBox* s : {dirX_, dirY_, centerX_, centerY_, from_, to_, reference_})
    connect(s, &QDoubleSpinBox::editingFinished, this, &SweepPanel::commit);
  connect(steps_, &QSpinBox::editingFinished, this, &SweepPanel::commit);
  connect(autoCenter_, &QCheckBox::toggled, this, [this] {
    updateFamilyControls();
    commit();
  });
  connect(normalise_, &QCheckBox::toggled, plots_, &SweepPlots::setNormalised);
  connect(runButton_, &QPushButton::clicked, this, &SweepPanel::run);
  connect(cancelButton_, &QPushButton::clicked, this, &SweepPanel::cancel);
  connect(&runner_, &SweepRunner::progress, this, [this](double f) { progress_->setValue(int(f * 1000)); });
  connect(&runner_, &SweepRunner::finished, this, [this](const SweepOutcome& o) {
    if (!o.error.empty()) {
      error_ = o.error;
      queue_.clear();
      previousParts_.clear();
      plots_->clear(tr("The sweep failed: %1").arg(QString::fromStdString(o.error)));
      status_->setText(tr("Sweep failed: %1").arg(QString::fromStdString(o.error)));
      emit message(status_->text());
      setActive(false);
      emit outcomeReady();
      return;
    }
    if (o.result.cancelled) {
      cancelled_ = true;
      queue_.clear();
      if (parts_.empty() && !previousParts_.empty()) {
        // Nothing of this run finished: the previous curves come back, judged against the
        // session as it is now (stale if it changed since they were computed).
        parts_ = std::move(previousParts_);
        runRevision_ = previousRevision_;
        hasRun_ = previousHasRun_;
        plots_->setResult(partResults(), findings());
        status_->setText(tr("Cancelled: the curves shown are from the previous sweep."));
      } else if (parts_.empty()) {
        plots_->clear(tr("The sweep was cancelled before a pass finished."));
        status_->setText(tr("Cancelled before a pass finished."));
      } else {
        status_->setText(tr("Cancelled: the curves shown are from the passes that finished."));
      }
      previousParts_.clear();
      updateStale();
      setActive(false);
      emit outcomeReady();
      return;
    }
    parts_.push_back(o);
    previousParts_.clear();
    plots_->setResult(partResults(), findings());
    updateStale();
    double seconds = 0;
    std::size_t series = 0, thetas = 0;
    for (const auto& p : parts_) {
      seconds += p.result.seconds;
      series += p.result.series.size();
      thetas = std::max(thetas, p.result.theta.size());
    }
    status_->setText(tr("%1 θ values × %2 measures in %3 s").arg(thetas).arg(series).arg(seconds, 0, 'f', 2));
    emit outcomeReady();
    startNextPass();
  });
  connect(plots_, &SweepPlots::thetaChanged, this, &SweepPanel::thetaChanged);
  connect(doc_, &SessionDocument::sweepChanged, this, &SweepPanel::loadFromSession);
  // Every change of the session, a drag's preview included, gets a new revision; the curves
  // are current while the document is at the revision they were computed at.
  connect(doc_, &SessionDocument::revisionChanged, this, &SweepPanel::updateStale);
  loadFromSession();
}

bool SweepPanel::resultsCurrent() const {
  if (!hasRun_) return true;  // nothing shown yet, nothing out of date
  return doc_->isCurrent(runRevision_);
}

std::vector<SweepResult> SweepPanel::partResults() const {
  std::vector<SweepResult> r;
  for (const auto& p : parts_) r.push_back(p.result);
  return r;
}

void SweepPanel::updateStale() {
  // While a run has brought nothing yet, the previous curves are the ones on screen.
  const bool showingPrevious = parts_.empty() && !previousParts_.empty();
  const bool stale = showingPrevious ? !doc_->isCurrent(previousRevision_) : !resultsCurrent();
  plots_->setStale(stale);
  if (stale != stale_) {
    stale_ = stale;
    emit staleChanged(stale);
  }
}

void SweepPanel::loadFromSession() {
  loading_ = true;
  const SweepSettings& s = doc_->session().sweep;
  family_->setCurrentText(QString::fromUtf8(familySpec(s.family).name));
  dirX_->setValue(s.direction[0]);
  dirY_->setValue(s.direction[1]);
  autoCenter_->setChecked(!s.center.has_value());
  if (s.center) {
    centerX_->setValue((*s.center)[0]);
    centerY_->setValue((*s.center)[1]);
  }
  from_->setValue(s.from);
  to_->setValue(s.to);
  steps_->setValue(s.steps);
  reference_->setValue(s.referenceTheta());
  updateFamilyControls();
  plots_->setAxisLabel(thetaLabel(s));
  plots_->setRange(s.from, s.to);
  plots_->setReference(s.referenceTheta());
  loading_ = false;
}

void SweepPanel::updateFamilyControls() {
  const FamilySpec* f = findFamily(family_->currentText().toStdString());
  shiftBox_->setVisible(f && f->usesDirection);
  centerBox_->setVisible(f && f->usesCenter);
  centerX_->setEnabled(!autoCenter_->isChecked());
  centerY_->setEnabled(!autoCenter_->isChecked());
}

void SweepPanel::commit() {
  if (loading_) return;
  SweepSettings s = doc_->session().sweep;
  if (const FamilySpec* f = findFamily(family_->currentText().toStdString())) s.family = f->family;
  s.direction = {dirX_->value(), dirY_->value()};
  if (autoCenter_->isChecked()) s.center.reset();
  else s.center = std::array<double, 2>{centerX_->value(), centerY_->value()};
  s.from = from_->value();
  s.to = to_->value();
  s.steps = steps_->value();
  // The family's identity is the default θ₀ (as in barrow-cli): only another value is kept.
  if (reference_->value() == identityTheta(s.family)) s.reference.reset();
  else s.reference = reference_->value();
  if (auto e = s.validate()) {
    emit message(tr("Sweep settings not changed: %1").arg(QString::fromStdString(*e)));
    loadFromSession();  // show what is in force
    return;
  }
  doc_->setSweep(s);
}

std::vector<std::string> SweepPanel::measureIds() const {
  const auto& sel = doc_->session().selected;
  if (!sel.empty()) return sel;
  std::vector<std::string> all;
  for (const Measure* m : MeasureRegistry::instance().defaults()) all.push_back(m->id());
  return all;
}

void SweepPanel::run() {
  SweepSettings s = doc_->session().sweep;
  s.measures = measureIds();
  if (auto e = s.validate()) {
    status_->setText(tr("Cannot sweep: %1").arg(QString::fromStdString(*e)));
    return;
  }
  std::vector<std::string> cheap, slow;
  for (const auto& id : s.measures) {
    const Measure* m = MeasureRegistry::instance().find(id);
    (m && !m->cheap() ? slow : cheap).push_back(id);
  }
  queue_.clear();
  if (!cheap.empty()) queue_.push_back(cheap);
  if (!slow.empty()) queue_.push_back(slow);
  runSettings_ = s;
  runA_ = doc_->session().a;
  runB_ = doc_->session().b;
  runParams_ = doc_->session().params;
  // The curves on screen stay (greyed if out of date) until the first pass brings new ones.
  if (!parts_.empty()) {
    previousParts_ = std::move(parts_);
    previousRevision_ = runRevision_;
    previousHasRun_ = hasRun_;
  }
  parts_.clear();
  runRevision_ = doc_->revision();
  hasRun_ = true;
  error_.clear();
  cancelled_ = false;
  updateStale();
  setActive(true);
  startNextPass();
}

void SweepPanel::startNextPass() {
  if (queue_.empty()) {
    setActive(false);
    return;
  }
  SweepSettings s = runSettings_;
  s.measures = queue_.front();
  queue_.erase(queue_.begin());
  QStringList names;
  for (const auto& id : s.measures) names << QString::fromStdString(id);
  status_->setText(parts_.empty() ? tr("Sweeping %1…").arg(names.join(", "))
                                  : tr("%1 — now the slow measures: %2…").arg(status_->text(), names.join(", ")));
  progress_->setValue(0);
  runner_.start(runA_, runB_, s, runParams_, resamples_->value());
}

void SweepPanel::setActive(bool on) {
  if (on == active_) return;
  active_ = on;
  cancelButton_->setEnabled(on);
  runButton_->setText(on ? tr("Restart sweep") : tr("Run sweep"));
  progress_->setVisible(on);
  emit runningChanged(on);
}

void SweepPanel::setNormalised(bool on) { normalise_->setChecked(on); }

void SweepPanel::cancel() {
  queue_.clear();
  runner_.cancel();
}

bool SweepPanel::running() const { return active_; }

std::vector<Finding> SweepPanel::findings() const {
  std::vector<Finding> all;
  for (const auto& p : parts_) all.insert(all.end(), p.findings.begin(), p.findings.end());
  // In the registry's order, whichever pass they came from.
  const auto& reg = MeasureRegistry::instance();
  std::stable_sort(all.begin(), all.end(),
                   [&](const Finding& x, const Finding& y) { return reg.rank(x.id) < reg.rank(y.id); });
  return all;
}

std::string SweepPanel::toCsv() const {
  const std::vector<SweepResult> results = partResults();
  if (results.empty()) return {};
  return formatSweepCsv(mergeSweeps(results));
}

std::string SweepPanel::findingsJson() const {
  if (parts_.empty()) return {};
  return formatFindingsJson(findings());
}

}  // namespace barrow::ui
