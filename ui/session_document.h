// The open session as the window sees it: the clouds, measure settings and sweep settings,
// the undo history of every edit, the file it belongs to and whether it has unsaved changes.
#pragma once

#include <QObject>
#include <QString>
#include <QUndoStack>
#include <optional>

#include "io/session_io.h"

namespace barrow::ui {

enum class Which { A, B };

/// Same name, points and weights (sizes checked first).
bool sessionCloudsEqual(const Cloud& x, const Cloud& y);
/// Same family, direction, pivot, range, steps, reference and measures.
bool sessionSweepsEqual(const SweepSettings& x, const SweepSettings& y);

class SessionDocument : public QObject {
  Q_OBJECT
 public:
  explicit SessionDocument(QObject* parent = nullptr);

  const Session& session() const { return session_; }
  const Cloud& cloud(Which w) const { return w == Which::A ? session_.a : session_.b; }
  QUndoStack* undoStack() { return &undo_; }

  /// Replaces the whole session (open, new): clears the history and marks it saved.
  void reset(const Session& s, const QString& path);
  const QString& path() const { return path_; }
  void setPath(const QString& p);
  bool isModified() const { return !undo_.isClean(); }
  void markSaved();

  // Edits: each is one undo step named by `text`.
  void setClouds(const Cloud& a, const Cloud& b, const QString& text);
  void setCloud(Which w, const Cloud& c, const QString& text);
  void setParam(const std::string& key, const std::string& value);
  void setSweep(const SweepSettings& s, const QString& text = tr("Change sweep"));
  void setSelected(const std::vector<std::string>& ids);

  /// A continuous edit (dragging points): preview() shows intermediate clouds without
  /// history entries; commitPreview() records one step from the state at beginPreview().
  void beginPreview();
  void preview(const Cloud& a, const Cloud& b);
  void commitPreview(const QString& text);
  void cancelPreview();
  bool previewing() const { return previewBase_.has_value(); }

  /// Names the session's content. Every edit, a drag's previews included, gets a new number;
  /// undo and redo go back to the number of the state they reinstall. A result computed at
  /// revision r is current exactly while isCurrent(r): the one test every pane and export uses.
  quint64 revision() const { return revision_; }
  bool isCurrent(quint64 revision) const { return revision == revision_; }
  /// A fresh revision number for a state about to be installed (undo commands).
  quint64 newRevision() { return ++lastRevision_; }

  /// Used by the undo commands: installs a state (known as `revision`) without recording history.
  void apply(const Session& s, quint64 revision);

 signals:
  void cloudsChanged();
  void paramsChanged();
  void sweepChanged();
  void selectionChanged();
  void modifiedChanged(bool modified);
  void pathChanged(const QString& path);
  /// The content changed (or went back to an earlier state): results may have become stale or current.
  void revisionChanged(quint64 revision);

 private:
  void push(const Session& after, const QString& text);

  Session session_;
  QString path_;
  QUndoStack undo_;
  std::optional<Session> previewBase_;
  quint64 previewBaseRevision_ = 0;
  quint64 revision_ = 0;
  quint64 lastRevision_ = 0;
};

}  // namespace barrow::ui
