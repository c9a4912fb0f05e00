// The fast loading paths (io/file_block, std::from_chars in csv_io, the plain copy in npy_io)
// keep every check and every message: whole message texts [CP: one line naming file, line or
// field, and reason], numbers read as parseNumber reads them [D: the fast path must agree with
// the general one], and large files read back exactly through readCloudFile.
#include <gtest/gtest.h>

#include <cmath>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <random>

#include "base/params.h"
#include "io/cloud_file.h"
#include "io/csv_io.h"
#include "io/file_block.h"
#include "io/npy_io.h"

namespace barrow {
namespace {

std::string csvMessage(const std::string& text) {
  const auto r = parseCloudCsv(text, "d/bad.csv");
  return r ? "loaded" : r.error.text();
}

TEST(CloudLoadingTest, CsvMessagesAreWholeAndUnchanged) {
  const std::pair<const char*, const char*> cases[] = {
      {"x,y\n1,2\nnan,3\n", "d/bad.csv:3: column 1 (x): value is NaN"},
      {"1,2\n3,-inf\n", "d/bad.csv:2: column 2 (y): value is infinite"},
      {"1,2\n3,abc\n", "d/bad.csv:2: column 2 (y): 'abc' is not a number"},
      {"1,2,1\n3,4\n", "d/bad.csv:2: found 2 columns; expected 3 as on line 1"},
      {"x,y,w\n1,2,-0.5\n", "d/bad.csv:2: column 3 (w): weight -0.5 is negative"},
      {"w,x,y\n-1,2,3\n", "d/bad.csv:2: column 1 (w): weight -1 is negative"},
      {"1,2\n3,1e400\n",
       "d/bad.csv:2: column 2 (y): '1e400' is out of range (a double holds magnitudes from about 2.2e-308 to "
       "1.8e308)"},
      {"1,2\n3,++5\n", "d/bad.csv:2: column 2 (y): '++5' is not a number"},
      {"1,2\n3,0x10\n", "d/bad.csv:2: column 2 (y): '0x10' is not a number"},
      {"1,2\r\n3,4x\r\n", "d/bad.csv:2: column 2 (y): '4x' is not a number"},
      {"1,2\n3,1.5e\n", "d/bad.csv:2: column 2 (y): '1.5e' is not a number"},
      {"1,2\n3,Infinity\n", "d/bad.csv:2: column 2 (y): value is infinite"},
      {"1,2\n3,-NaN\n", "d/bad.csv:2: column 2 (y): value is NaN"},
      {"1,2\n3,4 # note\n5,six\n", "d/bad.csv:3: column 2 (y): 'six' is not a number"},
      {"1 2\n3 4 5\n", "d/bad.csv:2: found 3 columns; expected 2 as on line 1"},
      {"", "d/bad.csv: no data rows (the file is empty or holds only comments and a header)"},
      {"x,y,w\n1,2,0\n3,4,-0\n", "d/bad.csv: all weights are zero, so the cloud has no mass"},
  };
  for (const auto& [text, message] : cases) EXPECT_EQ(csvMessage(text), message) << text;
  // Overlong fields are cut in the message and never parsed.
  EXPECT_EQ(csvMessage("1,2\n3," + std::string(500, '7') + "\n"),
            "d/bad.csv:2: column 2 (y): '7777777777777777777777777777777777777...' (500 characters) is too long "
            "to be a number");
  // The delimiter is fixed by the first line: a row with another is refused.
  EXPECT_EQ(csvMessage("x,y,w\n1,2,1\n3;4,1\n"), "d/bad.csv:3: found 2 columns; expected 3 as on line 1");
  // Accepted spellings: one leading '+', blanks around fields, -0 as a weight.
  const auto plus = parseCloudCsv("x,y,w\n+1, 2 ,-0\n3,+4e0,1\n", "ok.csv");
  ASSERT_TRUE(plus) << plus.error.text();
  EXPECT_EQ(plus.value->points(0, 0), 1.0);
  EXPECT_EQ(plus.value->points(1, 1), 4.0);
}

TEST(CloudLoadingTest, NpyMessagesNameTheFirstBadValueInRowOrder) {
  auto npy = [](const std::string& descr, bool fortran, const std::vector<double>& values) {
    std::string dict = "{'descr': '" + descr + "', 'fortran_order': " + (fortran ? "True" : "False") +
                       ", 'shape': (2, 3), }";
    while ((10 + dict.size() + 1) % 64) dict += ' ';
    dict += '\n';
    std::string bytes = std::string("\x93NUMPY\x01\x00", 8) + char(dict.size()) + char(0) + dict;
    for (double v : values) {
      if (descr == "<f4") {
        const float f = float(v);
        bytes.append(reinterpret_cast<const char*>(&f), sizeof f);
      } else {
        bytes.append(reinterpret_cast<const char*>(&v), sizeof v);
      }
    }
    const auto r = parseCloudNpy(bytes, "bad.npy");
    return r ? std::string("loaded") : r.error.text();
  };
  EXPECT_EQ(npy("<f8", false, {1, 2, 1, 3, NAN, 1}), "bad.npy: field 'row 2, column y': value is NaN");
  EXPECT_EQ(npy("<f8", false, {1, 2, -1, 3, INFINITY, 1}), "bad.npy: field 'row 1, column w': weight is negative");
  EXPECT_EQ(npy("<f8", false, {1, 2, 1, -INFINITY, 4, 1}), "bad.npy: field 'row 2, column x': value is infinite");
  // Fortran order: the data runs column by column, the check still goes row by row.
  EXPECT_EQ(npy("<f8", true, {1, 3, 2, NAN, 1, -1}), "bad.npy: field 'row 2, column y': value is NaN");
  EXPECT_EQ(npy("<f4", false, {1, 2, 1, 3, 4, -2}), "bad.npy: field 'row 2, column w': weight is negative");
  EXPECT_EQ(npy("<f8", false, {1, 2, -0.0, 3, 4, 1}), "loaded");
}

// [D] whenever std::from_chars reads a whole field, parseNumber (the general path, which also
// knows inf/nan spellings and blanks) reads the same double; texts of every common shape.
TEST(CloudLoadingTest, FastNumbersEqualParseNumber) {
  std::mt19937_64 rng(11);
  std::normal_distribution<double> g(0.0, 1.0);
  std::uniform_int_distribution<int> e(-300, 300);
  const char* formats[] = {"%.17g", "%.3e", "%.6f", "%+.10g", "%g", "%.0f", "%E", "%.17G"};
  std::string csv = "x,y\n";
  std::vector<std::string> texts;
  for (int k = 0; k < 4000; ++k) {
    const double v = g(rng) * std::pow(10.0, e(rng) / (k % 3 == 0 ? 1 : 30));
    char buf[400];
    std::snprintf(buf, sizeof buf, formats[k % 8], v);
    texts.push_back(buf);
    csv += std::string(buf) + ",0" + (k % 2 ? "0" : "") + "\n";
  }
  const auto r = parseCloudCsv(csv, "numbers.csv");
  ASSERT_TRUE(r) << r.error.text();
  ASSERT_EQ(r.value->size(), Eigen::Index(texts.size()));
  for (std::size_t k = 0; k < texts.size(); ++k) {
    const auto expected = parseNumber(texts[k]);
    ASSERT_TRUE(expected) << texts[k];
    EXPECT_EQ(r.value->points(Eigen::Index(k), 0), *expected) << texts[k];
  }
}

std::filesystem::path tempPath(const std::string& name) {
  return std::filesystem::path(BARROW_TEST_TMP_DIR) / name;
}

// [D] writing then reading through the files (the block reader, the prefaulted buffers) is
// exact at sizes where those paths are taken (> 1 MiB), and the line of a late error is right.
TEST(CloudLoadingTest, LargeFilesReadBackExactlyAndLateErrorsKeepTheirLine) {
  const int n = 200000;
  std::mt19937_64 rng(12);
  std::normal_distribution<double> g(0.0, 1.0);
  Eigen::MatrixX2d p(n, 2);
  Eigen::VectorXd w(n);
  for (int i = 0; i < n; ++i) {
    p.row(i) << g(rng) * 1e3, g(rng) * 1e-3;
    w(i) = std::abs(g(rng));
  }
  const Cloud c("big", p, w);
  for (const char* ext : {".csv", ".npy"}) {
    const std::string path = tempPath(std::string("loading_big") + ext).string();
    ASSERT_FALSE(writeCloudFile(path, c));
    const auto back = readCloudFile(path);
    ASSERT_TRUE(back) << back.error.text();
    EXPECT_EQ(back.value->name, "loading_big");
    EXPECT_TRUE(back.value->points == c.points) << ext;
    EXPECT_TRUE(back.value->weights == c.weights) << ext;
  }
  const std::string bad = tempPath("loading_bad.csv").string();
  {
    std::ofstream out(bad, std::ios::binary);
    out << formatCloudCsv(c) << "1,2,-3\n";
  }
  const auto r = readCloudFile(bad);
  ASSERT_FALSE(r);
  EXPECT_EQ(r.error.text(), bad + ":" + std::to_string(n + 2) + ": column 3 (w): weight -3 is negative");
}

TEST(CloudLoadingTest, FileBlockReportsWhyItCannotRead) {
  std::string why;
  EXPECT_FALSE(FileBlock::read(BARROW_TEST_TMP_DIR, &why));
  EXPECT_EQ(why, "it is a directory, not a file");
  EXPECT_FALSE(FileBlock::read(tempPath("no_such_file.csv").string(), &why));
  EXPECT_EQ(why, "No such file or directory");
  const std::string empty = tempPath("loading_empty.csv").string();
  { std::ofstream out(empty); }
  const auto block = FileBlock::read(empty, &why);
  ASSERT_TRUE(block);
  EXPECT_EQ(block->text().size(), 0u);
  EXPECT_EQ(readCloudFile(empty).error.text(),
            empty + ": no data rows (the file is empty or holds only comments and a header)");
}

}  // namespace
}  // namespace barrow
