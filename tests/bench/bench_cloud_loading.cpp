// Loading a cloud from disk: readCloudFile() on a CSV and on a .npy of n rows (x, y, w), the
// path the CLI and the window take. The files are written once per size into the system's
// temporary folder (seeded Gaussian points, random weights, 17 significant digits in the CSV,
// as formatCloudCsv writes them) and read back on every iteration, so the figure includes the
// file read (from the page cache after the first pass), the parse and every validation.
//
//   BM_LoadCsv/n    x,y,w header + n rows
//   BM_LoadNpy/n    '<f8' (n, 3), C order, as formatCloudNpy writes it
#include <benchmark/benchmark.h>

#include <algorithm>
#include <filesystem>
#include <random>
#include <stdexcept>
#include <vector>

#include "io/cloud_file.h"

namespace barrow {
namespace {

Cloud gaussianCloud(int n, unsigned seed) {
  std::mt19937_64 rng(seed);
  std::normal_distribution<double> g(0.0, 1.0);
  std::uniform_real_distribution<double> w(0.5, 1.0);
  Eigen::MatrixX2d p(n, 2);
  Eigen::VectorXd wt(n);
  for (int i = 0; i < n; ++i) {
    p.row(i) << g(rng), 0.5 * g(rng);
    wt(i) = w(rng);
  }
  return Cloud("c", p, wt);
}

// The files this run wrote (up to ~90 MB), removed when the program ends.
struct WrittenFiles {
  std::vector<std::filesystem::path> paths;
  ~WrittenFiles() {
    std::error_code ec;
    for (const auto& p : paths) std::filesystem::remove(p, ec);
  }
} written;

// Written once per (size, extension) and kept for the rest of the run.
std::string fileFor(int n, const std::string& ext) {
  const auto path = std::filesystem::temp_directory_path() /
                    ("barrow_bench_load_" + std::to_string(n) + ext);
  if (std::find(written.paths.begin(), written.paths.end(), path) == written.paths.end()) {
    if (auto err = writeCloudFile(path.string(), gaussianCloud(n, 7))) throw std::runtime_error(*err);
    written.paths.push_back(path);
  }
  return path.string();
}

void loadLoop(benchmark::State& state, const std::string& ext) {
  const int n = int(state.range(0));
  const std::string path = fileFor(n, ext);
  for (auto _ : state) {
    const Loaded<Cloud> c = readCloudFile(path);
    if (!c || c.value->size() != n) {
      state.SkipWithError(c ? "wrong row count" : c.error.text().c_str());
      break;
    }
    benchmark::DoNotOptimize(c.value->points.data());
  }
  state.counters["MB"] = double(std::filesystem::file_size(path)) / 1e6;
}

void BM_LoadCsv(benchmark::State& state) { loadLoop(state, ".csv"); }
void BM_LoadNpy(benchmark::State& state) { loadLoop(state, ".npy"); }

BENCHMARK(BM_LoadCsv)->Arg(100000)->Arg(1000000)->Unit(benchmark::kMillisecond)->UseRealTime();
BENCHMARK(BM_LoadNpy)->Arg(100000)->Arg(1000000)->Unit(benchmark::kMillisecond)->UseRealTime();

}  // namespace
}  // namespace barrow

BENCHMARK_MAIN();
