#include "session_edit_command.h"

#include "session_document.h"

namespace barrow::ui {

SessionEditCommand::SessionEditCommand(SessionDocument* doc, Session before, Session after,
                                       const QString& text, bool applied)
    : QUndoCommand(text), doc_(doc), before_(std::move(before)), after_(std::move(after)),
      skipRedo_(applied) {}

void SessionEditCommand::undo() { doc_->apply(before_); }

void SessionEditCommand::redo() {
  if (skipRedo_) {
    skipRedo_ = false;
    return;
  }
  doc_->apply(after_);
}

}  // namespace barrow::ui
