#include "session_edit_command.h"

#include "session_document.h"

namespace barrow::ui {

SessionEditCommand::SessionEditCommand(SessionDocument* doc, Session before, quint64 beforeRevision,
                                       Session after, quint64 afterRevision, const QString& text, bool applied)
    : QUndoCommand(text), doc_(doc), before_(std::move(before)), after_(std::move(after)),
      beforeRevision_(beforeRevision), afterRevision_(afterRevision), skipRedo_(applied) {}

void SessionEditCommand::undo() { doc_->apply(before_, beforeRevision_); }

void SessionEditCommand::redo() {
  if (skipRedo_) {
    skipRedo_ = false;
    return;
  }
  doc_->apply(after_, afterRevision_);
}

}  // namespace barrow::ui
