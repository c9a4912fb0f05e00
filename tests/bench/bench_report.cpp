// The HTML report at the size the issue sets: 2000 + 2000 points (the demo scene) and a
// 201-θ sweep of all 15 measures.
//  * BM_ReportWrite: formatReportHtml + the atomic write, from gathered inputs (the sweep is
//    not run: its table is filled with full-precision values of the right shape, since the
//    writer's cost depends on the table's size and digits, not on what the numbers mean).
//  * BM_ReportGather: gatherReport — every measure on A as given against B, the exact W2
//    plan at the reference θ, the hashes — timed once, for the record.
// With BARROW_REPORT_BENCH_DIR set, the reports (shift and mix) are also written there for
// the browser timings (tests/bench/report_browser_bench.mjs).
#include <benchmark/benchmark.h>

#include <cmath>
#include <cstdlib>
#include <filesystem>

#include "measures/registry.h"
#include "report/report_build.h"
#include "report/report_html.h"
#include "scenario/demo_scenario.h"
#include "families/family_spec.h"
#include "sweep/continuity.h"

namespace barrow {
namespace {

SweepResult shapedSweep(const Session& s, const std::string& family) {
  SweepResult r;
  r.settings = s.sweep;
  r.settings.family = findFamily(family)->family;
  r.settings.from = r.settings.family == Family::Mix ? 0.0 : -1.0;
  r.settings.to = 1.0;
  r.settings.steps = 201;
  r.threads = 2;
  for (int k = 0; k < 201; ++k) r.theta.push_back(r.settings.from + (r.settings.to - r.settings.from) * k / 200.0);
  int m = 0;
  for (const Measure* meas : MeasureRegistry::instance().all()) {
    SweepSeries ser;
    ser.id = meas->id();
    ser.gradientMethod = "analytic";
    for (std::size_t k = 0; k < r.theta.size(); ++k) {
      const double t = r.theta[k];
      const bool inf = ser.id == "kl_ab" && t > 0.6;  // a stretch at +∞, as KL has
      ser.value.push_back(inf ? INFINITY : std::sqrt(t * t + 0.1 * (m + 1)) / 3.0 + 1e-3 * std::sin(37.0 * t));
      ser.slope.push_back(inf ? NAN : t / std::sqrt(t * t + 0.1 * (m + 1)) / 3.0);
      ser.status.push_back(inf ? Status::Infinite : Status::Ok);
      ser.seconds.push_back(1e-3);
      ser.oneSided.push_back(false);
    }
    r.series.push_back(std::move(ser));
    r.settings.measures.push_back(meas->id());
    ++m;
  }
  return r;
}

const ReportInput& gathered(const std::string& family) {
  static std::map<std::string, ReportInput> cache;
  auto it = cache.find(family);
  if (it != cache.end()) return it->second;
  const Session s = demoSession(2000);
  SweepResult r = shapedSweep(s, family);
  auto findings = findContinuity(r);
  ReportSources src;
  src.title = "Demo scene, 2000 + 2000 points";
  src.fileA = "a.csv";
  src.fileB = "b.csv";
  src.params = s.params;
  ReportInput in = gatherReport(s.a, s.b, src, std::move(r), std::move(findings));
  if (const char* dir = std::getenv("BARROW_REPORT_BENCH_DIR")) {
    std::filesystem::create_directories(dir);
    writeReportHtml(std::string(dir) + "/report-" + family + ".html", in);
  }
  return cache.emplace(family, std::move(in)).first->second;
}

void BM_ReportWrite(benchmark::State& state, const std::string& family) {
  const ReportInput& in = gathered(family);
  const std::string path = (std::filesystem::temp_directory_path() / ("barrow-bench-report-" + family + ".html")).string();
  std::size_t bytes = 0;
  for (auto _ : state) {
    const std::string html = formatReportHtml(in);
    bytes = html.size();
    if (auto e = writeReportHtml(path, in)) state.SkipWithError(e->c_str());
  }
  std::filesystem::remove(path);
  state.counters["MB"] = double(bytes) / 1e6;
  state.counters["points"] = double(in.a.cloud.size() + in.b.cloud.size());
  state.counters["measures"] = double(in.sweep.series.size());
  state.counters["theta"] = double(in.sweep.theta.size());
}

void BM_ReportGather(benchmark::State& state) {
  const Session s = demoSession(2000);
  for (auto _ : state) {
    SweepResult r = shapedSweep(s, "shift");
    auto findings = findContinuity(r);
    ReportSources src;
    src.params = s.params;
    const ReportInput in = gatherReport(s.a, s.b, src, std::move(r), std::move(findings));
    benchmark::DoNotOptimize(in.measures.size());
  }
}

BENCHMARK_CAPTURE(BM_ReportWrite, shift, std::string("shift"))->Unit(benchmark::kMillisecond)->MinTime(2.0);
BENCHMARK_CAPTURE(BM_ReportWrite, mix, std::string("mix"))->Unit(benchmark::kMillisecond)->MinTime(2.0);
BENCHMARK(BM_ReportGather)->Unit(benchmark::kMillisecond)->Iterations(1);

}  // namespace
}  // namespace barrow

BENCHMARK_MAIN();
