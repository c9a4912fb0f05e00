// Hostile and broken input files: each is refused with a one-line message naming the file
// and the reason, in bounded memory, before anything proportional to what the file claims is
// allocated. The cases marked "found" were crashes or unbounded allocations found by fuzzing
// and sanitizer runs (tests/fuzz/RESULTS-fuzz.md); the crafted files are in tests/data/bad.
#include <gtest/gtest.h>
#include <sys/resource.h>
#include <sys/wait.h>
#include <unistd.h>

#include <functional>

#include "io/csv_io.h"
#include "io/npy_io.h"
#include "io/session_io.h"
#include "support/test_support.h"

namespace barrow {
namespace {

// Growth of the peak resident set (MiB) while `fn` runs in a forked child, or -1 when `fn`
// returned false or the child died. A child starts with a fresh peak (its current RSS), so
// earlier tests in this process do not mask the growth.
long peakGrowthMiB(const std::function<bool()>& fn) {
  int fds[2];
  if (pipe(fds) != 0) return -1;
  const pid_t pid = fork();
  if (pid == 0) {
    close(fds[0]);
    rusage before{}, after{};
    getrusage(RUSAGE_SELF, &before);
    const bool ok = fn();
    getrusage(RUSAGE_SELF, &after);
    const long growth = ok ? (after.ru_maxrss - before.ru_maxrss) / 1024 : -1;  // ru_maxrss: KiB
    (void)!write(fds[1], &growth, sizeof growth);
    _exit(0);
  }
  close(fds[1]);
  long growth = -1;
  if (read(fds[0], &growth, sizeof growth) != sizeof growth) growth = -1;
  close(fds[0]);
  int status = 0;
  waitpid(pid, &status, 0);
  return WIFEXITED(status) && WEXITSTATUS(status) == 0 ? growth : -1;
}

std::string bad(const std::string& name) { return test::dataDir() + "/bad/" + name; }

void expectRefused(const LoadError& e, const std::string& file, const std::string& reason) {
  const std::string t = e.text();
  EXPECT_EQ(t.rfind(file, 0), 0u) << t;
  EXPECT_NE(t.find(reason), std::string::npos) << t;
  EXPECT_EQ(t.find('\n'), std::string::npos) << t;
}

// Found: the header ends "'shape':}" and the reader threw std::out_of_range.
TEST(HostileInputTest, NpyEmptyShapeValueIsRefused) {
  const auto r = readCloudNpy(bad("npy_empty_shape.npy"));
  ASSERT_FALSE(r);
  expectRefused(r.error, bad("npy_empty_shape.npy"), "field 'shape'");
}

// Found: shape (2^60 + 1, 2) of float64 with 16 data bytes; rows * 16 wrapped around to 16,
// the size check passed and the reader allocated for 2^60 rows.
TEST(HostileInputTest, NpyShapeWhoseByteCountOverflowsIsRefused) {
  const auto r = readCloudNpy(bad("npy_shape_overflow.npy"));
  ASSERT_FALSE(r);
  expectRefused(r.error, bad("npy_shape_overflow.npy"), "the shape claims 1152921504606846977 rows");
}

TEST(HostileInputTest, NpyClaimingATrillionRowsIsRefusedInBoundedMemory) {
  const std::string path = bad("npy_claims_1e12_rows.npy");
  const auto r = readCloudNpy(path);
  ASSERT_FALSE(r);
  expectRefused(r.error, path, "the shape claims 1000000000000 rows of 24 bytes, 24 data bytes present");
  // 24 TB claimed: anything proportional would show (or fail) here; 16 MiB is noise.
  const long mib = peakGrowthMiB([&] { return !readCloudNpy(path); });
  EXPECT_GE(mib, 0);
  EXPECT_LT(mib, 16);
}

// Found by fuzz_npy: a shape value holding a line break was quoted into the message, which
// then spanned two lines (tests/fuzz/regressions/npy/shape_with_line_break.npy).
TEST(HostileInputTest, MessageQuotingALineBreakStaysOnOneLine) {
  const std::string path = test::dataDir() + "/../fuzz/regressions/npy/shape_with_line_break.npy";
  const auto r = readCloudNpy(path);
  ASSERT_FALSE(r);
  EXPECT_EQ(r.error.text().find('\n'), std::string::npos) << r.error.text();
  EXPECT_NE(r.error.text().find("field 'shape'"), std::string::npos) << r.error.text();
}

// Found: one 100 MB line was split into fields (2.5 GB peak, 14 s) before the column count
// was checked, and the 100 MB "number" was echoed back whole in the message.
TEST(HostileInputTest, CsvWithOneHundredMegabyteNumberIsRefusedWithShortMessage) {
  std::string msg;
  const long mib = peakGrowthMiB([&] {
    std::string text;
    text.reserve(100'000'008);  // built in place: no second copy while the input grows
    text += "x,y\n1,";
    text.append(100'000'000, '7');
    text += "\n";
    const auto r = parseCloudCsv(text, "long.csv");
    if (r || r.error.text().size() > 200) return false;
    return r.error.text().find("long.csv:2: column 2 (y): '7777") == 0 &&
           r.error.text().find("(100000000 characters)") != std::string::npos;
  });
  ASSERT_GE(mib, 0) << "refused with the wrong message, or crashed";
  // The input itself is 100 MB; the parse adds next to nothing (it was 25x the input).
  EXPECT_LT(mib, 100 + 32);
}

TEST(HostileInputTest, CsvWithOneHundredMegabyteLineOfFieldsIsRefusedByCount) {
  const long mib = peakGrowthMiB([&] {
    std::string text;
    text.reserve(100'000'002);
    for (int i = 0; i < 50'000'000; ++i) text += "1,";
    text += "1\n";
    const auto r = parseCloudCsv(text, "wide.csv");
    return !r && r.error.text() == "wide.csv:1: found 50000001 columns; expected 2 (x,y) or 3 (x,y,w)";
  });
  ASSERT_GE(mib, 0) << "refused with the wrong message, or crashed";
  EXPECT_LT(mib, 100 + 32);
}

// Found by fuzz_csv: a negative weight written with 400 digits was echoed whole.
TEST(HostileInputTest, LongNegativeWeightIsShownShortened) {
  const std::string path = test::dataDir() + "/../fuzz/regressions/csv/long_negative_weight.csv";
  const auto r = readCloudCsv(path);
  ASSERT_FALSE(r);
  EXPECT_NE(r.error.text().find("is negative"), std::string::npos) << r.error.text();
  EXPECT_NE(r.error.text().find("characters)"), std::string::npos) << r.error.text();
  EXPECT_LT(r.error.text().size(), path.size() + 120) << r.error.text();
}

// Found: 1e400 is valid JSON but outside double's range; the parser's out_of_range error was
// not caught (only parse errors were), so File > Open crashed the window.
TEST(HostileInputTest, SessionNumberOutOfDoubleRangeIsRefused) {
  const std::string path = bad("session_number_out_of_range.json");
  const auto r = readSession(path);
  ASSERT_FALSE(r);
  expectRefused(r.error, path, "1e400");
}

// Found: 10^5 levels inside "view" overflowed the stack (recursive copy of the parsed tree).
TEST(HostileInputTest, SessionNestedHundredThousandLevelsIsRefused) {
  std::string text = R"({"format":"barrow-session","version":1,)"
                     R"("clouds":{"A":{"points":[[0,0]]},"B":{"points":[[1,1]]}},"view":)";
  text += std::string(100'000, '[') + std::string(100'000, ']') + "}";
  const auto r = parseSession(text, "deep.json");
  ASSERT_FALSE(r);
  expectRefused(r.error, "deep.json", "nested deeper than 64 levels");
}

TEST(HostileInputTest, SessionNestedWithinTheLimitLoads) {
  std::string text = R"({"format":"barrow-session","version":1,)"
                     R"("clouds":{"A":{"points":[[0,0]]},"B":{"points":[[1,1]]}},"view":)";
  text += std::string(60, '[') + std::string(60, ']') + "}";
  const auto r = parseSession(text, "nested.json");
  ASSERT_TRUE(r) << r.error.text();
}

// The session schema has no count fields: a cloud holds as many points as its array does.
// A weights array that claims more points than the cloud has is refused by count.
TEST(HostileInputTest, SessionWeightsClaimingMorePointsThanHeldIsRefused) {
  const std::string path = bad("session_weights_claim_more.json");
  const auto r = readSession(path);
  ASSERT_FALSE(r);
  expectRefused(r.error, path, "field 'clouds.A.weights': expected 2 numbers, one per point");
}

// A version or step count that does not fit an int was wrapped around (2^32 + 1 read as 1).
TEST(HostileInputTest, SessionWholeNumbersOutsideIntAreRefused) {
  const std::string clouds = R"("clouds":{"A":{"points":[[0,0]]},"B":{"points":[[1,1]]}})";
  auto r = parseSession(R"({"format":"barrow-session","version":4294967297,)" + clouds + "}", "v.json");
  ASSERT_FALSE(r);
  expectRefused(r.error, "v.json", "field 'version': whole number out of range");
  r = parseSession(R"({"format":"barrow-session","version":1,)" + clouds +
                       R"(,"sweep":{"steps":18446744073709551615}})",
                   "s.json");
  ASSERT_FALSE(r);
  expectRefused(r.error, "s.json", "field 'sweep.steps': whole number out of range");
}

}  // namespace
}  // namespace barrow
