#include "sweep/sweep_engine.h"

#include <algorithm>
#include <atomic>
#include <chrono>
#include <cstdio>
#include <cstdlib>
#include <limits>
#include <cmath>
#include <mutex>
#include <thread>

#include "base/busy_probe.h"
#include "families/family_map.h"
#include "measures/registry.h"
#include "measures/units.h"
#include "sweep/finite_slope.h"
#include "sweep/sweep_job.h"

namespace barrow {

namespace {

struct Row {
  double theta = 0.0;
  std::vector<SweepCell> cells;
};

// Share of the progress bar given to the grid when refinement follows it.
constexpr double kGridShare = 0.85;

class SweepRun {
 public:
  SweepRun(const Cloud& b, const FamilyMap& family, const std::vector<SweepJob>& jobs,
           const SweepRequest& req, const RunControl* control, int threads)
      : b_(b), family_(family), jobs_(jobs), req_(req), outer_(control), threads_(threads),
        warm_(std::size_t(threads), std::vector<std::shared_ptr<WarmState>>(jobs.size())) {
    // Measures see the caller's cancel flag directly, and our own stop (set when the
    // caller's progress callback says stop) through the progress hook.
    inner_.cancel = outer_ && outer_->cancel ? outer_->cancel : &stop_;
    inner_.onProgress = [this](double) { return !stop_.load(); };
    needVelocity_ = std::any_of(jobs.begin(), jobs.end(), [](const SweepJob& j) { return j.analytic(); });
  }

  const RunControl* inner() const { return &inner_; }
  bool stopped() const {
    return stop_.load() || (inner_.cancel && inner_.cancel->load(std::memory_order_relaxed));
  }

  /// Evaluates every measure at each row (rows sorted by θ), split into contiguous chunks,
  /// one per thread, so that warm starts pass between neighbouring θ.
  void evaluate(std::vector<Row*>& rows, double progressFrom, double progressTo) {
    const int t = std::max(1, std::min<int>(threads_, int(rows.size())));
    // The budget is shared: t sweep threads leave each measure threads_ / t (row teams and
    // block runners inside a measure read it from the control), so the cores are never
    // oversubscribed by nesting.
    inner_.threads = std::max(1, threads_ / t);
    std::atomic<std::size_t> done{0};
    auto work = [&](int chunk) {
      const BusyScope busy;
      const std::size_t lo = rows.size() * std::size_t(chunk) / std::size_t(t);
      const std::size_t hi = rows.size() * std::size_t(chunk + 1) / std::size_t(t);
      for (std::size_t k = lo; k < hi && !stopped(); ++k) {
        Row& row = *rows[k];
        const Cloud at = family_.at(row.theta);
        const Eigen::MatrixX2d vel = needVelocity_ ? family_.velocity(row.theta) : Eigen::MatrixX2d();
        for (std::size_t j = 0; j < jobs_.size() && !stopped(); ++j) {
          auto* warm = req_.warmStart ? &warm_[std::size_t(chunk)][j] : nullptr;
          row.cells[j] = jobs_[j].evaluate(at, b_, vel, warm, &inner_);
        }
        const double f = double(++done) / double(rows.size());
        report(progressFrom + (progressTo - progressFrom) * f);
      }
    };
    std::vector<std::thread> pool;
    for (int c = 1; c < t; ++c) pool.emplace_back(work, c);
    work(0);
    for (auto& th : pool) th.join();
  }

 private:
  void report(double fraction) {
    if (!outer_) return;
    std::lock_guard<std::mutex> lock(reportMutex_);
    if (outer_->shouldStop(std::min(fraction, 1.0))) stop_ = true;
  }

