// One undoable edit: the session state before and after (clouds, settings). Exact by
// construction: undo reinstalls the saved state bit for bit.
#pragma once

#include <QUndoCommand>

#include "io/session_io.h"

namespace barrow::ui {

class SessionDocument;

class SessionEditCommand : public QUndoCommand {
 public:
  /// `applied`: the document already holds `after` (a committed drag), so the first
  /// redo() that QUndoStack::push() performs does nothing.
  SessionEditCommand(SessionDocument* doc, Session before, quint64 beforeRevision, Session after,
                     quint64 afterRevision, const QString& text, bool applied);
  void undo() override;
  void redo() override;

 private:
  SessionDocument* doc_;
  Session before_;
  Session after_;
  quint64 beforeRevision_, afterRevision_;  // SessionDocument::revision() of each state
  bool skipRedo_;
};

}  // namespace barrow::ui
