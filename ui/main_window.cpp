#include "main_window.h"

#include <algorithm>
#include <QApplication>
#include <QCloseEvent>
#include <QDateTime>
#include <QDockWidget>
#include <QFileDialog>
#include <QFileInfo>
#include <QLabel>
#include <QMenuBar>
#include <QMessageBox>
#include <QMimeData>
#include <QProgressDialog>
#include <QPushButton>
#include <QSettings>
#include <QStatusBar>
#include <QUndoStack>
#include <qcustomplot.h>
#include <sstream>

#include "io/plan_csv.h"
#include "critic_panel.h"
#include "field_panel.h"
#include "field_view.h"
#include "figure_export.h"
#include "findings_panel.h"
#include "getting_started.h"
#include "live_evaluator.h"
#include "measures/registry.h"
#include "measures_panel.h"
#include "sweep/sweep_merge.h"
#include "report_export.h"
#include "scenario/demo_scenario.h"
#include "scenario/generators.h"
#include "session_files.h"
#include "sweep_panel.h"
#include "sweep_plots.h"
#include "uncertainty_pane.h"

namespace barrow::ui {

namespace {

const char* kCloudFilter = "Point clouds (*.csv *.txt *.tsv *.npy);;All files (*)";
const char* kSessionFilter = "Barrow sessions (*.json *.barrow);;All files (*)";

Session blankSession() {
  Session s;
  ShapeSpec spec;
  spec.shape = "gaussian";
  spec.count = 100;
  spec.spread = 0.5;
  spec.seed = 1;
  s.a = generate(spec, "A");
  spec.center = {2.0, 0.0};
  spec.seed = 2;
  s.b = generate(spec, "B");
  s.sweep.family = Family::Shift;
  s.sweep.from = -1;
  s.sweep.to = 3;
  s.sweep.steps = 81;
  s.sweep.reference = 0.0;
  return s;
}

}  // namespace

MainWindow::MainWindow(const Options& options, QWidget* parent)
    : QMainWindow(parent), options_(options), doc_(new SessionDocument(this)),
      live_(new LiveEvaluator(this)) {
  qRegisterMetaType<barrow::ui::LiveUpdate>();
  qRegisterMetaType<barrow::ui::SweepOutcome>();
  setObjectName("barrowMainWindow");
  setAcceptDrops(true);
  files_ = new SessionFiles(doc_, [this] { return viewOptions(); }, this);
  report_ = new ReportExport(this);
  field_ = new FieldPanel(doc_, this);
  field_->setObjectName("fieldPanel");
  setCentralWidget(field_);
  buildDocks();
  buildMenus();
  busyLabel_ = new QLabel(this);
  busyLabel_->setToolTip(tr("Shown while measures or a sweep are being computed"));
  statusBar()->addPermanentWidget(busyLabel_);

  liveTimer_.setSingleShot(true);
  liveTimer_.setInterval(0);  // coalesce the events of one pass of the event loop
  connect(&liveTimer_, &QTimer::timeout, this, &MainWindow::submitLive);
  connect(live_, &LiveEvaluator::updated, this, &MainWindow::onLiveUpdate);
  connect(live_, &LiveEvaluator::busyChanged, this, &MainWindow::checkIdle);

  connect(doc_, &SessionDocument::cloudsChanged, this, [this] {
    if (!theta_) field_->showSessionClouds();
    scheduleLive();
  });
  connect(doc_, &SessionDocument::paramsChanged, this, &MainWindow::scheduleLive);
  connect(doc_, &SessionDocument::sweepChanged, this, &MainWindow::scheduleLive);
  connect(doc_, &SessionDocument::selectionChanged, this, &MainWindow::scheduleLive);
  connect(doc_, &SessionDocument::modifiedChanged, this, &MainWindow::updateTitle);
  connect(doc_, &SessionDocument::pathChanged, this, &MainWindow::updateTitle);
  connect(field_, &FieldPanel::overlaysChanged, this, &MainWindow::scheduleLive);
  connect(field_, &FieldPanel::message, this, &MainWindow::status);
  connect(field_->editor(), &FieldEditor::editStarting, this, [this] {
    if (theta_) setTheta(std::nullopt);
  });
  connect(measures_, &MeasuresPanel::message, this, &MainWindow::status);
  connect(sweep_, &SweepPanel::message, this, &MainWindow::status);
  connect(sweep_, &SweepPanel::thetaChanged, this, &MainWindow::setTheta);
  connect(sweep_, &SweepPanel::runningChanged, this, &MainWindow::checkIdle);
  connect(uncertainty_, &UncertaintyPane::runningChanged, this, &MainWindow::checkIdle);
  connect(sweep_, &SweepPanel::outcomeReady, this, [this] {
    if (!sweep_->error().empty())
      findings_->clear(tr("The sweep failed: %1").arg(QString::fromStdString(sweep_->error())));
    else if (sweep_->parts().empty() && sweep_->cancelled())
      findings_->clear(tr("The sweep was cancelled."));
    else
      findings_->setFindings(sweep_->findings(), sweep_->resultsRevision());
    findings_->selectMeasure(sweep_->plots()->highlighted());
  });
  auto focus = [this](const QString& id) { focusMeasure(id.toStdString()); };
  connect(measures_, &MeasuresPanel::measureFocused, this, focus);
  connect(findings_, &FindingsPanel::measureFocused, this, focus);
  connect(sweep_->plots(), &SweepPlots::measurePicked, this, focus);

  restoreLayout();
  updateTitle();
  if (!options_.screenshot) {
    files_->startAutosave(15000);
    QSettings settings;
    if (!settings.value("ui/gettingStartedShown", false).toBool()) {
      settings.setValue("ui/gettingStartedShown", true);
      QTimer::singleShot(0, this, &MainWindow::showGettingStarted);
    }
    if (!options_.quiet) QTimer::singleShot(0, this, &MainWindow::offerRecovery);
  }
}

MainWindow::~MainWindow() = default;

void MainWindow::buildDocks() {
  measures_ = new MeasuresPanel(doc_, MeasureRegistry::instance().defaults(), this);
  sweep_ = new SweepPanel(doc_, this);
  findings_ = new FindingsPanel(doc_, this);
  uncertainty_ = new UncertaintyPane(doc_, measures_, this);
  auto dock = [this](QWidget* w, const QString& title, const char* name, Qt::DockWidgetArea area) {
    auto* d = new QDockWidget(title, this);
    d->setObjectName(name);
    d->setWidget(w);
    d->setFeatures(QDockWidget::DockWidgetMovable | QDockWidget::DockWidgetFloatable |
                   QDockWidget::DockWidgetClosable);
    addDockWidget(area, d);
    return d;
  };
  setCorner(Qt::BottomRightCorner, Qt::RightDockWidgetArea);
  setCorner(Qt::TopRightCorner, Qt::RightDockWidgetArea);
  auto* m = dock(measures_, tr("Measures"), "measuresDock", Qt::RightDockWidgetArea);
  auto* f = dock(findings_, tr("Findings"), "findingsDock", Qt::RightDockWidgetArea);
  auto* s = dock(sweep_, tr("Sweep"), "sweepDock", Qt::BottomDockWidgetArea);
  splitDockWidget(m, f, Qt::Vertical);
  tabifyDockWidget(f, dock(uncertainty_, tr("Resampling"), "resamplingDock", Qt::RightDockWidgetArea));
  f->raise();
  // The critic check shares the bottom area with the Sweep, as a tab behind it.
  critic_ = new CriticPanel(doc_, this);
  tabifyDockWidget(s, dock(critic_, tr("Critic"), "criticDock", Qt::BottomDockWidgetArea));
  s->raise();
}

void MainWindow::applyDefaultLayout() {
  auto* m = findChild<QDockWidget*>("measuresDock");
  auto* f = findChild<QDockWidget*>("findingsDock");
  auto* s = findChild<QDockWidget*>("sweepDock");
  // Below 1200 px the Sweep takes the whole bottom edge (beside the right-hand docks its plot
  // would be about 500 px wide with a legend as wide as the plot), and Findings and
  // Resampling become tabs beside it, where their sentences have the width; the right-hand
  // column keeps the Measures table alone, which then shows ids where the names do not fit.
  const bool narrow = width() < 1200;
  setCorner(Qt::BottomRightCorner, narrow ? Qt::BottomDockWidgetArea : Qt::RightDockWidgetArea);
  if (narrow) {
    auto* r = findChild<QDockWidget*>("resamplingDock");
    for (QDockWidget* d : {f, r}) {
      addDockWidget(Qt::BottomDockWidgetArea, d);
      tabifyDockWidget(s, d);
    }
    s->raise();
    resizeDocks({m}, {std::clamp(width() * 2 / 5, 320, 440)}, Qt::Horizontal);
    resizeDocks({s}, {height() * 45 / 100}, Qt::Vertical);
    return;
  }
  resizeDocks({m}, {std::max(480, width() * 2 / 5)}, Qt::Horizontal);
  resizeDocks({m, f}, {height() * 58 / 100, height() * 42 / 100}, Qt::Vertical);
  resizeDocks({s}, {height() * 40 / 100}, Qt::Vertical);
}

void MainWindow::showEvent(QShowEvent* e) {
  QMainWindow::showEvent(e);
  if (!layoutRestored_ && !defaultLayoutApplied_) {
    defaultLayoutApplied_ = true;
    // After the first layout pass; dock sizes set before it are overridden.
    QTimer::singleShot(0, this, &MainWindow::applyDefaultLayout);
  }
}

void MainWindow::buildMenus() {
  QMenu* file = menuBar()->addMenu(tr("&File"));
  auto add = [](QMenu* menu, const QString& text, const QKeySequence& key, const QString& tip, auto slot,
                QObject* ctx) {
    QAction* a = menu->addAction(text);
    if (!key.isEmpty()) a->setShortcut(key);
    a->setToolTip(tip);
    a->setStatusTip(tip);
    QObject::connect(a, &QAction::triggered, ctx, slot);
    return a;
  };
  add(file, tr("&New session"), QKeySequence::New, tr("Start a new session with two example blobs"),
      [this] { newSession(); }, this);
  add(file, tr("&Open…"), QKeySequence::Open, tr("Open a session, or a cloud file as A or B"), [this] { openDialog(); }, this);
  recentMenu_ = file->addMenu(tr("Open &recent"));
  connect(files_, &SessionFiles::recentChanged, this, &MainWindow::rebuildRecentMenu);
  rebuildRecentMenu();
  add(file, tr("&Save"), QKeySequence::Save, tr("Save the session"), [this] { save(); }, this);
  // Some platforms define no Save As key; Ctrl+Shift+S is the common one there.
  const QKeySequence saveAsKey = QKeySequence::keyBindings(QKeySequence::SaveAs).isEmpty()
                                     ? QKeySequence(Qt::CTRL | Qt::SHIFT | Qt::Key_S)
                                     : QKeySequence(QKeySequence::SaveAs);
  add(file, tr("Save &as…"), saveAsKey, tr("Save the session under a new name"), [this] { saveAsDialog(); }, this)
      ->setObjectName("saveAsAction");
  file->addSeparator();
  add(file, tr("&Import cloud into A…"), QKeySequence("Ctrl+I"), tr("Replace A by a CSV or .npy file"),
      [this] { importDialog(Which::A); }, this);
  add(file, tr("Import cloud into &B…"), QKeySequence("Ctrl+Shift+I"), tr("Replace B by a CSV or .npy file"),
      [this] { importDialog(Which::B); }, this);
  add(file, tr("Export cloud A…"), {}, tr("Write A as CSV or .npy (by extension)"), [this] { exportCloudDialog(Which::A); }, this);
  add(file, tr("Export cloud B…"), {}, tr("Write B as CSV or .npy (by extension)"), [this] { exportCloudDialog(Which::B); }, this);
  file->addSeparator();
  add(file, tr("Export &Field figure…"), QKeySequence("Ctrl+E"), tr("PNG, SVG or PDF of the Field at a chosen size"),
      [this] { exportFigureDialog(0); }, this);
  add(file, tr("Export sweep figure…"), {}, tr("PNG, SVG or PDF of the measures and their slopes against θ"),
      [this] { exportFigureDialog(1); }, this);
  add(file, tr("Export sweep data (CSV)…"), {}, tr("theta, each measure, then each dD/dθ"), [this] {
    if (const QString why = sweepExportProblem(); !why.isEmpty()) return reportError(tr("Cannot export"), why);
    exportTextDialog(tr("Export sweep data"), "sweep.csv", sweep_->toCsv());
  }, this);
  add(file, tr("Export findings (JSON)…"), {}, tr("Jumps, flat stretches and slopes per measure, as barrow-cli findings --json"), [this] {
    if (const QString why = sweepExportProblem(); !why.isEmpty()) return reportError(tr("Cannot export"), why);
    exportTextDialog(tr("Export findings"), "findings.json", sweep_->findingsJson());
  }, this);
  add(file, tr("Export plan (CSV)…"), {}, tr("The exact plan: i, j, mass, both endpoints and the cost, as barrow-cli plan"), [this] {
    const std::string csv = planCsv();
    if (csv.empty()) return status(tr("No exact plan yet: switch on the Plan overlay."));
    exportTextDialog(tr("Export plan"), "plan.csv", csv);
  }, this);
  add(file, tr("Export measures table (CSV)…"), {}, tr("Every measure's value, change, status and time"),
      [this] { exportTextDialog(tr("Export measures"), "measures.csv", measures_->toCsv()); }, this);
  add(file, tr("Export &report (HTML)…"), {}, tr("One HTML file a teammate can open offline: clouds, measures, sweep with a θ slider, findings"),
      [this] { exportReportDialog(); }, this);
  file->addSeparator();
  add(file, tr("&Quit"), QKeySequence::Quit, tr("Close Barrow"), [this] { close(); }, this);

  QMenu* edit = menuBar()->addMenu(tr("&Edit"));
  QAction* undo = doc_->undoStack()->createUndoAction(this, tr("&Undo"));
  undo->setShortcut(QKeySequence::Undo);
  QAction* redo = doc_->undoStack()->createRedoAction(this, tr("&Redo"));
  redo->setShortcut(QKeySequence::Redo);
  edit->addAction(undo);
  edit->addAction(redo);
  edit->addSeparator();
  // Keys that text fields also use act on the Field only while it has the focus, so that
  // Ctrl+A, Delete and Esc keep their meaning in the table's editors and the spin boxes.
  auto fieldKey = [this](QAction* a) {
    a->setShortcutContext(Qt::WidgetWithChildrenShortcut);
    field_->addAction(a);
  };
  fieldKey(add(edit, tr("Select &all"), QKeySequence::SelectAll, tr("Select every point of both clouds"),
               [this] { field_->editor()->selectAll(); }, this));
  fieldKey(add(edit, tr("Clear selection"), QKeySequence(Qt::Key_Escape), tr("Deselect (and cancel a drag in progress)"),
               [this] {
                 field_->editor()->cancelGesture();
                 field_->editor()->clearSelection();
               },
               this));
  fieldKey(add(edit, tr("&Delete selected points"), QKeySequence::Delete, tr("Remove the selected points"), [this] {
    const QString why = field_->editor()->deleteSelection();
    if (!why.isEmpty()) status(why);
  }, this));
  add(edit, tr("Set &weight of selection…"), QKeySequence("Ctrl+W"), tr("Give the selected points a weight"),
      [this] { field_->askSelectionWeight(); }, this);
  add(edit, tr("&Generate cloud…"), QKeySequence("Ctrl+G"), tr("Make a cloud of a common shape"),
      [this] { field_->openGenerator(); }, this);

  QMenu* view = menuBar()->addMenu(tr("&View"));
  for (QDockWidget* d : findChildren<QDockWidget*>()) view->addAction(d->toggleViewAction());
  view->addSeparator();
  add(view, tr("&Fit the Field"), {}, tr("Show both clouds whole"), [this] { field_->view()->fitToData(); }, this);

  QMenu* sweep = menuBar()->addMenu(tr("&Sweep"));
  add(sweep, tr("&Run sweep"), QKeySequence("Ctrl+R"), tr("Evaluate the ticked measures along θ"),
      [this] { sweep_->run(); }, this);
  add(sweep, tr("&Cancel sweep"), QKeySequence("Ctrl+."), tr("Stop the running sweep"), [this] { sweep_->cancel(); }, this);
  add(sweep, tr("Release the θ &cursor"), QKeySequence("Ctrl+0"), tr("Show A as drawn again"),
      [this] { setTheta(std::nullopt); }, this);

  QMenu* resampling = menuBar()->addMenu(tr("&Resampling"));
  add(resampling, tr("&Intervals and p-values"), QKeySequence("Ctrl+Shift+R"),
      tr("Resample the clouds: an interval and a same-distribution p-value per measure, and value versus n"),
      [this] {
        if (auto* d = findChild<QDockWidget*>("resamplingDock")) d->show(), d->raise();
        uncertainty_->run();
      },
      this);
  add(resampling, tr("&Cancel resampling"), {}, tr("Stop the running resampling"), [this] { uncertainty_->cancel(); },
      this);

  QMenu* help = menuBar()->addMenu(tr("&Help"));
  add(help, tr("&Getting started"), QKeySequence::HelpContents, tr("The short guide shown on first run"),
      [this] { showGettingStarted(); }, this);
  add(help, tr("&About Barrow"), {}, tr("Version and licence"), [this] {
    QMessageBox::about(this, tr("About Barrow"),
                       tr("<b>Barrow</b> %1<br>How distances between two 2-D point clouds behave."
                          "<br>GPL-3.0-or-later.").arg(QApplication::applicationVersion()));
  }, this);
}

void MainWindow::rebuildRecentMenu() {
  recentMenu_->clear();
  const QStringList list = files_->recentFiles();
  for (const QString& p : list) {
    QAction* a = recentMenu_->addAction(QFileInfo(p).fileName());
    a->setToolTip(p);
    a->setStatusTip(p);
    connect(a, &QAction::triggered, this, [this, p] {
      if (SessionFiles::isSessionFile(p) && !confirmDiscard()) return;
      openFile(p);
    });
  }
  if (!list.isEmpty()) recentMenu_->addSeparator();
  QAction* clear = recentMenu_->addAction(tr("Clear list"));
  clear->setEnabled(!list.isEmpty());
  connect(clear, &QAction::triggered, files_, &SessionFiles::clearRecent);
}

void MainWindow::setSession(const Session& s, const QString& path) {
  setTheta(std::nullopt);
  doc_->reset(s, path);
  applyViewOptions(s.view);
  field_->showSessionClouds();
  field_->view()->fitToData();
  scheduleLive();
  if (options_.autoSweep && sweep_->runButton()->isEnabled()) sweep_->run();
}

// One measure picked out in every pane (none: id empty). The panes' own selection changes
// come back here; selecting what is already selected emits nothing, so this settles.
void MainWindow::focusMeasure(const std::string& id) {
  sweep_->plots()->highlight(id);
  findings_->selectMeasure(id);
  uncertainty_->focusMeasure(id);
  if (!id.empty()) measures_->focusMeasure(id);
}

nlohmann::json MainWindow::viewOptions() const {
  nlohmann::json v = field_->viewOptions();
  v["theta"] = theta_ ? nlohmann::json(*theta_) : nlohmann::json();
  v["highlight"] = sweep_->plots()->highlighted();
  v["normalise"] = sweep_->plots()->normalised();
  return v;
}

void MainWindow::applyViewOptions(const nlohmann::json& v) {
  field_->setViewOptions(v);
  if (!v.is_object()) return;
  if (v.contains("normalise") && v["normalise"].is_boolean()) sweep_->setNormalised(v["normalise"].get<bool>());
  if (v.contains("highlight") && v["highlight"].is_string()) {
    focusMeasure(v["highlight"].get<std::string>());
  }
  // The θ cursor last: it moves A on the Field.
  if (v.contains("theta") && v["theta"].is_number()) setTheta(v["theta"].get<double>());
}

QString MainWindow::openFile(const QString& path) {
  // A single cloud file replaces one side: ask which, as a drop does.
  if (!SessionFiles::isSessionFile(path)) return importAsked(path);
  const QString e = files_->openSession(path);
  if (!e.isEmpty()) {
    reportError(tr("Cannot open"), e);
    return e;
  }
  setSession(doc_->session(), path);
  return {};
}

QString MainWindow::openPair(const QString& pathA, const QString& pathB) {
  for (const auto& [path, side] : {std::pair{pathA, Which::A}, std::pair{pathB, Which::B}}) {
    const QString e = files_->importCloud(path, side);
    if (!e.isEmpty()) {
      reportError(tr("Cannot open"), e);
      return e;
    }
  }
  field_->view()->fitToData();
  status(tr("Opened %1 as A and %2 as B").arg(QFileInfo(pathA).fileName(), QFileInfo(pathB).fileName()));
  return {};
}

std::optional<Which> MainWindow::askSide(const QString& path) {
  if (dropChooser_) return dropChooser_(path);
  QMessageBox box(QMessageBox::Question, tr("Import cloud"),
                  tr("Use %1 as cloud A or as cloud B?").arg(QFileInfo(path).fileName()), QMessageBox::Cancel, this);
  QPushButton* a = box.addButton(tr("As A"), QMessageBox::AcceptRole);
  QPushButton* b = box.addButton(tr("As B"), QMessageBox::AcceptRole);
  box.exec();
  if (box.clickedButton() == a) return Which::A;
  if (box.clickedButton() == b) return Which::B;
  return std::nullopt;
}

QString MainWindow::importAsked(const QString& path) {
  const std::optional<Which> target = askSide(path);
  if (!target) return tr("cancelled");
  return importInto(path, *target);
}

// Every import (menu, Open, drop) ends the same way: the Field shows both clouds whole.
QString MainWindow::importInto(const QString& path, Which w) {
  const QString e = files_->importCloud(path, w);
  if (!e.isEmpty()) {
    reportError(tr("Cannot import"), e);
    return e;
  }
  files_->addRecent(path);
  field_->view()->fitToData();
  status(tr("Imported %1 as %2").arg(QFileInfo(path).fileName(), w == Which::A ? "A" : "B"));
  return {};
}

QString MainWindow::saveTo(const QString& path) {
  const QString e = files_->save(path);
  if (!e.isEmpty()) reportError(tr("Cannot save"), e);
  else status(tr("Saved %1").arg(path));
  return e;
}

QString MainWindow::dropFile(const QString& path) {
  if (SessionFiles::isSessionFile(path)) {
    if (!confirmDiscard()) return tr("cancelled");
    return openFile(path);
  }
  return importAsked(path);
}

void MainWindow::setTheta(std::optional<double> theta) {
  theta_ = theta;
  field_->setThetaActive(theta.has_value());
  sweep_->plots()->setCursor(theta);
  if (!theta) field_->showSessionClouds();
  scheduleLive();
}

void MainWindow::scheduleLive() {
  if (!liveTimer_.isActive()) liveTimer_.start();
  checkIdle();
}

void MainWindow::submitLive() {
  LiveRequest req;
  const Session& s = doc_->session();
  req.a = s.a;
  req.b = s.b;
  req.params = s.params;
  // Only the ticked measures: on clouds of 10^4 points one unticked entropic solve would keep
  // every edit waiting for tens of seconds (issue 13). An empty selection means all.
  req.planId = field_->planId();
  req.entropicPlan = field_->entropicPlanShown();
  // The measures behind a plan or map on the Field are computed too, ticked or not.
  auto drawn = [&](const std::string& id) {
    return id == req.planId || (req.entropicPlan && id == "entropic") || (field_->potentialShown() && id == "w1");
  };
  for (const Measure* m : MeasureRegistry::instance().defaults())
    if (s.selected.empty() || drawn(m->id()) ||
        std::find(s.selected.begin(), s.selected.end(), m->id()) != s.selected.end())
      req.measures.push_back(m);
  req.interactive = doc_->previewing() || sweep_->plots()->dragging();
  if (field_->potentialShown()) req.potential = field_->view()->potentialGrid();
  if (!s.sweep.validate()) {
    FamilyView f;
    f.settings = s.sweep;
    f.theta = theta_;
    f.reference = s.sweep.referenceTheta();
    req.family = f;
  }
  measures_->markUpdating();
  live_->submit(std::move(req));
  checkIdle();
}

void MainWindow::onLiveUpdate(const LiveUpdate& u) {
  field_->applyUpdate(u);
  measures_->applyUpdate(u);
  emit liveUpdated(u);
  checkIdle();
}

quint64 MainWindow::liveRequest() const { return live_->latest(); }

bool MainWindow::busy() const {
  return liveTimer_.isActive() || live_->busy() || sweep_->running() || uncertainty_->running();
}

void MainWindow::whenIdle(std::function<void()> done) {
  idleWaiters_.push_back(std::move(done));
  checkIdle();
}

void MainWindow::checkIdle() {
  const bool b = busy();
  busyLabel_->setText(b ? (sweep_->running() ? tr("sweeping…") : tr("updating…")) : QString());
  if (b != lastBusy_) {
    lastBusy_ = b;
    emit busyChanged(b);
  }
  if (b || idleWaiters_.empty()) return;
  auto waiters = std::move(idleWaiters_);
  idleWaiters_.clear();
  for (auto& w : waiters) w();
}

void MainWindow::reportError(const QString& title, const QString& text) {
  lastError_ = text;
  status(text);
  if (!options_.quiet) QMessageBox::warning(this, title, text);
}

void MainWindow::status(const QString& text) { statusBar()->showMessage(text, 8000); }

bool MainWindow::confirmDiscard() {
  if (!doc_->isModified()) return true;
  if (prompts_.discard) return prompts_.discard();
  if (options_.quiet) return true;
  const auto answer = QMessageBox::question(
      this, tr("Unsaved changes"), tr("The session has unsaved changes. Save them first?"),
      QMessageBox::Save | QMessageBox::Discard | QMessageBox::Cancel, QMessageBox::Save);
  if (answer == QMessageBox::Save) return save();
  return answer == QMessageBox::Discard;
}

void MainWindow::updateTitle() {
  const QString name = doc_->path().isEmpty() ? tr("untitled") : QFileInfo(doc_->path()).fileName();
  setWindowTitle(name + "[*] — Barrow");
  setWindowModified(doc_->isModified());
}

void MainWindow::restoreLayout() {
  QSettings s;
  if (options_.screenshot) return;  // screenshots use the default layout
  restoreGeometry(s.value("ui/geometry").toByteArray());
  layoutRestored_ = restoreState(s.value("ui/state").toByteArray());
  layoutTimer_.setSingleShot(true);
  layoutTimer_.setInterval(600);
  connect(&layoutTimer_, &QTimer::timeout, this, &MainWindow::saveLayout);
}

void MainWindow::saveLayout() {
  if (options_.screenshot) return;
  QSettings s;
  s.setValue("ui/geometry", saveGeometry());
  s.setValue("ui/state", saveState());
}

// Kept as it changes, not only on a clean exit: after a crash the window comes back as it was.
void MainWindow::resizeEvent(QResizeEvent* e) {
  QMainWindow::resizeEvent(e);
  if (!options_.screenshot && isVisible()) layoutTimer_.start();
}

void MainWindow::moveEvent(QMoveEvent* e) {
  QMainWindow::moveEvent(e);
  if (!options_.screenshot && isVisible()) layoutTimer_.start();
}

void MainWindow::closeEvent(QCloseEvent* e) {
  if (!confirmDiscard()) {
    e->ignore();
    return;
  }
  sweep_->cancel();
  layoutTimer_.stop();
  saveLayout();
  files_->discardRecovery();  // a clean exit leaves nothing to recover
  e->accept();
}

void MainWindow::offerRecovery() {
  QString error;
  auto recovered = files_->pendingRecovery(&error);
  if (!recovered) {
    if (!error.isEmpty()) status(tr("An autosave file could not be read and was left in place: %1").arg(error));
    return;
  }
  const QDateTime when = QFileInfo(files_->recoveryPath()).lastModified();
  const auto answer = QMessageBox::question(
      this, tr("Restore unsaved work?"),
      tr("Barrow did not close normally last time. Restore the work autosaved at %1?")
          .arg(QLocale().toString(when, QLocale::ShortFormat)),
      QMessageBox::Yes | QMessageBox::No, QMessageBox::Yes);
  if (answer != QMessageBox::Yes) {
    files_->discardRecovery();
    return;
  }
  QString from;
  if (recovered->view.contains("recoveredFrom") && recovered->view["recoveredFrom"].is_string())
    from = QString::fromStdString(recovered->view["recoveredFrom"].get<std::string>());
  setSession(*recovered, from);
  doc_->undoStack()->resetClean();  // restored work is unsaved work
}

void MainWindow::showGettingStarted() {
  if (options_.screenshot) return;
  if (!guide_) guide_ = new GettingStarted(this);
  const Session demo = demoSession();
  guide_->setDemoShown(sessionCloudsEqual(session().a, demo.a) && sessionCloudsEqual(session().b, demo.b));
  guide_->show();
  guide_->raise();
}

void MainWindow::dragEnterEvent(QDragEnterEvent* e) {
  if (e->mimeData()->hasUrls()) e->acceptProposedAction();
}

void MainWindow::dropEvent(QDropEvent* e) {
  const auto urls = e->mimeData()->urls();
  if (urls.isEmpty() || !urls.first().isLocalFile()) return;
  e->acceptProposedAction();
  const QString path = urls.first().toLocalFile();
  // After the drop has finished, so that a dialog does not run inside the drag.
  QTimer::singleShot(0, this, [this, path] { dropFile(path); });
}

// File menu ---------------------------------------------------------------------------

void MainWindow::newSession() {
  if (!confirmDiscard()) return;
  setSession(blankSession());
}

void MainWindow::openDialog() {
  // Unsaved work is settled before the chooser, so the question is not a surprise after it.
  if (!confirmDiscard()) return;
  const QString p = prompts_.openPath
                        ? prompts_.openPath()
                        : QFileDialog::getOpenFileName(this, tr("Open session or cloud"),
                                                       QSettings().value("files/lastDir").toString(),
                                                       "Sessions and clouds (*.json *.barrow *.csv *.txt *.tsv *.npy);;" +
                                                           QString(kSessionFilter) + ";;" + kCloudFilter);
  if (p.isEmpty()) return;
  QSettings().setValue("files/lastDir", QFileInfo(p).absolutePath());
  openFile(p);
}

bool MainWindow::save() {
  if (doc_->path().isEmpty()) return saveAsDialog();
  return saveTo(doc_->path()).isEmpty();
}

bool MainWindow::saveAsDialog() {
  QString p = QFileDialog::getSaveFileName(
      this, tr("Save session"),
      doc_->path().isEmpty() ? suggestedPath(tr("session"), "json") : doc_->path(), kSessionFilter);
  if (p.isEmpty()) return false;
  if (QFileInfo(p).suffix().isEmpty()) p += ".json";
  QSettings().setValue("files/lastDir", QFileInfo(p).absolutePath());
  return saveTo(p).isEmpty();
}

void MainWindow::importDialog(Which w) {
  const QString p = QFileDialog::getOpenFileName(this, w == Which::A ? tr("Import cloud into A") : tr("Import cloud into B"),
                                                 QSettings().value("files/lastDir").toString(), kCloudFilter);
  if (p.isEmpty()) return;
  QSettings().setValue("files/lastDir", QFileInfo(p).absolutePath());
  importInto(p, w);
}

void MainWindow::exportCloudDialog(Which w) {
  const QString p = QFileDialog::getSaveFileName(this, w == Which::A ? tr("Export cloud A") : tr("Export cloud B"),
                                                 suggestedPath(w == Which::A ? "A" : "B", "csv"),
                                                 "CSV (*.csv);;NumPy (*.npy)");
  if (p.isEmpty()) return;
  const QString e = files_->exportCloud(p, w);
  if (!e.isEmpty()) reportError(tr("Cannot export"), e);
  else status(tr("Wrote %1").arg(p));
}

void MainWindow::exportFigureDialog(int which) {
  if (which == 1)
    if (const QString why = sweepExportProblem(); !why.isEmpty()) return reportError(tr("Cannot export"), why);
  QCustomPlot* plot = which == 0 ? field_->view()->plot() : sweep_->plots()->plot();
  ExportSizeDialog size(QSize(std::max(400, plot->width()), std::max(300, plot->height())), this);
  if (size.exec() != QDialog::Accepted) return;
  const QString p = QFileDialog::getSaveFileName(this, tr("Export figure"),
                                                 suggestedPath(which == 0 ? tr("field") : tr("sweep"), "png"),
                                                 "PNG (*.png);;SVG (*.svg);;PDF (*.pdf)");
  if (p.isEmpty()) return;
  QSettings().setValue("files/lastDir", QFileInfo(p).absolutePath());
  exportFigure(which, p, size.size());
}

QString MainWindow::exportFigure(int which, const QString& path, const QSize& size) {
  if (which == 1)
    if (const QString why = sweepExportProblem(); !why.isEmpty()) {
      reportError(tr("Cannot export"), why);
      return why;
    }
  QCustomPlot* plot = which == 0 ? field_->view()->plot() : sweep_->plots()->plot();
  const QString e = exportPlot(plot, path, size.width(), size.height());
  if (!e.isEmpty()) reportError(tr("Cannot export"), e);
  else status(tr("Wrote %1").arg(path));
  return e;
}

QString MainWindow::sweepExportProblem() const {
  if (sweep_->running()) return tr("The sweep is still running: export it when it has finished.");
  if (sweep_->parts().empty()) return tr("Run a sweep first.");
  if (!sweep_->resultsCurrent())
    return tr("The sweep is out of date: the clouds or settings changed since it ran. Run it again (Ctrl+R) "
              "and export the new one.");
  return {};
}

QString MainWindow::suggestedPath(const QString& stem, const QString& suffix) const {
  const QString dir = QSettings().value("files/lastDir").toString();
  const QString base = doc_->path().isEmpty() ? QString() : QFileInfo(doc_->path()).completeBaseName();
  const QString name = (base.isEmpty() || base == stem ? stem : base + "-" + stem) + "." + suffix;
  return dir.isEmpty() ? name : dir + "/" + name;
}

void MainWindow::exportTextDialog(const QString& title, const QString& defaultName, const std::string& text) {
  const QString filter = defaultName.endsWith(".json") ? "JSON (*.json)" : "CSV (*.csv)";
  const QFileInfo name(defaultName);
  const QString p = QFileDialog::getSaveFileName(this, title, suggestedPath(name.completeBaseName(), name.suffix()),
                                                 filter);
  if (p.isEmpty()) return;
  const QString e = SessionFiles::writeText(p, text);
  if (!e.isEmpty()) reportError(tr("Cannot export"), e);
  else status(tr("Wrote %1").arg(p));
}

void MainWindow::exportReportDialog() {
  const QString p = QFileDialog::getSaveFileName(this, tr("Export report"), suggestedPath(tr("report"), "html"),
                                                 tr("HTML report (*.html)"));
  if (!p.isEmpty()) exportReport(p);
}

void MainWindow::exportReport(const QString& path) {
  // The window's sweep when it matches the session (finished, not stale); else the export runs one.
  std::optional<SweepResult> current;
  std::vector<Finding> findings;
  if (!sweep_->parts().empty() && sweep_->resultsCurrent() && !sweep_->cancelled() && !sweep_->running()) {
    std::vector<SweepResult> passes;
    for (const auto& part : sweep_->parts()) passes.push_back(part.result);
    current = mergeSweeps(passes);
    findings = sweep_->findings();
  }
  auto* dialog = options_.quiet ? nullptr : new QProgressDialog(tr("Writing the report…"), tr("Cancel"), 0, 1000, this);
  if (dialog) {
    dialog->setWindowModality(Qt::WindowModal);
    dialog->setMinimumDuration(300);
    dialog->setAttribute(Qt::WA_DeleteOnClose);
    connect(dialog, &QProgressDialog::canceled, report_, &ReportExport::cancel);
    connect(report_, &ReportExport::progress, dialog, [dialog](double f, const QString& stage) {
      dialog->setValue(int(1000 * f));
      if (!stage.isEmpty()) dialog->setLabelText(stage + QStringLiteral("…"));
    });
  }
  connect(report_, &ReportExport::finished, this, [this, dialog](const QString& p, const QString& error) {
    if (dialog) dialog->close();
    if (error.isEmpty()) status(tr("Wrote the report %1").arg(p));
    else if (error == QLatin1String("cancelled")) status(tr("Report cancelled; nothing was written."));
    else reportError(tr("Cannot write the report"), error);
  }, Qt::SingleShotConnection);
  status(current ? tr("Writing the report…") : tr("Running the sweep for the report…"));
  report_->start(path, doc_->session(), doc_->path(), std::move(current), std::move(findings));
}

std::string MainWindow::planCsv() const {
  const std::string id = field_->planId();
  const Result* r = id.empty() ? nullptr : measures_->result(id);
  if (!r || r->plan.empty()) return {};
  return formatPlanCsv(field_->view()->shownCloud(Which::A), field_->view()->shownCloud(Which::B), r->plan,
                       id == "w1" ? 1.0 : 2.0);
}

}  // namespace barrow::ui
