// barrow-cli measure --a A.csv --b B.csv [--measures ids] [--set k=v ...] [--json]
#include <algorithm>
#include <condition_variable>
#include <chrono>
#include <cmath>
#include <mutex>
#include <thread>
#include <cstdio>
#include <iostream>
#include <nlohmann/json.hpp>

#include "base/number_text.h"
#include "cli/cli_common.h"
#include "cli/commands.h"
#include "cli/interrupt.h"
#include "cli/progress_line.h"
#include "measures/details_text.h"
#include "measures/evaluate.h"
#include "measures/measure_json.h"
#include "measures/time_estimate.h"
#include "measures/units.h"

namespace barrow::cli {

// Runs expected to take longer than this many seconds say so before they start.
constexpr double kForecastAbove = 5.0;

int runMeasure(const std::vector<std::string>& argv) {
  const CliArgs args("measure", argv, {"a", "b", "measures"}, {"json"});
  const Cloud a = loadCloud(args.required("a"));
  const Cloud b = loadCloud(args.required("b"));
  EvalRequest req;
  req.params = parseSets(args);
  const auto measures = selectMeasures(args);

  // A forecast first when the whole run would take a while (stderr; stdout stays the result).
  std::vector<double> forecast(measures.size(), 0.0);
  double total = 0.0;
  bool entropicBefore = false;
  for (std::size_t k = 0; k < measures.size(); ++k) {
    const std::string& id = measures[k]->id();
    if (auto e = estimateTime(id, a.size(), b.size(), 0)) forecast[k] = e->seconds;
    if (id == "sinkhorn" && entropicBefore)  // its A–B solve is entropic's, shared
      forecast[k] = std::max(0.0, forecast[k] - estimateTime("entropic", a.size(), b.size(), 0)->seconds);
    entropicBefore = entropicBefore || id == "entropic";
    total += forecast[k];
  }
  if (total > kForecastAbove) {
    std::fprintf(stderr, "barrow-cli: %zu + %zu points; this may take about %s (rough forecast from the "
                 "reference machine; Ctrl+C stops after the current measure):\n",
                 a.size(), b.size(), estimateText(total).c_str());
    for (std::size_t k = 0; k < measures.size(); ++k)
      if (forecast[k] >= 0.1 * kForecastAbove)
        std::fprintf(stderr, "  %-11s about %s\n", measures[k]->id().c_str(), estimateText(forecast[k]).c_str());
  }

  // Progress: the running measure's own reports where it gives them, its forecast where not;
  // a ticker thread keeps the line moving through measures that report nothing.
  struct State {
    std::mutex mutex;
    std::size_t index = 0;
    double started = 0.0, fraction = -1.0, spent = 0.0, forecastDone = 0.0;
  } st;
  ProgressLine progress;
  auto tick = [&] {
    std::lock_guard<std::mutex> lock(st.mutex);
    if (st.index >= measures.size()) return;
    const std::size_t k = st.index;
    const double own = progress.elapsed() - st.started, f = st.fraction;
    // Measures still to come: their forecasts, scaled by how the finished ones compared.
    const double scale = st.forecastDone > 0.5 ? std::clamp(st.spent / st.forecastDone, 0.2, 5.0) : 1.0;
    double later = 0.0;
    for (std::size_t j = k + 1; j < measures.size(); ++j) later += forecast[j] * scale;
    const double current = f > 0.05 ? own * (1.0 - f) / f : std::max(0.0, forecast[k] * scale - own);
    const double part = f >= 0.0 ? f : std::min(0.95, own / std::max(1e-9, forecast[k] * scale));
    const double whole = total > 0 ? (st.forecastDone + forecast[k] * part) / total : 0.0;
    progress.show(measures[k]->id() + " (" + std::to_string(k + 1) + "/" + std::to_string(measures.size()) + ")",
                  whole, current + later);
  };
  bool finished = false;  // guarded by tickMutex; the ticker wakes at once when it is set
  std::mutex tickMutex;
  std::condition_variable tickWake;
  std::thread ticker([&] {
    std::unique_lock<std::mutex> lock(tickMutex);
    while (!tickWake.wait_for(lock, std::chrono::milliseconds(200), [&] { return finished; })) {
      lock.unlock();
      tick();
      lock.lock();
    }
  });
  RunControl control;
  control.cancel = interruptFlag();
  control.onProgress = [&](double f) {
    std::lock_guard<std::mutex> lock(st.mutex);
    st.fraction = std::max(st.fraction, std::clamp(f, 0.0, 1.0));
    return true;
  };
  req.control = &control;
  nlohmann::json out = {{"measures", nlohmann::json::array()}};
  std::vector<std::string> unusable;  // "id: reason" for measures the input cannot feed
  std::size_t done = 0;
  for (std::size_t k = 0; k < measures.size() && !interrupted(); ++k) {
    const Measure* m = measures[k];
    {
      std::lock_guard<std::mutex> lock(st.mutex);
      st.index = k;
      st.started = progress.elapsed();
      st.fraction = -1.0;
    }
    const Result r = evaluateMeasure(*m, a, b, req);
    {
      std::lock_guard<std::mutex> lock(st.mutex);
      st.spent += r.seconds;
      st.forecastDone += forecast[k];
    }
    if (r.status == Status::Cancelled) break;
    ++done;
    if (r.status == Status::InvalidInput) unusable.push_back(m->id() + ": " + r.message);
    const std::string unit = measureUnit(*m, req.params);
    out["measures"].push_back(measureRowJson(*m, r, req.params));
    if (!args.flag("json")) {
      const std::string shown = shortestText(r.value) + " " + unit;  // the unit right beside the number
      std::printf("%-10s %-36s %-14s %8.3f ms\n", m->id().c_str(), shown.c_str(), statusName(r.status),
                  r.seconds * 1e3);
      if (!r.message.empty()) std::printf("%-10s note: %s\n", "", r.message.c_str());
      for (const auto& line : detailLines(r.details)) std::printf("%-10s %s\n", "", line.c_str());
    }
  }
  {
    std::lock_guard<std::mutex> lock(tickMutex);
    finished = true;
  }
  tickWake.notify_all();
  ticker.join();
  progress.finish("measured " + std::to_string(done) + " of " + std::to_string(measures.size()) + " in " +
                  estimateText(progress.elapsed()));
  if (args.flag("json")) std::cout << out.dump() << "\n";
  if (interrupted()) {
    std::fprintf(stderr, "barrow-cli: interrupted; %zu of %zu measures finished (shown above)\n", done, measures.size());
    return kExitInterrupted;
  }
  if (!unusable.empty()) {
    // The values that could be computed are printed above; the exit code says the input did
    // not suit every requested measure, and stderr says which and why.
    std::string line = "the input cannot be used for " + std::to_string(unusable.size()) + " of " +
                       std::to_string(measures.size()) + " measures: ";
    for (std::size_t k = 0; k < unusable.size(); ++k) line += (k ? "; " : "") + unusable[k];
    std::fprintf(stderr, "barrow-cli: %s\n", line.c_str());
    return kExitBadInput;
  }
  return kExitOk;
}

}  // namespace barrow::cli
