// barrow-cli spread, permute and sizes from the outside: the JSON shapes of the contract,
// byte-identical output for a seed whatever the thread count, and one-line errors (exit 2).
#include <gtest/gtest.h>

#include <algorithm>
#include <nlohmann/json.hpp>

#include "support/test_support.h"

namespace barrow {
namespace {

int cli(const std::string& args, std::string* out = nullptr, std::string* err = nullptr) {
  return test::runCommand(std::string(BARROW_CLI) + " " + args, out, err);
}

std::string pair() {
  const std::string d = test::samplesDir() + "/ring_vs_blob/";
  return "--a " + d + "a.csv --b " + d + "b.csv";
}

void expectKeys(const nlohmann::json& row, std::initializer_list<const char*> keys) {
  for (const char* k : keys) EXPECT_TRUE(row.contains(k)) << k << " missing in " << row.dump();
}

TEST(CliResamplingTest, SpreadJsonHasContractKeys) {
  std::string out, err;
  ASSERT_EQ(cli("spread " + pair() + " --measures w1,energy --resamples 20 --seed 5 --json", &out, &err), 0) << err;
  const auto j = nlohmann::json::parse(out);
  ASSERT_EQ(j["measures"].size(), 2u);
  for (const auto& row : j["measures"]) {
    expectKeys(row, {"id", "value", "low", "high", "sd", "resamples", "level", "seed", "status"});
    EXPECT_EQ(row["resamples"], 20);
    EXPECT_EQ(row["seed"], 5);
    EXPECT_EQ(row["level"], 0.95);
    EXPECT_LE(row["low"].get<double>(), row["high"].get<double>());
  }
}

TEST(CliResamplingTest, PermuteAndSizesJsonHaveContractKeys) {
  std::string out, err;
  ASSERT_EQ(cli("permute " + pair() + " --measures w1 --permutations 19 --json", &out, &err), 0) << err;
  auto j = nlohmann::json::parse(out);
  expectKeys(j["measures"][0], {"id", "value", "p_value", "permutations", "seed", "status"});
  EXPECT_EQ(j["measures"][0]["permutations"], 19);
  ASSERT_EQ(cli("sizes " + pair() + " --measures w1 --sizes 10,20 --repeats 3 --json", &out, &err), 0) << err;
  j = nlohmann::json::parse(out);
  expectKeys(j["measures"][0], {"id", "sizes", "mean", "sd", "slope", "status"});
  EXPECT_EQ(j["measures"][0]["sizes"], nlohmann::json::parse("[10,20]"));
  EXPECT_EQ(j["measures"][0]["mean"].size(), 2u);
}

// Per-replicate seeds come from (seed, replicate index) only [D], so the output is the same
// byte for byte on 1 and 2 threads and on a second run.
TEST(CliResamplingTest, SameSeedGivesByteIdenticalOutputOnAnyThreadCount) {
  for (const std::string cmd : {"spread --resamples 15", "permute --permutations 15", "sizes --sizes 8,16 --repeats 4"}) {
    std::string one, two, again, err;
    const std::string base = cmd + " " + pair() + " --measures w1,mmd,js,sliced --seed 99 --json";
    ASSERT_EQ(cli(base + " --threads 1", &one, &err), 0) << err;
    ASSERT_EQ(cli(base + " --threads 2", &two, &err), 0) << err;
    ASSERT_EQ(cli(base + " --threads 2", &again, &err), 0) << err;
    EXPECT_EQ(one, two) << cmd;
    EXPECT_EQ(two, again) << cmd;
    std::string other;
    ASSERT_EQ(cli(cmd + " " + pair() + " --measures w1,mmd,js,sliced --seed 100 --json", &other, &err), 0);
    EXPECT_NE(one, other) << cmd;
  }
}

TEST(CliResamplingTest, BadCountsLevelsAndSizesExitTwoWithOneLine) {
  const char* cases[][2] = {
      {"spread --resamples 0", "--resamples"},        {"spread --resamples 100001", "100000"},
      {"spread --level 0", "level"},                  {"spread --level 1", "level"},
      {"spread --level 1.5", "level"},                {"spread --interval median", "--interval"},
      {"permute --permutations 0", "--permutations"}, {"permute --permutations 100001", "100000"},
      {"sizes --sizes 10,100000", "size 100000"},     {"sizes --repeats 0", "--repeats"},
      {"sizes --sizes 0", "--sizes"},                 {"spread --seed -4", "--seed"},
  };
  for (const auto& c : cases) {
    std::string out, err;
    EXPECT_EQ(cli(std::string(c[0]) + " " + pair() + " --measures w1", &out, &err), 2) << c[0];
    EXPECT_NE(err.find(c[1]), std::string::npos) << c[0] << ": " << err;
    EXPECT_EQ(std::count(err.begin(), err.end(), '\n'), 1) << err;
  }
}

TEST(CliResamplingTest, HelpSaysWhichIntervalAndThatBiasIsNotShown) {
  std::string out;
  ASSERT_EQ(cli("spread --help", &out), 0);
  EXPECT_NE(out.find("percentile interval"), std::string::npos);
  EXPECT_NE(out.find("basic"), std::string::npos);
  EXPECT_NE(out.find("NOT show the estimator's"), std::string::npos);
  ASSERT_EQ(cli("permute --help", &out), 0);
  EXPECT_NE(out.find("Phipson & Smyth"), std::string::npos);
}

}  // namespace
}  // namespace barrow
