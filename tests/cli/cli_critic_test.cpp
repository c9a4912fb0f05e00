// barrow-cli critic: the JSON shape of the contract (DEVELOPERS.md, Command-line contract,
// "critic --json"), the text table, and bad input exiting 2 with one line.
#include <gtest/gtest.h>

#include <nlohmann/json.hpp>

#include "support/test_support.h"

namespace barrow {
namespace {

std::string cli() { return BARROW_CLI; }

std::string pair(const std::string& name) { return test::samplesDir() + "/" + name; }

TEST(CliCriticTest, JsonHasOneEntryPerMethodWithContractKeys) {
  std::string out, err;
  const std::string dir = pair("parallel_segments");
  const int rc = test::runCommand(cli() + " critic --a " + dir + "/a.csv --b " + dir + "/b.csv --steps 100 --seed 3 --json",
                                  &out, &err);
  ASSERT_EQ(rc, 0) << err;
  const auto js = nlohmann::json::parse(out);
  ASSERT_EQ(js.size(), 1u);
  ASSERT_EQ(js["critics"].size(), 3u);
  const std::vector<std::string> keys = {"method",          "estimate",           "lower_bound",
                                         "w1",              "lipschitz_upper",    "lipschitz_measured",
                                         "potential_correlation", "steps",         "seconds",
                                         "status"};
  const std::vector<std::string> methods = {"clip", "gp", "sn"};
  for (std::size_t k = 0; k < 3; ++k) {
    const auto& c = js["critics"][k];
    EXPECT_EQ(c.size(), keys.size());
    for (const auto& key : keys) EXPECT_TRUE(c.contains(key)) << key;
    EXPECT_EQ(c["method"], methods[k]);
    EXPECT_EQ(c["status"], "ok");
    EXPECT_EQ(c["steps"], 100);
    EXPECT_LE(c["lower_bound"].get<double>(), c["w1"].get<double>() * (1 + 1e-12));  // [P] KR duality
  }
}

TEST(CliCriticTest, OneMethodPrintsTable) {
  std::string out, err;
  const std::string dir = pair("depots_and_shops");
  ASSERT_EQ(test::runCommand(cli() + " critic --a " + dir + "/a.csv --b " + dir + "/b.csv --method sn --steps 50", &out, &err), 0)
      << err;
  EXPECT_NE(out.find("exact W1 ="), std::string::npos);
  EXPECT_NE(out.find("\nsn "), std::string::npos);
  EXPECT_EQ(out.find("\ngp "), std::string::npos);
}

TEST(CliCriticTest, BadInputExitsTwoWithOneLine) {
  const std::string dir = pair("depots_and_shops");
  const std::string ab = " critic --a " + dir + "/a.csv --b " + dir + "/b.csv";
  for (const std::string& bad : {ab + " --method adam", ab + " --steps 0", ab + " --set sinkhorn.epsilon=0.1",
                                 ab + " --set critic.clip=-1", std::string(" critic --a nowhere.csv --b ") + dir + "/b.csv"}) {
    std::string out, err;
    EXPECT_EQ(test::runCommand(cli() + bad, &out, &err), 2) << bad;
    EXPECT_EQ(std::count(err.begin(), err.end(), '\n'), 1) << bad << ": " << err;
  }
}

TEST(CliCriticTest, MeasureWithoutListRunsNoCritic) {
  std::string out, err;
  const std::string dir = pair("depots_and_shops");
  ASSERT_EQ(test::runCommand(cli() + " measure --a " + dir + "/a.csv --b " + dir + "/b.csv --json", &out, &err), 0) << err;
  EXPECT_EQ(out.find("critic_"), std::string::npos);
  ASSERT_EQ(test::runCommand(cli() + " measure --a " + dir + "/a.csv --b " + dir +
                                 "/b.csv --measures critic_gp --set critic.steps=20 --json",
                             &out, &err),
            0)
      << err;
  EXPECT_EQ(nlohmann::json::parse(out)["measures"][0]["id"], "critic_gp");
}

}  // namespace
}  // namespace barrow
