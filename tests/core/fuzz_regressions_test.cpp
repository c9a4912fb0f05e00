// Every input the fuzz targets ever failed on (tests/fuzz/regressions/<target>/) replayed
// through the same entry points in the ordinary test build, so each stays fixed without
// libFuzzer. The checks are the fuzz targets' invariants: no exception escapes, a refusal
// is one line, an accepted cloud is valid, and a measure with status ok has a finite value.
#include <gtest/gtest.h>

#include <filesystem>

#include "fuzz/cloud_reader_invariants.h"
#include "fuzz/fuzz_clouds.h"
#include "io/csv_io.h"
#include "io/npy_io.h"
#include "io/session_io.h"
#include "measures/registry.h"
#include "support/test_support.h"

namespace barrow {
namespace {

namespace fs = std::filesystem;

std::vector<std::pair<std::string, std::string>> inputs(const std::string& target) {
  std::vector<std::pair<std::string, std::string>> out;
  for (const char* kind : {"regressions", "corpus"}) {
    const fs::path dir = fs::path(BARROW_TEST_DATA_DIR).parent_path() / "fuzz" / kind / target;
    if (!fs::exists(dir)) continue;
    for (const auto& e : fs::directory_iterator(dir))
      if (e.is_regular_file()) out.emplace_back(e.path().string(), test::readText(e.path().string()));
  }
  return out;
}

template <class T>
void expectOneLineOrValid(const Loaded<T>& r, const std::string& file) {
  if (!r) {
    EXPECT_EQ(r.error.text().find('\n'), std::string::npos) << file;
  }
}

// The same invariants as the fuzz targets (tests/fuzz/cloud_reader_invariants.h).
TEST(FuzzRegressionsTest, CsvInputsAreReadOrRefusedCleanly) {
  for (const auto& [file, bytes] : inputs("csv"))
    EXPECT_EQ(fuzz::cloudReaderViolation(bytes, parseCloudCsv, formatCloudCsv, 2), "") << file;
}

TEST(FuzzRegressionsTest, NpyInputsAreReadOrRefusedCleanly) {
  for (const auto& [file, bytes] : inputs("npy"))
    EXPECT_EQ(fuzz::cloudReaderViolation(bytes, parseCloudNpy, formatCloudNpy, 2), "") << file;
}

TEST(FuzzRegressionsTest, SessionInputsAreReadOrRefusedCleanly) {
  for (const auto& [file, bytes] : inputs("session")) {
    const auto r = parseSession(bytes, file);
    expectOneLineOrValid(r, file);
    if (!r) continue;
    const std::string once = formatSession(*r.value);
    const auto again = parseSession(once, file);
    ASSERT_TRUE(again) << file << ": " << again.error.text();
    EXPECT_EQ(formatSession(*again.value), once) << file;
  }
}

TEST(FuzzRegressionsTest, MeasureInputsGiveFiniteValuesWhenOk) {
  for (const auto& [file, bytes] : inputs("measures")) {
    const auto in = fuzz::decodeCloudPair(reinterpret_cast<const std::uint8_t*>(bytes.data()), bytes.size());
    for (const char* id : fuzz::kCheapMeasures) {
      const Result r = evaluateMeasure(*MeasureRegistry::instance().find(id), in.a, in.b, in.request);
      if (r.status == Status::Ok) {
        EXPECT_TRUE(std::isfinite(r.value)) << file << " " << id;
        EXPECT_GE(r.value, 0.0) << file << " " << id;
      }
    }
  }
}

}  // namespace
}  // namespace barrow
