// File → Export report…: writes the session's HTML report (core/report) on a worker thread.
// The window's sweep is used when it is current; otherwise the sweep is run first. Progress
// and cancel like the sweep's; only the newest export reports back.
#pragma once

#include <QFutureWatcher>
#include <QObject>
#include <QThreadPool>
#include <atomic>
#include <memory>
#include <optional>

#include "io/session_io.h"
#include "sweep/findings.h"
#include "sweep/sweep_result.h"

namespace barrow::ui {

class ReportExport : public QObject {
  Q_OBJECT
 public:
  explicit ReportExport(QObject* parent = nullptr);
  ~ReportExport() override;

  /// Starts writing `path` for session `s` (saved as `sessionFile`, or "" when unsaved).
  /// `sweep`/`findings`: the window's current sweep, or nullopt to run one first.
  void start(const QString& path, const Session& s, const QString& sessionFile, std::optional<SweepResult> sweep,
             std::vector<Finding> findings);
  void cancel();
  bool running() const { return running_; }

 signals:
  void progress(double fraction, const QString& stage);
  /// `error` is empty on success and "cancelled" when cancelled.
  void finished(const QString& path, const QString& error);

 private:
  struct Outcome {
    QString error;
  };
  quint64 latest_ = 0;
  bool running_ = false;
  std::shared_ptr<std::atomic<bool>> cancel_;
  QThreadPool pool_;
};

}  // namespace barrow::ui
