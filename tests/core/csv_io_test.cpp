// CSV cloud files: every accepted variant round-trips exactly; every bad file gets its own
// message naming file, line and reason, and yields no cloud.
#include <gtest/gtest.h>

#include "io/csv_io.h"
#include "support/test_support.h"

namespace barrow {
namespace {

Cloud parseOk(const std::string& text) {
  auto r = parseCloudCsv(text, "t.csv");
  EXPECT_TRUE(r) << r.error.text();
  return r ? *r.value : Cloud();
}

TEST(CsvIoTest, CommaWithHeaderAndWeights) {
  const auto c = parseOk("x,y,w\n0,1,2\n3.5,-4,1\n");
  ASSERT_EQ(c.size(), 2);
  EXPECT_EQ(c.points(1, 0), 3.5);
  EXPECT_EQ(c.points(1, 1), -4);
  EXPECT_EQ(c.weights(0), 2);
}

TEST(CsvIoTest, NoHeaderTwoColumnsGivesUniformWeights) {
  const auto c = parseOk("0 1\n2 3\n4 5\n3 3\n");
  ASSERT_EQ(c.size(), 4);
  EXPECT_DOUBLE_EQ(c.weights(2), 0.25);
}

TEST(CsvIoTest, SemicolonTabWhitespaceCommentsBlankLinesCrlf) {
  for (const std::string text :
       {"# sensor batch\n\nx;y\r\n1;2\r\n\r\n3;4 # trailing comment\r\n",
        "x\ty\n1\t2\n3\t4\n", "  1   2\n\n 3  4\n", "\xEF\xBB\xBFx,y\n1,2\n3,4"}) {
    const auto c = parseOk(text);
    ASSERT_EQ(c.size(), 2) << text;
    EXPECT_EQ(c.points(1, 0), 3);
    EXPECT_EQ(c.points(1, 1), 4);
  }
}

TEST(CsvIoTest, HeaderColumnsInAnyOrder) {
  const auto c = parseOk("w,y,x\n2,1,0\n");
  EXPECT_EQ(c.points(0, 0), 0);
  EXPECT_EQ(c.points(0, 1), 1);
  EXPECT_EQ(c.weights(0), 2);
}

TEST(CsvIoTest, WriteThenReadIsExact) {
  Eigen::MatrixX2d p(3, 2);
  p << 0.1, 1.0 / 3.0, -2e-300, 1e300, 123456.789012345678, -0.0;
  Eigen::VectorXd w(3);
  w << 0.2, 0.30000000000000004, 0;
  const Cloud c("rt", p, w);
  const std::string path = test::tempPath("rt.csv");
  ASSERT_FALSE(writeCloudCsv(path, c));
  auto back = readCloudCsv(path);
  ASSERT_TRUE(back) << back.error.text();
  EXPECT_EQ(back.value->points, c.points);
  EXPECT_EQ(back.value->weights, c.weights);
}

struct BadCase {
  const char* text;
  const char* expect;  // a piece of the message
  int line;
};

TEST(CsvIoTest, BadFilesNameLineAndReason) {
  const BadCase cases[] = {
      {"x,y\n1,2\nnan,3\n", "NaN", 3},
      {"1,2\n3,inf\n", "infinite", 2},
      {"1,2\n3,abc\n", "'abc' is not a number", 2},
      {"1,2,1\n3,4\n", "expected 3", 2},
      {"1,2,3,4\n", "found 4 columns", 1},
      {"x,y,w\n1,2,-0.5\n", "negative", 2},
      {"x,z\n1,2\n", "'z' is not recognised", 1},
      {"", "no data rows", 0},
      {"# only a comment\n\n", "no data rows", 0},
      {"x,y\n", "no data rows", 0},
      {"x,y,w\n1,2,0\n3,4,0\n", "all weights are zero", 0},
  };
  for (const auto& bc : cases) {
    auto r = parseCloudCsv(bc.text, "bad.csv");
    ASSERT_FALSE(r) << bc.text;
    EXPECT_EQ(r.error.line, bc.line) << bc.text;
    EXPECT_NE(r.error.text().find(bc.expect), std::string::npos) << r.error.text();
    EXPECT_EQ(r.error.text().rfind("bad.csv", 0), 0u) << r.error.text();
  }
}

TEST(CsvIoTest, MissingFileSaysCannotOpen) {
  auto r = readCloudCsv("/nonexistent/dir/a.csv");
  ASSERT_FALSE(r);
  EXPECT_NE(r.error.text().find("cannot open"), std::string::npos);
}

TEST(CsvIoTest, StemNamesTheCloud) { EXPECT_EQ(parseCloudCsv("1,2\n", "dir/batch_a.csv").value->name, "batch_a"); }

}  // namespace
}  // namespace barrow
