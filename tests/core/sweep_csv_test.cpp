// The sweep CSV: header and cells as the contract says, settings in '#' lines, exact round
// trip, clear errors; and common tools (NumPy, pandas) read it with comment='#'.
#include <gtest/gtest.h>

#include <cmath>

#include "io/sweep_csv.h"
#include "support/test_support.h"

namespace barrow {
namespace {

SweepResult sample() {
  SweepResult r;
  r.settings.family = Family::Rotate;
  r.settings.center = std::array<double, 2>{0.5, -1.25};
  r.settings.from = -30;
  r.settings.to = 30;
  r.settings.steps = 3;
  r.settings.reference = 0;
  r.theta = {-30, 0, 0.1 + 0.2, 30};  // 0.30000000000000004 must survive
  r.refineTolerance = 6e-4;
  r.refinedPoints = 1;
  r.threads = 2;
  SweepSeries a;
  a.id = "w1";
  a.value = {1.0 / 3.0, 0.0, INFINITY, NAN};
  a.slope = {-0.5, 0.0, NAN, 2.0};
  a.status = {Status::Ok, Status::Ok, Status::Infinite, Status::InvalidInput};
  a.gradientMethod = "analytic";
  SweepSeries b;
  b.id = "mmd";
  b.value = {1e-300, 2.5, 3.5, 4.5};
  b.slope = {1, 2, 3, -4};
  b.gradientMethod = "finite-difference";
  b.frozen.set("mmd.sigma", "0.73");
  b.frozen.set("mmd.estimator", "biased");
  b.rules.set("mmd.sigma", "median");
  r.series = {a, b};
  return r;
}

TEST(SweepCsvTest, HeaderRowsAndCellsFollowTheContract) {
  const std::string text = formatSweepCsv(sample());
  std::vector<std::string> data;
  std::istringstream in(text);
  std::string line;
  while (std::getline(in, line))
    if (!line.empty() && line[0] != '#') data.push_back(line);
  ASSERT_EQ(data.size(), 5u);
  EXPECT_EQ(data[0], "theta,w1,mmd,d_w1,d_mmd");
  EXPECT_EQ(data[1], "-30,0.3333333333333333,1e-300,-0.5,1");
  EXPECT_EQ(data[3], "0.30000000000000004,inf,3.5,,3");  // +∞ written inf, no slope
  EXPECT_EQ(data[4], "30,,4.5,,-4");                      // failed: empty value and slope
  for (const char* setting : {"# family=rotate", "# center=0.5,-1.25", "# from=-30", "# to=30", "# steps=3",
                              "# reference=0", "# seed=", "# frozen.mmd=mmd.estimator=biased mmd.sigma=0.73",
                              "# gradient.w1=analytic", "# rules.mmd=mmd.sigma=median", "# refine_tolerance=6e-04", "# threads=2"})
    EXPECT_NE(text.find(setting), std::string::npos) << setting;
}

TEST(SweepCsvTest, RoundTripKeepsEveryNumberAndSetting) {
  const SweepResult in = sample();
  const auto back = parseSweepCsv(formatSweepCsv(in), "mem.csv");
  ASSERT_TRUE(back) << back.error.text();
  const SweepResult& r = *back.value;
  EXPECT_EQ(r.theta, in.theta);
  ASSERT_EQ(r.series.size(), 2u);
  EXPECT_EQ(r.series[0].value[0], 1.0 / 3.0);
  EXPECT_TRUE(std::isinf(r.series[0].value[2]));
  EXPECT_EQ(r.series[0].status[2], Status::Infinite);
  EXPECT_TRUE(std::isnan(r.series[0].value[3]));
  EXPECT_EQ(r.series[0].status[3], Status::InvalidInput);
  EXPECT_TRUE(std::isnan(r.series[0].slope[2]));
  EXPECT_EQ(r.series[1].value, in.series[1].value);
  EXPECT_EQ(r.series[1].slope, in.series[1].slope);
  EXPECT_EQ(r.series[0].gradientMethod, "analytic");
  EXPECT_EQ(r.series[1].frozen.text("mmd.sigma"), "0.73");
  EXPECT_EQ(r.series[1].rules.text("mmd.sigma"), "median");
  EXPECT_TRUE(r.series[0].rules.values().empty());
  EXPECT_EQ(r.settings.family, Family::Rotate);
  ASSERT_TRUE(r.settings.center);
  EXPECT_EQ((*r.settings.center)[1], -1.25);
  EXPECT_EQ(r.settings.from, -30);
  EXPECT_EQ(r.settings.steps, 3);
  EXPECT_EQ(r.refineTolerance, 6e-4);
  EXPECT_EQ(r.refinedPoints, 1);
  EXPECT_EQ(r.threads, 2);
  EXPECT_EQ(r.settings.measures, (std::vector<std::string>{"w1", "mmd"}));
  EXPECT_EQ(formatSweepCsv(r), formatSweepCsv(in));
}

TEST(SweepCsvTest, PlainCsvWithoutCommentsIsAccepted) {
  const auto r = parseSweepCsv("theta,js,d_js\r\n0,0,0\r\n0.5,0.69,\r\n", "plain.csv");
  ASSERT_TRUE(r) << r.error.text();
  EXPECT_EQ(r.value->theta.size(), 2u);
  EXPECT_EQ(r.value->refineTolerance, 0.0);  // no refinement recorded
  EXPECT_TRUE(std::isnan(r.value->series[0].slope[1]));
}

TEST(SweepCsvTest, ErrorsNameFileLineAndField) {
  struct Case {
    const char* text;
    const char* expect;
  } cases[] = {
      {"", "bad.csv: no header line"},
      {"x,w1,d_w1\n", "bad.csv:1: the header must start with 'theta'"},
      {"theta,w1,d_w2\n0,1,1\n", "bad.csv:1: field 'column 3': expected 'd_w1', got 'd_w2'"},
      {"theta,w1\n", "bad.csv:1: the header must be theta"},
      {"theta,w1,d_w1\n0,1\n", "bad.csv:2: found 2 fields; expected 3"},
      {"theta,w1,d_w1\n0,abc,1\n", "bad.csv:2: field 'w1': 'abc' is not a number"},
      {"theta,w1,d_w1\n1,1,1\n0,1,1\n", "bad.csv:3: field 'theta': θ must increase"},
      {"# from=abc\ntheta,w1,d_w1\n0,1,1\n", "bad.csv:1: field 'from': 'abc' is not a finite number"},
      {"theta,w1,d_w1\n", "bad.csv: no data rows"},
  };
  for (const auto& c : cases) {
    const auto r = parseSweepCsv(c.text, "bad.csv");
    ASSERT_FALSE(r) << c.text;
    EXPECT_NE(r.error.text().find(c.expect), std::string::npos) << r.error.text();
  }
  const auto missing = readSweepCsv("/no/such/dir/sweep.csv");
  ASSERT_FALSE(missing);
  EXPECT_NE(missing.error.text().find("/no/such/dir/sweep.csv: cannot open"), std::string::npos);
}

// NumPy (Debian python3-numpy, a general-purpose reader) sees the same numbers: lines
// starting with '#' skipped, the first remaining line as names; empty cells become NaN.
// (numpy.genfromtxt(names=True) would take a leading comment line as the names, hence the
// filter; pandas.read_csv(comment='#') skips them directly.)
TEST(SweepCsvTest, NumpyReadsItAfterSkippingCommentLines) {
  if (!test::pythonHas("numpy")) GTEST_SKIP() << "python3-numpy is not installed";
  const std::string path = test::tempPath("sweep.csv");
  ASSERT_FALSE(writeSweepCsv(path, sample()));
  const std::string out = test::runPython(
      "import numpy as np\n"
      "lines = [l for l in open('" + path + "') if not l.startswith('#')]\n"
      "d = np.genfromtxt(lines, delimiter=',', comments='#', names=True)\n"
      "print(d.dtype.names, d.shape)\n"
      "print(repr(float(d['w1'][0])), float(d['w1'][2]), np.isnan(d['w1'][3]), repr(float(d['theta'][2])))\n"
      "print(int(np.isnan(d['d_w1']).sum()), float(d['mmd'][0]))\n");
  EXPECT_NE(out.find("('theta', 'w1', 'mmd', 'd_w1', 'd_mmd') (4,)"), std::string::npos) << out;
  EXPECT_NE(out.find("0.3333333333333333 inf True 0.30000000000000004"), std::string::npos) << out;
  EXPECT_NE(out.find("2 1e-300"), std::string::npos) << out;
  std::remove(path.c_str());
}

}  // namespace
}  // namespace barrow
