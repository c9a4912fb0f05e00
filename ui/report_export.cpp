#include "report_export.h"

#include <QFileInfo>
#include <QPromise>
#include <QtConcurrent/QtConcurrentRun>

#include "measures/registry.h"
#include "base/run_control.h"
#include "report/report_build.h"
#include "report/report_html.h"
#include "sweep/continuity.h"
#include "sweep/sweep_engine.h"

namespace barrow::ui {

namespace {

struct Job {
  std::string path;
  Session session;
  std::string sessionFile;
  std::optional<SweepResult> sweep;
  std::vector<Finding> findings;
};

// Stages share the bar: the sweep (when it has to run) 0–80 %, measures and plan after.
QString runJob(Job job, const std::atomic<bool>* cancel, QPromise<QString>& promise) {
  auto control = [&](double from, double to, const char* stage) {
    RunControl c;
    c.cancel = cancel;
    c.onProgress = [&promise, from, to, stage](double f) {
      promise.setProgressValueAndText(int(1000 * (from + (to - from) * std::clamp(f, 0.0, 1.0))), stage);
      return !promise.isCanceled();
    };
    return c;
  };
  const Session& s = job.session;
  double gatherFrom = 0.0;
  if (!job.sweep) {
    SweepRequest req;
    req.settings = s.sweep;
    req.settings.measures = s.selected;
    if (req.settings.measures.empty())
      for (const Measure* m : MeasureRegistry::instance().defaults()) req.settings.measures.push_back(m->id());
    req.params = s.params;
    const RunControl c = control(0.0, 0.8, "Sweeping");
    SweepResult r = runSweep(s.a, s.b, req, &c);
    if (r.cancelled || (cancel && cancel->load())) return "cancelled";
    if (r.theta.empty()) return QString::fromStdString("the sweep could not run: " + r.message);
    job.findings = findContinuity(r);
    job.sweep = std::move(r);
    gatherFrom = 0.8;
  }
  ReportSources src;
  src.sessionFile = job.sessionFile;
  src.title = job.sessionFile.empty() ? std::string() : QFileInfo(QString::fromStdString(job.sessionFile)).completeBaseName().toStdString();
  src.out = QFileInfo(QString::fromStdString(job.path)).fileName().toStdString();
  src.params = s.params;
  const RunControl c = control(gatherFrom, 0.98, "Measuring");
  bool cancelled = false;
  const ReportInput in = gatherReport(s.a, s.b, src, std::move(*job.sweep), std::move(job.findings), &c, &cancelled);
  if (cancelled) return "cancelled";
  promise.setProgressValueAndText(990, "Writing");
  if (auto e = writeReportHtml(job.path, in)) return QString::fromStdString(*e);
  return {};
}

}  // namespace

ReportExport::ReportExport(QObject* parent) : QObject(parent) { pool_.setMaxThreadCount(1); }

ReportExport::~ReportExport() {
  cancel();
  pool_.waitForDone();
}

void ReportExport::start(const QString& path, const Session& s, const QString& sessionFile,
                         std::optional<SweepResult> sweep, std::vector<Finding> findings) {
  cancel();
  const quint64 id = ++latest_;
  cancel_ = std::make_shared<std::atomic<bool>>(false);
  auto flag = cancel_;
  Job job{path.toStdString(), s, sessionFile.toStdString(), std::move(sweep), std::move(findings)};
  QFuture<QString> future = QtConcurrent::run(&pool_, [job = std::move(job), flag](QPromise<QString>& promise) {
    promise.setProgressRange(0, 1000);
    promise.addResult(runJob(job, flag.get(), promise));
  });
  auto* w = new QFutureWatcher<QString>(this);
  connect(w, &QFutureWatcherBase::progressValueChanged, this, [this, w, id](int v) {
    if (id == latest_) emit progress(v / 1000.0, w->progressText());
  });
  connect(w, &QFutureWatcherBase::finished, this, [this, w, id, path] {
    w->deleteLater();
    if (id != latest_) return;  // a newer export took over
    running_ = false;
    emit finished(path, w->future().resultCount() ? w->future().result() : QStringLiteral("cancelled"));
  });
  w->setFuture(future);
  running_ = true;
}

void ReportExport::cancel() {
  if (cancel_) *cancel_ = true;
}

}  // namespace barrow::ui
