#include "session_files.h"

#include <QDir>
#include <QFileInfo>
#include <QSettings>
#include <QStandardPaths>

#include "io/atomic_write.h"
#include "io/cloud_file.h"
#include "io/csv_io.h"

namespace barrow::ui {

namespace {

constexpr int kMaxRecent = 8;

std::string local(const QString& p) { return QDir::toNativeSeparators(p).toStdString(); }

}  // namespace

SessionFiles::SessionFiles(SessionDocument* doc, std::function<nlohmann::json()> viewOptions, QObject* parent)
    : QObject(parent), doc_(doc), viewOptions_(std::move(viewOptions)) {
  connect(&autosave_, &QTimer::timeout, this, &SessionFiles::autosaveNow);
  editAutosave_.setSingleShot(true);
  editAutosave_.setInterval(kEditAutosaveMs);
  connect(&editAutosave_, &QTimer::timeout, this, &SessionFiles::autosaveNow);
  auto edited = [this] {
    if (autosave_.isActive()) editAutosave_.start();  // only where autosave is on (not in screenshots)
  };
  connect(doc_, &SessionDocument::cloudsChanged, this, edited);
  connect(doc_, &SessionDocument::paramsChanged, this, edited);
  connect(doc_, &SessionDocument::sweepChanged, this, edited);
}

bool SessionFiles::isSessionFile(const QString& path) {
  const QString s = QFileInfo(path).suffix().toLower();
  return s == "json" || s == "barrow";
}

Session SessionFiles::sessionForDisk() const {
  Session s = doc_->session();
  if (viewOptions_) s.view = viewOptions_();
  return s;
}

QString SessionFiles::openSession(const QString& path) {
  if (isSessionFile(path)) {
    auto loaded = readSession(local(path));
    if (!loaded) return QString::fromStdString(loaded.error.text());
    doc_->reset(*loaded.value, path);
    addRecent(path);
    emit sessionOpened(*loaded.value);
    return {};
  }
  // A cloud file becomes A (an undoable edit): B, the settings and the history stay.
  const QString e = importCloud(path, Which::A);
  if (e.isEmpty()) addRecent(path);
  return e;
}

QString SessionFiles::save(const QString& path) {
  if (auto e = writeSession(local(path), sessionForDisk(), saveFault_)) return QString::fromStdString(*e);
  doc_->setPath(path);
  doc_->markSaved();
  addRecent(path);
  discardRecovery();
  return {};
}

QString SessionFiles::importCloud(const QString& path, Which w) {
  auto cloud = readCloudFile(local(path));
  if (!cloud) return QString::fromStdString(cloud.error.text());
  doc_->setCloud(w, *cloud.value,
                 tr("Import %1 into %2").arg(QFileInfo(path).fileName(), w == Which::A ? "A" : "B"));
  return {};
}

QString SessionFiles::exportCloud(const QString& path, Which w) const {
  if (auto e = writeCloudFile(local(path), doc_->cloud(w))) return QString::fromStdString(*e);
  return {};
}

QString SessionFiles::writeText(const QString& path, const std::string& text) {
  if (auto e = atomicWriteFile(local(path), text)) return QString::fromStdString(*e);
  return {};
}

QStringList SessionFiles::recentFiles() const {
  return QSettings().value("files/recent").toStringList();
}

void SessionFiles::addRecent(const QString& path) {
  const QString abs = QFileInfo(path).absoluteFilePath();
  QStringList list = recentFiles();
  list.removeAll(abs);
  list.prepend(abs);
  while (list.size() > kMaxRecent) list.removeLast();
  QSettings().setValue("files/recent", list);
  emit recentChanged();
}

void SessionFiles::clearRecent() {
  QSettings().remove("files/recent");
  emit recentChanged();
}

QString SessionFiles::recoveryPath() const {
  const QString dir = QStandardPaths::writableLocation(QStandardPaths::AppLocalDataLocation);
  QDir().mkpath(dir);
  return dir + "/recovery.barrow.json";
}

void SessionFiles::startAutosave(int intervalMs) { autosave_.start(intervalMs); }

void SessionFiles::autosaveNow() {
  if (!doc_->isModified()) return;
  Session s = sessionForDisk();
  // Remember where the work belongs, so a restored session can be saved back there.
  s.view["recoveredFrom"] = doc_->path().toStdString();
  writeSession(local(recoveryPath()), s);  // best effort; a failed autosave changes nothing
}

std::optional<Session> SessionFiles::pendingRecovery(QString* error) const {
  const QString p = recoveryPath();
  if (!QFileInfo::exists(p)) return std::nullopt;
  auto loaded = readSession(local(p));
  if (!loaded) {
    if (error) *error = QString::fromStdString(loaded.error.text());
    return std::nullopt;
  }
  return *loaded.value;
}

void SessionFiles::discardRecovery() { QFile::remove(recoveryPath()); }

}  // namespace barrow::ui
