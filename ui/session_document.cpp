#include "session_document.h"

#include "session_edit_command.h"

namespace barrow::ui {

bool sessionCloudsEqual(const Cloud& x, const Cloud& y) {
  return x.name == y.name && x.points.rows() == y.points.rows() &&
         x.weights.size() == y.weights.size() && x.points == y.points && x.weights == y.weights;
}

bool sessionSweepsEqual(const SweepSettings& x, const SweepSettings& y) {
  return x.family == y.family && x.direction == y.direction && x.center == y.center &&
         x.from == y.from && x.to == y.to && x.steps == y.steps && x.reference == y.reference &&
         x.measures == y.measures;
}

SessionDocument::SessionDocument(QObject* parent) : QObject(parent) {
  undo_.setUndoLimit(500);
  connect(&undo_, &QUndoStack::cleanChanged, this,
          [this](bool clean) { emit modifiedChanged(!clean); });
}

void SessionDocument::reset(const Session& s, const QString& path) {
  previewBase_.reset();
  undo_.clear();
  apply(s, newRevision());
  setPath(path);
  undo_.setClean();
  emit modifiedChanged(false);
}

void SessionDocument::setPath(const QString& p) {
  if (p == path_) return;
  path_ = p;
  emit pathChanged(path_);
}

void SessionDocument::markSaved() { undo_.setClean(); }

void SessionDocument::apply(const Session& s, quint64 revision) {
  const bool clouds = !sessionCloudsEqual(s.a, session_.a) || !sessionCloudsEqual(s.b, session_.b);
  const bool params = s.params.values() != session_.params.values();
  const bool sweep = !sessionSweepsEqual(s.sweep, session_.sweep);
  const bool selected = s.selected != session_.selected;
  session_ = s;
  const bool revised = revision != revision_;
  revision_ = revision;
  if (clouds) emit cloudsChanged();
  if (params) emit paramsChanged();
  if (sweep) emit sweepChanged();
  if (selected) emit selectionChanged();
  if (revised) emit revisionChanged(revision_);
}

void SessionDocument::push(const Session& after, const QString& text) {
  undo_.push(new SessionEditCommand(this, session_, revision_, after, newRevision(), text, false));
}

void SessionDocument::setClouds(const Cloud& a, const Cloud& b, const QString& text) {
  if (previewBase_) cancelPreview();
  Session s = session_;
  s.a = a;
  s.b = b;
  push(s, text);
}

void SessionDocument::setCloud(Which w, const Cloud& c, const QString& text) {
  setClouds(w == Which::A ? c : session_.a, w == Which::B ? c : session_.b, text);
}

void SessionDocument::setParam(const std::string& key, const std::string& value) {
  const auto& v = session_.params.values();
  if (auto it = v.find(key); it != v.end() && it->second == value) return;
  Session s = session_;
  s.params.set(key, value);
  push(s, tr("Set %1 = %2").arg(QString::fromStdString(key), QString::fromStdString(value)));
}

void SessionDocument::setSweep(const SweepSettings& sw, const QString& text) {
  if (sessionSweepsEqual(sw, session_.sweep)) return;
  Session s = session_;
  s.sweep = sw;
  push(s, text);
}

void SessionDocument::setSelected(const std::vector<std::string>& ids) {
  if (ids == session_.selected) return;
  Session s = session_;
  s.selected = ids;
  push(s, tr("Choose measures"));
}

void SessionDocument::beginPreview() {
  if (previewBase_) return;
  previewBase_ = session_;
  previewBaseRevision_ = revision_;
}

void SessionDocument::preview(const Cloud& a, const Cloud& b) {
  beginPreview();
  session_.a = a;
  session_.b = b;
  revision_ = newRevision();
  emit cloudsChanged();
  emit revisionChanged(revision_);
}

void SessionDocument::commitPreview(const QString& text) {
  if (!previewBase_) return;
  Session before = std::move(*previewBase_);
  previewBase_.reset();
  if (sessionCloudsEqual(before.a, session_.a) && sessionCloudsEqual(before.b, session_.b)) {
    apply(before, previewBaseRevision_);  // nothing moved after all: the results stay current
    return;
  }
  undo_.push(new SessionEditCommand(this, std::move(before), previewBaseRevision_, session_, revision_, text, true));
}

void SessionDocument::cancelPreview() {
  if (!previewBase_) return;
  Session before = std::move(*previewBase_);
  previewBase_.reset();
  apply(before, previewBaseRevision_);
}

}  // namespace barrow::ui
