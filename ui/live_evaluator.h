// Keeps every measure's value current while the user edits: one long-lived worker thread
// evaluates the newest request only ("newest request wins"). Cheap measures and the exact
// plan come first in one update; slow measures (Measure::cheap() == false), the entropic
// plan and the potential map follow one by one and are abandoned as soon as a newer request
// arrives. Results reach the GUI thread as queued calls tagged with their request number.
#pragma once

#include <Eigen/Core>
#include <QObject>
#include <atomic>
#include <condition_variable>
#include <map>
#include <memory>
#include <mutex>
#include <optional>
#include <thread>
#include <vector>

#include "cloud/cloud.h"
#include "measures/measure.h"
#include "sweep/sweep_settings.h"

namespace barrow::ui {

/// A regular grid for the potential heat map: cell centres x0 + k·dx, y0 + l·dy.
struct GridSpec {
  double x0 = 0, y0 = 0, dx = 1, dy = 1;
  int nx = 0, ny = 0;
};

/// Where A is taken along the sweep family: the Field shows A_θ, and the "change" column
/// compares with A at the reference θ₀.
struct FamilyView {
  SweepSettings settings;
  std::optional<double> theta;        // none: A as drawn (the cursor is not in use)
  double reference = 0.0;             // θ₀
};

struct LiveRequest {
  Cloud a, b;                         // A as drawn (before the family moves it), B
  std::optional<FamilyView> family;   // none: no reference, A as drawn
  ParamSet params;
  std::vector<const Measure*> measures;
  std::string planId;                 // measure whose plan is drawn ("w2", "w1", "" = none)
  bool entropicPlan = false;          // also the plan of the "entropic" measure
  std::optional<GridSpec> potential;  // W1 potential heat map on this grid
  /// Part of a continuous gesture (a drag): slow work starts only once no newer request
  /// came for `slowDelayMs`, so it neither competes for the cores nor delays the next
  /// cheap update while the pointer moves.
  bool interactive = false;
  int slowDelayMs = 150;
};

struct LiveItem {
  std::string id;
  Result result;
  std::optional<Result> reference;  // same measure at the reference θ
};

/// One delivery to the GUI thread. Later updates of the same request add items.
struct LiveUpdate {
  quint64 request = 0;
  std::vector<LiveItem> items;
  std::vector<std::string> pending;   // ids still being computed for this request
  bool final = false;                 // nothing more will come for this request
  double secondsSinceSubmit = 0;
  std::optional<Eigen::MatrixXd> potential;  // ny × nx values on the request's grid (row = y)
  std::optional<GridSpec> grid;
  std::string potentialMessage;       // why there is no potential map, if asked for
  std::optional<Cloud> shownA;        // first update only: the A the values and plans refer to
  std::string familyMessage;          // why the family could not move A, if it could not
};

class LiveEvaluator : public QObject {
  Q_OBJECT
 public:
  explicit LiveEvaluator(QObject* parent = nullptr);
  ~LiveEvaluator() override;

  /// Queues `req`, replacing any request not yet started and stopping slow work on an older
  /// one. Returns the request number that its updates will carry.
  quint64 submit(LiveRequest req);
  quint64 latest() const { return latest_; }
  /// True from submit() until the final update of the newest request was delivered.
  bool busy() const { return busy_; }

 signals:
  void updated(const barrow::ui::LiveUpdate& update);
  void busyChanged(bool busy);

 private:
  void loop();
  void run(quint64 id, const LiveRequest& req, std::chrono::steady_clock::time_point t0);
  void deliver(LiveUpdate u);
  /// Waits up to `ms` for a newer request; true when one arrived (or on shutdown).
  bool newerRequestWithin(int ms);
  Result evaluateOne(const Measure& m, const Cloud& a, const Cloud& b, const ParamSet& params,
                     bool wantPlan, const RunControl* control, bool useWarm);
  std::optional<Result> referenceOf(const Measure& m, const std::optional<Cloud>& refA,
                                    const LiveRequest& req, const RunControl* control);
  /// A_θ and A_θ₀ for the request (A and nullopt without a family); sets `message` on failure.
  std::pair<Cloud, std::optional<Cloud>> placeA(const LiveRequest& req, std::string* message);

  std::thread thread_;
  std::mutex mutex_;
  std::condition_variable wake_;
  std::optional<LiveRequest> pending_;
  quint64 pendingId_ = 0;
  std::chrono::steady_clock::time_point pendingAt_;
  bool quit_ = false;
  std::atomic<bool> stopSlow_{false};  // a newer request arrived: abandon slow work
  std::atomic<bool> shutdown_{false};

  // Worker-thread state.
  std::map<std::string, std::shared_ptr<WarmState>> warm_;
  struct RefKey {
    Cloud a, b;
    ParamSet params;
  };
  std::optional<RefKey> refKey_;
  std::map<std::string, Result> refCache_;
  struct FamilyKey {
    Cloud a, b;
    SweepSettings settings;
  };
  std::optional<FamilyKey> familyKey_;
  std::shared_ptr<class FamilyMapHolder> familyMap_;

  // GUI-thread state.
  quint64 latest_ = 0;
  bool busy_ = false;
};

}  // namespace barrow::ui

Q_DECLARE_METATYPE(barrow::ui::LiveUpdate)
