#include "field_panel.h"

#include <QButtonGroup>
#include <QCheckBox>
#include <QComboBox>
#include <QDoubleSpinBox>
#include <QHBoxLayout>
#include <QInputDialog>
#include <QLabel>
#include <QSettings>
#include <QSlider>
#include <QSpinBox>
#include <QToolBar>
#include <QToolButton>
#include <QVBoxLayout>

#include "field_view.h"
#include "generator_dialog.h"
#include "measures/evaluate.h"
#include "measures/registry.h"
#include "potential_map.h"

namespace barrow::ui {

namespace {

QToolButton* toolButton(QWidget* parent, const QString& text, const QString& tip, const QKeySequence& key) {
  auto* b = new QToolButton(parent);
  b->setText(text);
  b->setCheckable(true);
  b->setShortcut(key);
  b->setToolTip(QString("%1 (%2)").arg(tip, key.toString(QKeySequence::NativeText)));
  b->setAutoRaise(true);
  return b;
}

}  // namespace

FieldPanel::FieldPanel(SessionDocument* doc, QWidget* parent)
    : QWidget(parent), doc_(doc), view_(new FieldView(this)) {
  editor_ = new FieldEditor(view_, doc_, this);
  auto* layout = new QVBoxLayout(this);
  layout->setContentsMargins(0, 0, 0, 0);
  layout->setSpacing(2);
  layout->addWidget(buildToolRow());
  layout->addWidget(buildOverlayRow());
  layout->addWidget(view_, 1);
  connect(editor_, &FieldEditor::message, this, &FieldPanel::message);
  showSessionClouds();
}

QWidget* FieldPanel::buildToolRow() {
  auto* w = new QToolBar(this);  // overflowing controls fold into its » menu
  w->setIconSize(QSize(16, 16));
  auto* l = w;
  auto* group = new QButtonGroup(w);
  tools_[0] = toolButton(w, tr("Select"), tr("Select points (click, or drag a box) and drag them to move; Shift adds to the selection"), QKeySequence("S"));
  tools_[1] = toolButton(w, tr("Add"), tr("Click to add one point to the target cloud"), QKeySequence("N"));
  tools_[2] = toolButton(w, tr("Spray"), tr("Press and move to spray points into the target cloud"), QKeySequence("B"));
  tools_[3] = toolButton(w, tr("Pan"), tr("Drag to move the view; the wheel zooms in any tool"), QKeySequence("H"));
  for (int k = 0; k < 4; ++k) {
    group->addButton(tools_[k], k);
    l->addWidget(tools_[k]);
  }
  tools_[0]->setChecked(true);
  connect(group, &QButtonGroup::idClicked, this, [this](int id) { editor_->setTool(FieldTool(id)); });

  target_ = new QComboBox(w);
  target_->addItems({tr("into A"), tr("into B")});
  target_->setToolTip(tr("The cloud that Add, Spray and Generate put points into"));
  target_->setObjectName("fieldTarget");
  tools_[1]->setObjectName("addTool");
  tools_[2]->setObjectName("sprayTool");
  // The tooltips of Add and Spray name the cloud the target box has chosen.
  auto retarget = [this](int i) {
    const QString side = i == 0 ? "A" : "B";
    editor_->setTarget(i == 0 ? Which::A : Which::B);
    tools_[1]->setToolTip(tr("Click to add one point to cloud %1 (N); the box beside chooses the cloud").arg(side));
    tools_[2]->setToolTip(tr("Press and move to spray points into cloud %1 (B); the box beside chooses the cloud").arg(side));
  };
  connect(target_, &QComboBox::currentIndexChanged, this, retarget);
  retarget(target_->currentIndex());
  radius_ = new QDoubleSpinBox(w);
  radius_->setRange(0.001, 1e4);
  radius_->setDecimals(3);
  radius_->setValue(editor_->brushRadius());
  radius_->setPrefix(tr("r "));
  radius_->setToolTip(tr("Spray brush radius (cloud units)"));
  perDab_ = new QSpinBox(w);
  perDab_->setRange(1, 500);
  perDab_->setValue(editor_->brushCount());
  perDab_->setSuffix(tr(" pts"));
  perDab_->setToolTip(tr("Spray density: points added per dab (a dab every few pixels or 70 ms)"));
  // The brush is a habit of the user, not part of a session: kept in the settings.
  QSettings settings;
  radius_->setValue(settings.value("field/brushRadius", radius_->value()).toDouble());
  perDab_->setValue(settings.value("field/brushCount", perDab_->value()).toInt());
  editor_->setBrush(radius_->value(), perDab_->value());
  auto brush = [this] {
    editor_->setBrush(radius_->value(), perDab_->value());
    QSettings().setValue("field/brushRadius", radius_->value());
    QSettings().setValue("field/brushCount", perDab_->value());
  };
  connect(radius_, &QDoubleSpinBox::valueChanged, this, brush);
  connect(perDab_, &QSpinBox::valueChanged, this, brush);
  l->addWidget(target_);
  l->addWidget(radius_);
  l->addWidget(perDab_);
  l->addSeparator();

  auto* gen = new QToolButton(w);
  gen->setText(tr("Generate…"));
  gen->setToolTip(tr("Make a cloud of a common shape (Gaussian, mixture, ring, segment, square, arcs) with a seed"));
  connect(gen, &QToolButton::clicked, this, &FieldPanel::openGenerator);
  auto* weight = new QToolButton(w);
  weight->setText(tr("Weight…"));
  weight->setToolTip(tr("Set the weight (mass) of the selected points"));
  connect(weight, &QToolButton::clicked, this, &FieldPanel::askSelectionWeight);
  auto* del = new QToolButton(w);
  del->setText(tr("Delete"));
  del->setToolTip(tr("Delete the selected points (Del)"));
  connect(del, &QToolButton::clicked, this, [this] { editor_->deleteSelection(); });
  auto* fit = new QToolButton(w);
  fit->setText(tr("Fit"));
  fit->setToolTip(tr("Fit the view to both clouds (F)"));
  fit->setShortcut(QKeySequence("F"));
  connect(fit, &QToolButton::clicked, view_, &FieldView::fitToData);
  for (auto* b : {gen, weight, del, fit}) {
    b->setAutoRaise(true);
    l->addWidget(b);
  }
  return w;
}

QWidget* FieldPanel::buildOverlayRow() {
  auto* w = new QToolBar(this);  // overflowing controls fold into its » menu
  w->setIconSize(QSize(16, 16));
  auto* l = w;
  plan_ = new QCheckBox(tr("Plan"), w);
  plan_->setChecked(true);
  plan_->setToolTip(tr("Draw the exact transport plan: one segment per (i, j) with mass, opacity following the mass"));
  planCost_ = new QComboBox(w);
  planCost_->addItem(tr("W2 (‖x−y‖²)"), "w2");
  planCost_->addItem(tr("W1 (‖x−y‖)"), "w1");
  planCost_->setToolTip(tr("Ground cost of the exact plan"));
  threshold_ = new QSlider(Qt::Horizontal, w);
  threshold_->setRange(0, 100);
  threshold_->setValue(0);
  threshold_->setMaximumWidth(110);
  threshold_->setToolTip(tr("Hide segments lighter than this share of the heaviest one (0–100 %)"));
  entropic_ = new QCheckBox(tr("Entropic plan"), w);
  entropic_->setToolTip(tr("Also draw the entropic plan at the current ε (dashed), for comparison with the exact one"));
  potential_ = new QCheckBox(tr("W1 potential"), w);
  potential_->setToolTip(tr("Heat map of the Kantorovich potential φ of W1 (1-Lipschitz; W1 = Σaφ(x) − Σbφ(y))"));
  interp_ = new QCheckBox(tr("Interpolate"), w);
  interp_->setToolTip(tr("Displacement interpolation along the exact plan: mass π_ij at (1−t)x_i + t·y_j"));
  interpT_ = new QSlider(Qt::Horizontal, w);
  interpT_->setRange(0, 100);
  interpT_->setValue(50);
  interpT_->setMaximumWidth(110);
  interpT_->setToolTip(tr("t: 0 is A, 1 is B"));
  interpLabel_ = new QLabel("t = 0.50", w);
  l->addWidget(plan_);
  l->addWidget(planCost_);
  auto* thr = new QLabel(tr("hide below"), w);
  thr->setToolTip(threshold_->toolTip());
  l->addWidget(thr);
  l->addWidget(threshold_);
  l->addSeparator();
  l->addWidget(entropic_);
  l->addWidget(potential_);
  l->addSeparator();
  l->addWidget(interp_);
  l->addWidget(interpT_);
  l->addWidget(interpLabel_);
  connect(plan_, &QCheckBox::toggled, this, [this](bool on) {
    view_->setExactSegmentsShown(on);
    if (planId().empty()) view_->clearExactPlan();
    syncInterpolation();
    emit overlaysChanged();
  });
  connect(planCost_, &QComboBox::currentIndexChanged, this, [this] {
    view_->clearExactPlan();
    emit overlaysChanged();
  });
  connect(threshold_, &QSlider::valueChanged, this, [this](int v) { view_->setPlanThreshold(v / 100.0); });
  connect(entropic_, &QCheckBox::toggled, this, [this](bool on) {
    if (!on) view_->clearEntropicPlan();
    emit overlaysChanged();
  });
  connect(potential_, &QCheckBox::toggled, this, [this](bool on) {
    if (!on) view_->clearPotential();
    emit overlaysChanged();
  });
  connect(interp_, &QCheckBox::toggled, this, [this] {
    if (planId().empty()) view_->clearExactPlan();
    syncInterpolation();
    emit overlaysChanged();
  });
  connect(interpT_, &QSlider::valueChanged, this, [this] { syncInterpolation(); });
  return w;
}

void FieldPanel::syncInterpolation() {
  const double t = interpT_->value() / 100.0;
  interpLabel_->setText(QString("t = %1").arg(t, 0, 'f', 2));
  view_->setInterpolation(interp_->isChecked(), t);
}

std::string FieldPanel::planId() const {
  // Interpolation needs the exact plan even when its segments are hidden.
  if (!plan_->isChecked() && !interp_->isChecked()) return "";
  return planCost_->currentData().toString().toStdString();
}
bool FieldPanel::entropicPlanShown() const { return entropic_->isChecked(); }
bool FieldPanel::potentialShown() const { return potential_->isChecked(); }

void FieldPanel::setPlanShown(bool on) { plan_->setChecked(on); }
void FieldPanel::setPlanCost(const QString& id) {
  const int i = planCost_->findData(id);
  if (i >= 0) planCost_->setCurrentIndex(i);
}
void FieldPanel::setEntropicShown(bool on) { entropic_->setChecked(on); }
void FieldPanel::setPotentialShown(bool on) { potential_->setChecked(on && potential_->isEnabled()); }
void FieldPanel::setInterpolationShown(bool on) { interp_->setChecked(on); }
void FieldPanel::setInterpolationT(double t) { interpT_->setValue(int(std::lround(t * 100))); }
void FieldPanel::setThreshold(double f) { threshold_->setValue(int(std::lround(f * 100))); }

nlohmann::json FieldPanel::viewOptions() const {
  return {{"plan", plan_->isChecked()},
          {"planCost", planCost_->currentData().toString().toStdString()},
          {"threshold", threshold_->value() / 100.0},
          {"entropicPlan", entropic_->isChecked()},
          {"potential", potential_->isChecked()},
          {"interpolate", interp_->isChecked()},
          {"t", interpT_->value() / 100.0}};
}

void FieldPanel::setViewOptions(const nlohmann::json& v) {
  if (!v.is_object()) return;
  auto flag = [&](const char* k, bool dflt) { return v.contains(k) && v[k].is_boolean() ? v[k].get<bool>() : dflt; };
  auto real = [&](const char* k, double dflt) { return v.contains(k) && v[k].is_number() ? v[k].get<double>() : dflt; };
  setPlanShown(flag("plan", true));
  if (v.contains("planCost") && v["planCost"].is_string())
    setPlanCost(QString::fromStdString(v["planCost"].get<std::string>()));
  setThreshold(real("threshold", 0));
  setEntropicShown(flag("entropicPlan", false));
  setPotentialShown(flag("potential", false));
  setInterpolationShown(flag("interpolate", false));
  setInterpolationT(real("t", 0.5));
}

void FieldPanel::showSessionClouds() {
  view_->setGhost(std::nullopt);
  view_->setClouds(doc_->session().a, doc_->session().b);
}

void FieldPanel::applyUpdate(const LiveUpdate& u) {
  if (u.shownA) {
    if (thetaActive_) {
      view_->setClouds(*u.shownA, doc_->session().b);
      view_->setGhost(doc_->session().a);
    } else {
      view_->setGhost(std::nullopt);
    }
    if (!u.familyMessage.empty() && thetaActive_)
      emit message(tr("The sweep family cannot move A: %1").arg(QString::fromStdString(u.familyMessage)));
  }
  const std::string plan = planId();
  if (u.shownA && !plan.empty() && !MeasureRegistry::instance().find(plan))
    view_->setReadout(tr("No exact plan: the %1 measure is not in this build.").arg(QString::fromStdString(plan)));
  for (const auto& item : u.items) {
    const Result& r = item.result;
    if (!plan.empty() && item.id == plan) {
      if (r.usable() && !r.plan.empty()) {
        view_->setExactPlan(r.plan, item.id == "w2" ? tr("exact plan, W2") : tr("exact plan, W1"));
      } else {
        view_->clearExactPlan();
        view_->setReadout(tr("No exact plan: %1").arg(QString::fromStdString(r.usable() ? "the measure returned none" : r.message)));
      }
    }
    if (entropic_->isChecked() && item.id == "entropic") {
      if (r.usable() && !r.plan.empty()) {
        QString eps;
        if (const Measure* m = MeasureRegistry::instance().find("entropic")) {
          std::string err;
          const ParamSet p = resolveParams(*m, doc_->session().params, &err);
          if (p.has("entropic.epsilon")) eps = QString::fromStdString(p.text("entropic.epsilon"));
        }
        view_->setEntropicPlan(r.plan, eps.isEmpty() ? tr("entropic plan") : tr("entropic plan, ε = %1").arg(eps));
      } else {
        view_->clearEntropicPlan();
      }
    }
  }
  if (u.grid && potential_->isChecked()) {
    if (u.potential) view_->setPotential(*u.potential, *u.grid);
    else {
      view_->clearPotential();
      view_->setReadout(tr("No potential map: %1").arg(QString::fromStdString(u.potentialMessage)));
    }
  }
}

void FieldPanel::openGenerator() {
  GeneratorDialog dlg(editor_->target(), this);
  if (dlg.exec() != QDialog::Accepted) return;
  applyGenerated(dlg.spec(), dlg.target(), dlg.replace());
}

QString FieldPanel::applyGenerated(const ShapeSpec& spec, Which w, bool replace) {
  emit editor_->editStarting();
  const Cloud& old = doc_->cloud(w);
  Cloud made;
  try {
    made = generate(spec, old.name.empty() ? (w == Which::A ? "A" : "B") : old.name);
  } catch (const std::exception& e) {
    const QString why = tr("Cannot generate: %1").arg(e.what());
    emit message(why);
    return why;
  }
  if (!replace && old.size() > 0) {
    // New points join with the cloud's mean weight, so they count like the existing ones.
    Cloud joined = old;
    const Eigen::Index n0 = old.size();
    joined.points.conservativeResize(n0 + made.size(), 2);
    joined.weights.conservativeResize(n0 + made.size());
    joined.points.bottomRows(made.size()) = made.points;
    joined.weights.tail(made.size()).setConstant(old.weights.mean());
    made = joined;
  }
  doc_->setCloud(w, made, tr("Generate %1 into %2").arg(QString::fromStdString(spec.shape), w == Which::A ? "A" : "B"));
  view_->fitToData();
  return {};
}

void FieldPanel::askSelectionWeight() {
  if (editor_->selectedCount() == 0) {
    emit message(tr("Select points first (Select tool: click or drag a box)."));
    return;
  }
  bool ok = false;
  const double w = QInputDialog::getDouble(this, tr("Set weight"),
                                           tr("Weight of the %n selected point(s) (≥ 0; clouds are normalised at use):", "",
                                              editor_->selectedCount()),
                                           1.0 / std::max<Eigen::Index>(1, doc_->session().a.size()), 0, 1e12, 6, &ok);
  if (!ok) return;
  const QString why = editor_->setSelectionWeight(w);
  if (!why.isEmpty()) emit message(why);
}

}  // namespace barrow::ui
