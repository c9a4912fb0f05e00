// barrow-cli plan: the CSV it writes (header, marginals, costs) and its exit codes.
#include <gtest/gtest.h>

#include <cmath>
#include <map>
#include <sstream>

#include "io/cloud_file.h"
#include "support/test_support.h"

namespace barrow {
namespace {

int cli(const std::string& args, std::string* out = nullptr, std::string* err = nullptr) {
  return test::runCommand(std::string(BARROW_CLI) + " " + args, out, err);
}

struct PlanRow {
  int i, j;
  double mass, ax, ay, bx, by, cost;
};

std::vector<PlanRow> readPlan(const std::string& path, std::string* header) {
  std::istringstream in(test::readText(path));
  std::getline(in, *header);
  std::vector<PlanRow> rows;
  std::string line;
  while (std::getline(in, line)) {
    PlanRow r{};
    char c;
    std::istringstream s(line);
    s >> r.i >> c >> r.j >> c >> r.mass >> c >> r.ax >> c >> r.ay >> c >> r.bx >> c >> r.by >> c >> r.cost;
    EXPECT_FALSE(s.fail()) << line;
    rows.push_back(r);
  }
  return rows;
}

Cloud load(const std::string& path) {
  auto c = readCloudFile(path);
  EXPECT_TRUE(c) << path;
  return std::move(*c.value);
}

// [D] A transport plan's row sums are A's normalised weights and its column sums B's; each
// line's coordinates are the data rows it names, and its cost is c(x_i, y_j).
TEST(CliPlanTest, CsvMarginalsMatchTheInputWeights) {
  const std::string dir = test::samplesDir() + "/depots_and_shops";
  const Cloud a = load(dir + "/a.csv"), b = load(dir + "/b.csv");
  for (const char* cost : {"w1", "w2"}) {
    const std::string out = test::tempPath(std::string("plan-") + cost + ".csv");
    std::string stdoutText, err;
    ASSERT_EQ(cli("plan --a " + dir + "/a.csv --b " + dir + "/b.csv --cost " + cost + " --out " + out, &stdoutText, &err),
              0)
        << err;
    EXPECT_EQ(std::count(stdoutText.begin(), stdoutText.end(), '\n'), 1) << stdoutText;
    EXPECT_NE(stdoutText.find("nonzeros"), std::string::npos);
    EXPECT_NE(stdoutText.find("marginal error"), std::string::npos);
    std::string header;
    const auto rows = readPlan(out, &header);
    EXPECT_EQ(header, "i,j,mass,ax,ay,bx,by,cost");
    ASSERT_FALSE(rows.empty());
    EXPECT_LE(rows.size(), std::size_t(a.size() + b.size() - 1));
    Eigen::VectorXd rowSum = Eigen::VectorXd::Zero(a.size()), colSum = Eigen::VectorXd::Zero(b.size());
    double total = 0;
    for (const auto& r : rows) {
      ASSERT_TRUE(r.i >= 0 && r.i < a.size() && r.j >= 0 && r.j < b.size());
      rowSum(r.i) += r.mass;
      colSum(r.j) += r.mass;
      EXPECT_DOUBLE_EQ(r.ax, a.points(r.i, 0));
      EXPECT_DOUBLE_EQ(r.by, b.points(r.j, 1));
      const double d = std::hypot(r.ax - r.bx, r.ay - r.by);
      EXPECT_NEAR(r.cost, std::string(cost) == "w1" ? d : d * d, 1e-12 * (1 + r.cost));
      total += r.mass * r.cost;
    }
    EXPECT_LT((rowSum - a.normalizedWeights()).cwiseAbs().maxCoeff(), 1e-12);
    EXPECT_LT((colSum - b.normalizedWeights()).cwiseAbs().maxCoeff(), 1e-12);
    // The summary's value is the plan's cost (w1) or its square root (w2).
    const double value = std::stod(stdoutText.substr(stdoutText.find('=') + 1));
    EXPECT_NEAR(std::string(cost) == "w1" ? total : std::sqrt(total), value, 1e-12 * value);
  }
}

TEST(CliPlanTest, DefaultCostIsW1) {
  const std::string dir = test::samplesDir() + "/ring_vs_blob";
  const std::string out = test::tempPath("plan-default.csv");
  std::string text;
  ASSERT_EQ(cli("plan --a " + dir + "/a.csv --b " + dir + "/b.csv --out " + out, &text), 0);
  EXPECT_EQ(text.rfind("w1 = ", 0), 0u) << text;
}

TEST(CliPlanTest, BadInputExitsTwoWithOneLine) {
  const std::string dir = test::samplesDir() + "/ring_vs_blob";
  const std::string ok = " --a " + dir + "/a.csv --b " + dir + "/b.csv";
  const struct {
    std::string args, reason;
  } cases[] = {
      {ok + " --cost w3 --out " + test::tempPath("x.csv"), "--cost must be w1 or w2"},
      {ok, "--out"},
      {" --a " + test::dataDir() + "/bad/nan.csv --b " + dir + "/b.csv --out " + test::tempPath("x.csv"), "NaN"},
      {ok + " --out /nonexistent-dir/plan.csv", "/nonexistent-dir/plan.csv"},
  };
  for (const auto& c : cases) {
    std::string out, err;
    EXPECT_EQ(cli("plan" + c.args, &out, &err), 2) << c.args;
    EXPECT_NE(err.find(c.reason), std::string::npos) << err;
    EXPECT_EQ(std::count(err.begin(), err.end(), '\n'), 1) << err;
  }
}

}  // namespace
}  // namespace barrow
