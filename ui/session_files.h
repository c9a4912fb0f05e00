// The session's life on disk: open (a session or a cloud file), save and save-as (atomic,
// via the engine's writeSession), import/export of single clouds (CSV/.npy), the recent
// files list, and autosave to a recovery file that is offered back after a crash.
#pragma once

#include <QObject>
#include <QStringList>
#include <QTimer>
#include <functional>
#include <optional>

#include "session_document.h"

namespace barrow::ui {

class SessionFiles : public QObject {
  Q_OBJECT
 public:
  /// `viewOptions` is asked for the GUI options stored in a saved session.
  SessionFiles(SessionDocument* doc, std::function<nlohmann::json()> viewOptions, QObject* parent = nullptr);

  /// Each returns the error text (naming file, line and reason), empty on success. On error
  /// the open session is untouched.
  QString openSession(const QString& path);
  QString save(const QString& path);
  QString importCloud(const QString& path, Which w);
  QString exportCloud(const QString& path, Which w) const;
  /// Writes text atomically (exports of tables, plans, sweeps).
  static QString writeText(const QString& path, const std::string& text);

  /// True for names the session reader handles (.json, .barrow).
  static bool isSessionFile(const QString& path);

  QStringList recentFiles() const;
  void addRecent(const QString& path);
  void clearRecent();

  /// Recovery file: written every `intervalMs` while there are unsaved changes, and
  /// kEditAutosaveMs after each edit of the clouds, settings or sweep (a burst of edits, as
  /// in a drag, gives one write). Always atomic: a crash leaves the previous autosave.
  void startAutosave(int intervalMs);
  static constexpr int kEditAutosaveMs = 500;
  void autosaveNow();
  QString recoveryPath() const;
  /// The recovery file's session, if one was left by a run that did not close cleanly.
  std::optional<Session> pendingRecovery(QString* error) const;
  void discardRecovery();
  /// Test hook: saves (not autosaves) fail as this fault says (nullptr: none).
  void setSaveFault(const WriteFault* fault) { saveFault_ = fault; }

 signals:
  void recentChanged();
  void sessionOpened(const Session& s);

 private:
  Session sessionForDisk() const;

  SessionDocument* doc_;
  std::function<nlohmann::json()> viewOptions_;
  QTimer autosave_;
  QTimer editAutosave_;  // single shot, restarted by each edit
  const WriteFault* saveFault_ = nullptr;
};

}  // namespace barrow::ui
