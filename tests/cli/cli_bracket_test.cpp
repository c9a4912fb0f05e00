// `measure --json` with a bracketed W_p (DEVELOPERS.md, Command-line contract; issue 13): the row
// carries "status":"bracketed", numeric "low" and "high" and the midpoint as "value"; the
// threshold and the representative count are ordinary --set parameters.
#include <gtest/gtest.h>

#include <nlohmann/json.hpp>
#include <random>
#include <sstream>

#include "support/test_support.h"

namespace barrow {
namespace {

TEST(CliBracketTest, MeasureJsonCarriesLowAndHigh) {
  const std::string a = test::uniformSquareCsv("bracket_a.csv", 600, 0.0, 5), b = test::uniformSquareCsv("bracket_b.csv", 500, 0.4, 6);
  std::string out, err;
  ASSERT_EQ(test::runCommand(std::string(BARROW_CLI) + " measure --a " + a + " --b " + b +
                                 " --measures w1,w2 --set w1.exact_limit=0 --set w1.representatives=60 --json",
                             &out, &err),
            0)
      << err;
  const auto j = nlohmann::json::parse(out);
  ASSERT_EQ(j["measures"].size(), 2u);
  const auto& w1 = j["measures"][0];
  EXPECT_EQ(w1["status"], "bracketed");
  ASSERT_TRUE(w1["low"].is_number() && w1["high"].is_number() && w1["value"].is_number()) << w1.dump();
  EXPECT_LT(w1["low"].get<double>(), w1["high"].get<double>());
  EXPECT_DOUBLE_EQ(w1["value"].get<double>(), 0.5 * (w1["low"].get<double>() + w1["high"].get<double>()));
  EXPECT_EQ(w1["details"]["representatives_a"], 60);
  const auto& w2 = j["measures"][1];  // under its default limit: exact, no bounds
  EXPECT_EQ(w2["status"], "ok");
  EXPECT_FALSE(w2.contains("low"));
  // `plan` is unaffected (it always asks for the exact solve, app/cli/cmd_plan.cpp).
  ASSERT_EQ(test::runCommand(std::string(BARROW_CLI) + " plan --a " + a + " --b " + b + " --cost w1 --out " +
                                 test::tempPath("bracket_plan.csv"),
                             &out, &err),
            0)
      << err;
  // A bad count is bad input (exit 2) naming the key.
  EXPECT_EQ(test::runCommand(std::string(BARROW_CLI) + " measure --a " + a + " --b " + b +
                                 " --measures w1 --set w1.representatives=0",
                             &out, &err),
            2);
  EXPECT_NE(err.find("w1.representatives"), std::string::npos) << err;
}

// The same shape for the entropic measures above their exact limit (measures/entropic_bracket.h):
// bracketed rows with low <= value <= high, the rule in the details, and the values of the full
// solve (limit raised) inside the bounds [D].
TEST(CliBracketTest, EntropicMeasuresBracketInJson) {
  const std::string a = test::uniformSquareCsv("ebracket_a.csv", 700, 0.0, 15),
                    b = test::uniformSquareCsv("ebracket_b.csv", 650, 0.3, 16);
  auto measure = [&](const std::string& limit) {
    std::string out, err;
    EXPECT_EQ(test::runCommand(std::string(BARROW_CLI) + " measure --a " + a + " --b " + b +
                                   " --measures entropic,sinkhorn --set entropic.exact_limit=" + limit +
                                   " --set sinkhorn.exact_limit=" + limit +
                                   " --set entropic.representatives=150 --set sinkhorn.representatives=150 --json",
                               &out, &err),
              0)
        << err;
    return nlohmann::json::parse(out);
  };
  const auto bracketed = measure("0"), full = measure("1000000");
  for (int k = 0; k < 2; ++k) {
    const auto& r = bracketed["measures"][k];
    EXPECT_EQ(r["status"], "bracketed") << r.dump();
    ASSERT_TRUE(r["low"].is_number() && r["high"].is_number() && r["value"].is_number()) << r.dump();
    const double low = r["low"].get<double>(), high = r["high"].get<double>();
    EXPECT_DOUBLE_EQ(r["value"].get<double>(), 0.5 * (low + high));
    EXPECT_TRUE(r["details"].contains("rule") || r["details"].contains("ab_rule")) << r.dump();
    const auto& f = full["measures"][k];
    EXPECT_EQ(f["status"], "ok");
    EXPECT_FALSE(f.contains("low"));
    EXPECT_LE(low, f["value"].get<double>()) << r["id"];
    EXPECT_GE(high, f["value"].get<double>()) << r["id"];
  }
}

// The sweep writes the midpoints and records half the widest bracket as the value's accuracy
// (`# accuracy.w1=`), which the findings' jump test reads: a shift of A is continuous in W1
// [D] (W1(A + t, A) = |t| and the triangle inequality), and stays so when bracketed.
TEST(CliBracketTest, SweepRecordsTheBracketAsAccuracy) {
  const std::string a = test::uniformSquareCsv("bracket_sa.csv", 800, 0.0, 7), b = test::uniformSquareCsv("bracket_sb.csv", 800, 0.5, 8);
  const std::string csv = test::tempPath("bracket_sweep.csv");
  std::string out, err;
  ASSERT_EQ(test::runCommand(std::string(BARROW_CLI) + " sweep --a " + a + " --b " + b +
                                 " --family shift --direction 1,0 --from 0 --to 1 --steps 11 --measures w1"
                                 " --set w1.exact_limit=0 --set w1.representatives=80 --out " + csv,
                             &out, &err),
            0)
      << err;
  const std::string text = test::readText(csv);
  const auto at = text.find("# accuracy.w1=");
  ASSERT_NE(at, std::string::npos) << text;
  EXPECT_GT(std::stod(text.substr(at + 14)), 0.0);
  ASSERT_EQ(test::runCommand(std::string(BARROW_CLI) + " findings --sweep " + csv + " --json", &out, &err), 0) << err;
  const auto f = nlohmann::json::parse(out);
  EXPECT_EQ(f["findings"][0]["continuous"], true) << out;
  EXPECT_TRUE(f["findings"][0]["jumps"].empty()) << out;
}

}  // namespace
}  // namespace barrow
