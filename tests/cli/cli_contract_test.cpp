// barrow-cli from the outside: help, exit codes and one-line messages for bad input.
#include <gtest/gtest.h>

#include <sstream>
#include <vector>

#include "measures/registry.h"
#include "support/test_support.h"

namespace barrow {
namespace {

int cli(const std::string& args, std::string* out = nullptr, std::string* err = nullptr) {
  return test::runCommand(std::string(BARROW_CLI) + " " + args, out, err);
}

TEST(CliContractTest, HelpListsEveryCommand) {
  std::string out;
  EXPECT_EQ(cli("--help", &out), 0);
  for (const char* c : {"measure", "plan", "sweep", "findings", "demo", "--set", "--json"})
    EXPECT_NE(out.find(c), std::string::npos) << c;
}

TEST(CliContractTest, UnknownCommandAndOptionExitTwo) {
  std::string err;
  EXPECT_EQ(cli("frobnicate", nullptr, &err), 2);
  EXPECT_NE(err.find("unknown command"), std::string::npos);
  EXPECT_EQ(cli("measure --a x.csv --b y.csv --bogus 1", nullptr, &err), 2);
  EXPECT_NE(err.find("--bogus"), std::string::npos);
}

TEST(CliContractTest, MissingRequiredOptionExitsTwo) {
  std::string err;
  EXPECT_EQ(cli("measure --a " + test::samplesDir() + "/ring_vs_blob/a.csv", nullptr, &err), 2);
  EXPECT_NE(err.find("--b"), std::string::npos) << err;
}

// Each bad file in tests/data/bad gets exit code 2 and a single line naming file and reason.
TEST(CliContractTest, BadFilesExitTwoWithOneLineNamingFileAndReason) {
  const std::string good = test::samplesDir() + "/ring_vs_blob/b.csv";
  const struct {
    const char* file;
    const char* reason;
  } cases[] = {
      {"nan.csv", ":3: column 1 (x): value is NaN"},
      {"inf.csv", ":2: column 2 (y): value is infinite"},
      {"text_in_number.csv", ":2: column 2 (y): 'abc' is not a number"},
      {"wrong_columns.csv", ":2: found 2 columns; expected 3"},
      {"empty.csv", "no data rows"},
      {"negative_weight.csv", ":3: column 3 (w): weight -0.5 is negative"},
      {"truncated.npy", "truncated"},
      {"wrong_dtype.npy", "'<U8' is not supported"},
      {"huge_header.npy", "exceeds"},
      {"npy_empty_shape.npy", "field 'shape'"},          // was an uncaught out_of_range, exit 1
      {"npy_shape_overflow.npy", "the shape claims"},    // size product wrapped: bad_alloc, exit 1
      {"npy_claims_1e12_rows.npy", "the shape claims 1000000000000 rows"},
      {"does_not_exist.csv", "cannot open"},
  };
  for (const auto& c : cases) {
    const std::string path = test::dataDir() + "/bad/" + c.file;
    std::string out, err;
    EXPECT_EQ(cli("measure --a " + path + " --b " + good, &out, &err), 2) << c.file << ": " << err;
    EXPECT_NE(err.find(path), std::string::npos) << err;
    EXPECT_NE(err.find(c.reason), std::string::npos) << err;
    EXPECT_EQ(std::count(err.begin(), err.end(), '\n'), 1) << err;
    EXPECT_TRUE(out.empty()) << out;
  }
}

TEST(CliContractTest, BadSetParameterExitsTwo) {
  const std::string a = test::samplesDir() + "/ring_vs_blob/a.csv";
  const std::string b = test::samplesDir() + "/ring_vs_blob/b.csv";
  std::string err;
  EXPECT_EQ(cli("measure --a " + a + " --b " + b + " --set nosuch.key=1", nullptr, &err), 2);
  EXPECT_NE(err.find("unknown parameter 'nosuch.key'"), std::string::npos) << err;
  EXPECT_EQ(cli("measure --a " + a + " --b " + b + " --set novalue", nullptr, &err), 2);
  EXPECT_EQ(cli("measure --a " + a + " --b " + b + " --measures nosuch", nullptr, &err), 2);
  EXPECT_NE(err.find("unknown measure 'nosuch'"), std::string::npos) << err;
}

// [CP] Text output as command-line tables usually are: one line per measure with id, value,
// status and time, then its details as indented key=value lines — readable, not raw JSON.
TEST(CliContractTest, MeasureTextOutputIsOneRowPerMeasureWithIndentedDetails) {
  const std::string a = test::samplesDir() + "/ring_vs_blob/a.csv";
  const std::string b = test::samplesDir() + "/ring_vs_blob/b.csv";
  std::string out, err;
  ASSERT_EQ(cli("measure --a " + a + " --b " + b + " --measures w1,mmd", &out, &err), 0) << err;
  std::istringstream in(out);
  std::string line;
  std::vector<std::string> rows, details;
  while (std::getline(in, line)) (line.rfind("  ", 0) == 0 ? details : rows).push_back(line);
  ASSERT_EQ(rows.size(), 2u) << out;
  EXPECT_EQ(rows[0].rfind("w1 ", 0), 0u);
  EXPECT_EQ(rows[1].rfind("mmd ", 0), 0u);
  EXPECT_NE(out.find("pivots="), std::string::npos) << out;
  EXPECT_NE(out.find("sigma_rule="), std::string::npos) << out;
  EXPECT_EQ(out.find('{'), std::string::npos) << out;
  for (const auto& d : details) EXPECT_LE(d.size(), 200u) << d;
}

// [D] Every measure's id, one-line formula and parameters (key = default) in --help, read from
// the registry; one literal line pins the "valid" notation of a number-or-word setting.
TEST(CliContractTest, MeasureHelpListsEveryMeasureWithFormulaAndParameters) {
  std::string out, err;
  ASSERT_EQ(cli("measure --help", &out, &err), 0) << err;
  for (const Measure* m : MeasureRegistry::instance().all()) {
    EXPECT_NE(out.find("  " + m->id() + " "), std::string::npos) << m->id();
    EXPECT_NE(out.find(m->formula()), std::string::npos) << m->id();
    for (const ParamSpec& p : m->params()) EXPECT_NE(out.find(p.key + " = " + p.defaultValue), std::string::npos) << p.key;
  }
  EXPECT_NE(out.find("sinkhorn.epsilon = auto, valid > 0 | auto"), std::string::npos) << out;
}

}  // namespace
}  // namespace barrow