  const Cloud& b_;
  const FamilyMap& family_;
  const std::vector<SweepJob>& jobs_;
  const SweepRequest& req_;
  const RunControl* outer_;
  int threads_;
  std::vector<std::vector<std::shared_ptr<WarmState>>> warm_;  // [thread][measure]
  RunControl inner_;
  std::atomic<bool> stop_{false};
  std::mutex reportMutex_;
  bool needVelocity_ = false;
};

std::vector<Row*> sortedRows(std::vector<std::unique_ptr<Row>>& rows) {
  std::vector<Row*> out;
  for (auto& r : rows) out.push_back(r.get());
  std::sort(out.begin(), out.end(), [](const Row* x, const Row* y) { return x->theta < y->theta; });
  return out;
}

/// Midpoints of the intervals some series finds jump-like and wider than `tol`, at most
/// `room` of them. The budget is shared fairly: the measure that has spent least takes the
/// next point, and a measure past its fair share (budget / measures with suspects) waits while
/// another with suspects is under its own, so one measure's many suspects (a histogram crossing
/// many bin edges) cannot starve another's single one. Within a measure the work is depth
/// first: suspects already narrowed come first, and a round takes only as many suspects as the
/// measure's remaining points can bisect all the way down to `tol` — a few confirmed jumps say
/// more than many half-bisected ones. `spent` (per measure, kept across rounds) is updated.
std::vector<double> refinementPoints(const std::vector<Row*>& rows, std::size_t measures, const StepRule& rule,
                                     double tol, std::size_t room, int budget, std::vector<int>& spent) {
  std::vector<double> theta(rows.size());
  for (std::size_t k = 0; k < rows.size(); ++k) theta[k] = rows[k]->theta;
  struct Suspect {
    double width, priority, mid;
  };
  std::vector<std::vector<Suspect>> wanted(measures);
  std::vector<double> value(rows.size());
  for (std::size_t j = 0; j < measures; ++j) {
    for (std::size_t k = 0; k < rows.size(); ++k) value[k] = rows[k]->cells[j].value;
    const double range = finiteRange(value);
    for (const StepInterval& s : classifySteps(theta, value, rule)) {
      const double width = theta[s.right] - theta[s.left];
      if (!s.jumpLike || width <= tol) continue;
      const double priority = std::isfinite(s.step) ? std::abs(s.step) / std::max(range, 1e-300) : 2.0;
      wanted[j].push_back({width, priority, 0.5 * (theta[s.left] + theta[s.right])});
    }
    std::stable_sort(wanted[j].begin(), wanted[j].end(), [](const Suspect& x, const Suspect& y) {
      return x.width != y.width ? x.width < y.width : x.priority > y.priority;
    });
  }
  spent.resize(measures, 0);
  int sharing = 0;
  for (std::size_t j = 0; j < measures; ++j) sharing += !wanted[j].empty() || spent[j] > 0;
  const int share = std::max(1, budget / std::max(1, sharing));
  for (std::size_t j = 0; j < measures; ++j) {
    if (wanted[j].empty()) continue;
    const int levels = std::max(1, int(std::ceil(std::log2(wanted[j].back().width / tol))));
    const int points = spent[j] < share ? share - spent[j] : int(room);
    wanted[j].resize(std::min(wanted[j].size(), std::size_t(std::max(1, points / levels))));
  }
  std::vector<std::size_t> next(measures, 0);
  std::vector<double> out;
  // A measure under its share with suspects left keeps the others at their share this round:
  // its bisection goes one level per round, so the room must wait for its next suspects.
  bool underShareWaiting = false;
  for (std::size_t j = 0; j < measures; ++j)
    if (!wanted[j].empty() && spent[j] < share) underShareWaiting = true;
  while (out.size() < room) {
    std::size_t pick = measures;
    for (std::size_t j = 0; j < measures; ++j) {
      if (next[j] >= wanted[j].size() || (underShareWaiting && spent[j] >= share)) continue;
      if (pick == measures || spent[j] < spent[pick]) pick = j;
    }
    if (pick == measures) break;
    const double mid = wanted[pick][next[pick]++].mid;
    if (std::find(out.begin(), out.end(), mid) == out.end()) {
      out.push_back(mid);
      ++spent[pick];
    }
  }
  return out;
}

/// Whether any series still has a jump-like interval wider than `tol` (refinement unfinished).
bool suspectsLeft(const std::vector<Row*>& rows, std::size_t measures, const StepRule& rule, double tol) {
  std::vector<int> scratch;
  return !refinementPoints(rows, measures, rule, tol, 1, 1, scratch).empty();
}

std::vector<const Measure*> pickMeasures(const SweepRequest& req, std::string* why) {
  if (!req.measureObjects.empty()) {
    if (std::count(req.measureObjects.begin(), req.measureObjects.end(), nullptr)) *why = "a measure object is null";
    return req.measureObjects;
  }
  const auto& registry = MeasureRegistry::instance();
  if (req.settings.measures.empty()) return registry.defaults();
  std::vector<const Measure*> out;
  for (const auto& id : req.settings.measures) {
    const Measure* m = registry.find(id);
    if (!m) {
      *why = "unknown or unavailable measure '" + id + "'";
      break;
    }
    out.push_back(m);
  }
  return out;
}

/// One series from the rows (sorted by θ): values as computed, slopes analytic where the
/// cell has one and finite differences elsewhere, never across a jump.
SweepSeries assembleSeries(const SweepJob& job, std::size_t j, const std::vector<Row*>& order,
                           const std::vector<double>& theta, const StepRule& rule) {
  SweepSeries ser;
  ser.id = job.measure().id();
  ser.frozen = job.frozen();
  ser.rules = job.rules();
  ser.details = job.referenceDetails();
  ser.gradientMethod = job.analytic() ? "analytic" : "finite-difference";
  ser.unit = measureUnit(job.measure(), job.frozen());
  for (const Row* r : order) {
    const SweepCell& c = r->cells[j];
    ser.value.push_back(c.value);
    ser.status.push_back(c.status);
    ser.seconds.push_back(c.seconds);
    ser.oneSided.push_back(c.oneSided);
    if (std::isfinite(c.accuracy)) ser.accuracy = std::max(ser.accuracy, c.accuracy);
    if (ser.message.empty() && !c.message.empty() && c.status != Status::Cancelled) ser.message = c.message;
  }
  std::vector<bool> jumpAfter(order.size(), false);
  for (const StepInterval& st : classifySteps(theta, ser.value, rule))
    if (st.jumpLike && st.right == st.left + 1) jumpAfter[st.left] = true;
  const std::vector<double> fd = finiteDifferenceSlopes(theta, ser.value, jumpAfter);
  int fallbacks = 0;
  for (std::size_t k = 0; k < order.size(); ++k) {
    const SweepCell& c = order[k]->cells[j];
    ser.slope.push_back(c.analyticSlope ? c.slope : fd[k]);
    if (!c.analyticSlope && job.analytic() && std::isfinite(c.value)) ++fallbacks;
  }
  if (fallbacks > 0) ser.details["gradient_fallbacks"] = fallbacks;
  if (!job.setupError().empty()) ser.message = job.setupError();
  return ser;
}

/// Bisects jump-like intervals (any series) until none is wider than the tolerance or the
/// point budget is spent; records what it did in `out`.
void refine(std::vector<std::unique_ptr<Row>>& rows, SweepRun& run, std::size_t measures,
            const SweepRequest& req, SweepResult& out) {
  const SweepSettings& s = req.settings;
  const double tol = req.thetaTolerance > 0 ? req.thetaTolerance : 1e-5 * (s.to - s.from);
  const int budget = refineBudgetFor(req);
  out.refineTolerance = tol;
  out.refineBudget = budget;
  std::vector<int> spent(measures, 0);  // refinement points each measure asked for
  while (!run.stopped()) {
    const int room = budget - out.refinedPoints;
    if (room <= 0) {
      out.refineBudgetHit = suspectsLeft(sortedRows(rows), measures, req.stepRule, tol);
      break;
    }
    std::vector<double> mids =
        refinementPoints(sortedRows(rows), measures, req.stepRule, tol, std::size_t(room), budget, spent);
    if (mids.empty()) break;
    std::sort(mids.begin(), mids.end());
    std::vector<Row*> fresh;
    for (double t : mids) {
      auto row = std::make_unique<Row>();
      row->theta = t;
      row->cells.resize(measures);
      fresh.push_back(row.get());
      rows.push_back(std::move(row));
    }
    const double f0 = kGridShare + (1 - kGridShare) * out.refinedPoints / budget;
    out.refinedPoints += int(mids.size());
    run.evaluate(fresh, f0, kGridShare + (1 - kGridShare) * out.refinedPoints / budget);
  }
}

std::optional<std::string> checkRequest(const SweepRequest& req) {
  if (req.maxRefinePoints > kMaxRefinePoints)
    return "the refinement budget is limited to " + std::to_string(kMaxRefinePoints) + " θ values";
  if (auto e = req.settings.validate()) return e;
  if (req.threads < 0) return "the thread count must be 0 (all cores) or positive";
  if (!(req.thetaTolerance >= 0) || !std::isfinite(req.thetaTolerance))
    return "the θ tolerance must be a finite number >= 0";
  if (req.maxRefinePoints < 0) return "the refinement budget must be >= 0";
  const StepRule& r = req.stepRule;
  if (!(r.factor > 1) || !std::isfinite(r.factor) || r.window < 1 || !(r.floor >= 0) || !std::isfinite(r.floor))
    return "the jump rule needs factor > 1, window >= 1 and floor >= 0";
  return std::nullopt;
}

}  // namespace

int refineBudgetFor(const SweepRequest& req) {
  return req.maxRefinePoints > 0 ? req.maxRefinePoints : std::max(64, req.settings.steps);
}

double gridTheta(const SweepSettings& s, int k) {
  if (k <= 0) return s.from;
  if (k + 1 >= s.steps) return s.to;
  const double t = s.from + (s.to - s.from) * double(k) / double(s.steps - 1);
  // Snap to the shortest nearby decimal (0.975, not 0.9750000000000001): the θ evaluated is
  // then exactly the number printed and read back. The move is a few ulps at most.
  char buf[32];
  std::snprintf(buf, sizeof buf, "%.15g", t);
  const double snapped = std::strtod(buf, nullptr);
  return std::abs(snapped - t) <= 4 * std::numeric_limits<double>::epsilon() * std::max(1.0, std::abs(t)) ? snapped : t;
}

SweepResult runSweep(const Cloud& a, const Cloud& b, const SweepRequest& req, const RunControl* control) {
  const auto start = std::chrono::steady_clock::now();
  SweepResult out;
  out.settings = req.settings;
  out.warmStart = req.warmStart;
  auto finish = [&](std::string message) {
    out.message = std::move(message);
    out.seconds = std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
    return out;
  };
  if (auto e = checkRequest(req)) return finish(*e);
  const SweepSettings& s = req.settings;

  std::string why;
  const std::vector<const Measure*> measures = pickMeasures(req, &why);
  if (!why.empty()) return finish(why);
  if (measures.empty()) return finish("no measure is available to sweep");

  const FamilyMap family(a, b, s);
  if (auto e = family.error()) return finish(*e);

  const int threads = req.threads > 0 ? req.threads : threadBudget(control);
  out.threads = threads;

  // Freeze data-dependent settings on (A_θ0, B) and probe each measure there once.
  const double theta0 = s.referenceTheta();
  out.referenceTheta = theta0;
  const Cloud a0 = family.at(theta0);
  const bool velocity = familySpec(s.family).pointsMove && req.analyticGradients;
  std::vector<SweepJob> jobs;
  jobs.reserve(measures.size());
  RunControl probeControl;
  if (control) probeControl.cancel = control->cancel;
  probeControl.threads = threads;  // the reference evaluations stay within the budget too
  for (const Measure* m : measures) jobs.emplace_back(*m, req.params, a0, b, velocity, &probeControl);

  std::vector<std::unique_ptr<Row>> rows;
  for (int k = 0; k < s.steps; ++k) {
    auto row = std::make_unique<Row>();
    row->theta = gridTheta(s, k);
    row->cells.resize(jobs.size());
    rows.push_back(std::move(row));
  }
  SweepRun run(b, family, jobs, req, control, threads);
  std::vector<Row*> order = sortedRows(rows);
  run.evaluate(order, 0.0, req.refineJumps ? kGridShare : 1.0);

  if (req.refineJumps && !run.stopped()) refine(rows, run, jobs.size(), req, out);

  order = sortedRows(rows);
  for (const Row* r : order) out.theta.push_back(r->theta);
  for (std::size_t j = 0; j < jobs.size(); ++j)
    out.series.push_back(assembleSeries(jobs[j], j, order, out.theta, req.stepRule));
  out.cancelled = run.stopped();
  return finish(out.cancelled ? "cancelled before the sweep finished; the rest is left empty" : "");
}

}  // namespace barrow
