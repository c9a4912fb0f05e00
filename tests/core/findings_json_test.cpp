// The findings JSON has one writer and one reader (core/io/findings_json.h): what the writer
// puts out reads back to the same findings, including the cases JSON cannot spell directly
// (a jump to or from +∞, a Lipschitz estimate that does not exist). The shape is the CLI
// contract (DEVELOPERS.md, Command-line contract).
#include <gtest/gtest.h>

#include <cmath>

#include "io/findings_json.h"

namespace barrow {
namespace {

Finding sample() {
  Finding f;
  f.id = "kl_ab";
  f.continuous = false;
  f.jumps = {{0.25, INFINITY}, {0.75, -INFINITY}, {0.5, 0.125}};
  f.unresolved = {{0.375, 0.0625}};
  f.flat = {{0.8, 1.0}};
  f.lipschitz = NAN;
  f.monotone = false;
  f.summary = "kl_ab jumps to +∞ at θ = 0.25";
  return f;
}

TEST(FindingsJsonTest, WritesTheContractShape) {
  const auto j = nlohmann::json::parse(formatFindingsJson({sample()}));
  const auto& row = j["findings"][0];
  std::vector<std::string> keys;
  for (auto it = row.begin(); it != row.end(); ++it) keys.push_back(it.key());
  // nlohmann::json sorts keys; the contract's set is what matters here (order: ordered_json below).
  EXPECT_EQ(keys, (std::vector<std::string>{"continuous", "flat", "id", "jumps", "lipschitz", "monotone",
                                            "summary", "unresolved"}));
  EXPECT_TRUE(row["jumps"][0]["size"].is_null());
  EXPECT_EQ(row["jumps"][0]["to"], "inf");
  EXPECT_EQ(row["jumps"][1]["from"], "inf");
  EXPECT_TRUE(row["lipschitz"].is_null());
  const auto ordered = findingsToJson({sample()});
  std::vector<std::string> order;
  for (auto it = ordered["findings"][0].begin(); it != ordered["findings"][0].end(); ++it) order.push_back(it.key());
  EXPECT_EQ(order, (std::vector<std::string>{"id", "continuous", "jumps", "unresolved", "flat", "lipschitz",
                                             "monotone", "summary"}));
}

TEST(FindingsJsonTest, ReadsBackWhatItWrites) {
  const Finding f = sample();
  const auto back = parseFindingsJson(formatFindingsJson({f}), "findings.json");
  ASSERT_TRUE(back) << back.error.text();
  ASSERT_EQ(back.value->size(), 1u);
  const Finding& g = back.value->front();
  EXPECT_EQ(g.id, f.id);
  EXPECT_EQ(g.continuous, f.continuous);
  ASSERT_EQ(g.jumps.size(), 3u);
  EXPECT_EQ(g.jumps[0].size, INFINITY);
  EXPECT_EQ(g.jumps[1].size, -INFINITY);
  EXPECT_EQ(g.jumps[2].theta, 0.5);
  EXPECT_EQ(g.jumps[2].size, 0.125);
  ASSERT_EQ(g.unresolved.size(), 1u);
  EXPECT_EQ(g.unresolved[0].theta, 0.375);
  EXPECT_EQ(g.flat, f.flat);
  EXPECT_TRUE(std::isnan(g.lipschitz));
  EXPECT_EQ(g.monotone, f.monotone);
  EXPECT_EQ(g.summary, f.summary);
}

TEST(FindingsJsonTest, RefusalNamesTheFileAndTheField) {
  const auto bad = parseFindingsJson(R"({"findings":[{"id":"w1","continuous":"yes"}]})", "f.json");
  ASSERT_FALSE(bad);
  EXPECT_NE(bad.error.text().find("f.json"), std::string::npos) << bad.error.text();
  EXPECT_NE(bad.error.text().find("findings[0].continuous"), std::string::npos) << bad.error.text();
}

}  // namespace
}  // namespace barrow
