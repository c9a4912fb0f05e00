// Barrow's main window: the Field in the middle, the Measures, Sweep and Findings around it
// (dockable, layout kept between runs), the menus, and the wiring between the session, the
// live evaluation worker and the sweep.
#pragma once

#include <QMainWindow>
#include <QTimer>
#include <functional>
#include <optional>

#include "io/session_io.h"
#include "session_document.h"

class QDockWidget;
class QLabel;
class QMenu;

namespace barrow::ui {

class CriticPanel;
class FieldPanel;
class FindingsPanel;
class GettingStarted;
class LiveEvaluator;
class MeasuresPanel;
class ReportExport;
class SessionFiles;
class SweepPanel;
class UncertaintyPane;
struct LiveUpdate;

class MainWindow : public QMainWindow {
  Q_OBJECT
 public:
  struct Options {
    bool screenshot = false;   // no first-run guide, no recovery prompt, no autosave
    bool quiet = false;        // errors go to lastError()/status bar instead of dialogs (tests)
    bool autoSweep = true;     // run the sweep when a session is opened
  };
  explicit MainWindow(QWidget* parent = nullptr) : MainWindow(Options{}, parent) {}
  explicit MainWindow(const Options& options, QWidget* parent = nullptr);
  ~MainWindow() override;

  /// Replaces the open session (no prompt), e.g. the demo at start-up.
  void setSession(const Session& s, const QString& path = QString());
  const Session& session() const { return doc_->session(); }
  SessionDocument* document() const { return doc_; }

  /// Opens a session or a cloud file; returns the error text (also reported), empty on success.
  /// A session replaces everything; a cloud file asks which side it replaces (as a drop).
  QString openFile(const QString& path);
  /// Two cloud files as A and B (barrow --a A --b B).
  QString openPair(const QString& pathA, const QString& pathB);
  QString saveTo(const QString& path);
  /// Handles a dropped file as the window would (asks A or B for clouds via the chooser).
  QString dropFile(const QString& path);
  /// Replaces the "A or B?" question for dropped clouds (tests); nullopt cancels.
  void setDropChooser(std::function<std::optional<Which>(const QString&)> chooser) { dropChooser_ = std::move(chooser); }
  /// Replaces the modal questions of File → Open (tests): the file chooser (empty: cancelled)
  /// and the unsaved-changes question (false: cancelled).
  struct Prompts {
    std::function<QString()> openPath;
    std::function<bool()> discard;
  };
  void setPrompts(Prompts p) { prompts_ = std::move(p); }
  /// File → Open as the menu runs it: the unsaved-changes question first, then the chooser.
  void openDialog();

  /// Why the sweep cannot be exported as it stands ("" when it can): none yet, still running,
  /// or computed at another session revision than the current one.
  QString sweepExportProblem() const;
  /// Writes the Field (0) or Sweep (1) figure; the sweep only when sweepExportProblem() is "".
  QString exportFigure(int which, const QString& path, const QSize& size);
  /// The file name an export dialog offers: last folder, the session's name and `stem`.
  QString suggestedPath(const QString& stem, const QString& suffix) const;

  /// The GUI state kept in a session's "view": overlays, θ cursor, highlighted measure.
  nlohmann::json viewOptions() const;
  void applyViewOptions(const nlohmann::json& v);

  /// Moves the θ cursor (nullopt releases it: the Field shows A as drawn).
  void setTheta(std::optional<double> theta);
  std::optional<double> theta() const { return theta_; }

  /// True while any computation is pending (live measures or a sweep).
  bool busy() const;
  /// Calls `done` once nothing is pending any more (checked as the workers report).
  void whenIdle(std::function<void()> done);
  /// Request number of the newest live evaluation (for tests and benchmarks).
  quint64 liveRequest() const;

  FieldPanel* field() const { return field_; }
  MeasuresPanel* measures() const { return measures_; }
  SweepPanel* sweep() const { return sweep_; }
  /// What "Export plan" writes: the plan CSV of barrow-cli plan (empty without a plan).
  std::string planCsv() const;
  FindingsPanel* findings() const { return findings_; }
  UncertaintyPane* uncertainty() const { return uncertainty_; }
  CriticPanel* critic() const { return critic_; }
  SessionFiles* files() const { return files_; }
  const QString& lastError() const { return lastError_; }
  void showGettingStarted();
  /// Writes the session's HTML report to `path` off the GUI thread (running the sweep first
  /// when the window has none that is current); reportExport() signals the end.
  void exportReport(const QString& path);
  ReportExport* reportExport() const { return report_; }

 signals:
  void busyChanged(bool busy);
  /// A live update was drawn (after the widgets took it).
  void liveUpdated(const barrow::ui::LiveUpdate& u);

 protected:
  void closeEvent(QCloseEvent* e) override;
  void showEvent(QShowEvent* e) override;
  void dragEnterEvent(QDragEnterEvent* e) override;
  void dropEvent(QDropEvent* e) override;
  void resizeEvent(QResizeEvent* e) override;
  void moveEvent(QMoveEvent* e) override;

 private:
  std::optional<Which> askSide(const QString& path);
  QString importAsked(const QString& path);
  QString importInto(const QString& path, Which w);
  void saveLayout();
  void buildDocks();
  void buildMenus();
  void rebuildRecentMenu();
  void scheduleLive();
  void submitLive();
  void onLiveUpdate(const LiveUpdate& u);
  void checkIdle();
  void focusMeasure(const std::string& id);
  void reportError(const QString& title, const QString& text);
  void status(const QString& text);
  bool confirmDiscard();
  void updateTitle();
  void restoreLayout();
  void applyDefaultLayout();
  void offerRecovery();

  // File menu actions.
  void newSession();
  bool save();
  bool saveAsDialog();
  void importDialog(Which w);
  void exportCloudDialog(Which w);
  void exportFigureDialog(int which);  // 0 the Field, 1 the Sweep plot
  void exportTextDialog(const QString& title, const QString& defaultName, const std::string& text);
  void exportReportDialog();

  Options options_;
  SessionDocument* doc_;
  LiveEvaluator* live_;
  SessionFiles* files_;
  FieldPanel* field_;
  MeasuresPanel* measures_;
  SweepPanel* sweep_;
  FindingsPanel* findings_;
  ReportExport* report_ = nullptr;
  UncertaintyPane* uncertainty_;
  CriticPanel* critic_;
  GettingStarted* guide_ = nullptr;
  QLabel* busyLabel_;
  QMenu* recentMenu_ = nullptr;
  QTimer liveTimer_;
  QTimer layoutTimer_;  // keeps the geometry in the settings soon after it changes (a crash keeps it)
  Prompts prompts_;
  std::optional<double> theta_;
  QString lastError_;
  std::function<std::optional<Which>(const QString&)> dropChooser_;
  std::vector<std::function<void()>> idleWaiters_;
  bool lastBusy_ = false;
  bool layoutRestored_ = false;
  bool defaultLayoutApplied_ = false;
};

}  // namespace barrow::ui
