// Units beside every value the CLI prints or writes (measures/units.h), and the automatic
// rules stated in `measure --help`.
#include <gtest/gtest.h>

#include <map>
#include <nlohmann/json.hpp>
#include <sstream>

#include "measures/registry.h"
#include "measures/units.h"
#include "support/test_support.h"

namespace barrow {
namespace {

int cli(const std::string& args, std::string* out = nullptr, std::string* err = nullptr) {
  return test::runCommand(std::string(BARROW_CLI) + " " + args, out, err);
}

const std::string kPair =
    " --a " + test::samplesDir() + "/ring_vs_blob/a.csv --b " + test::samplesDir() + "/ring_vs_blob/b.csv";

// [D] The contract (DEVELOPERS.md, Command-line contract): `measure --json` entries carry "unit"; it is the
// unit the measure declares for the settings used, so it follows entropic.p and chamfer.squared.
TEST(CliUnitsTest, JsonEntriesCarryTheUnitOfTheSettingsUsed) {
  for (const std::string& sets : {std::string(), std::string(" --set entropic.p=1 --set chamfer.squared=true")}) {
    std::string out, err;
    ASSERT_EQ(cli("measure" + kPair + " --json" + sets, &out, &err), 0) << err;
    const auto j = nlohmann::json::parse(out);
    ParamSet p;
    if (!sets.empty()) {
      p.assign("entropic.p=1");
      p.assign("chamfer.squared=true");
    }
    ASSERT_EQ(j["measures"].size(), MeasureRegistry::instance().defaults().size());
    for (const auto& row : j["measures"]) {
      const Measure* m = MeasureRegistry::instance().find(row["id"].get<std::string>());
      ASSERT_NE(m, nullptr);
      ASSERT_TRUE(row.contains("unit")) << row.dump();
      EXPECT_EQ(row["unit"], measureUnit(*m, p)) << m->id();
    }
    std::map<std::string, std::string> unit;
    for (const auto& row : j["measures"]) unit[row["id"].get<std::string>()] = row["unit"].get<std::string>();
    EXPECT_EQ(unit["w2"], "length");
    EXPECT_EQ(unit["js"], "nats");
    EXPECT_EQ(unit["entropic"], sets.empty() ? "length^2" : "length");
    EXPECT_EQ(unit["chamfer"], sets.empty() ? "length" : "length^2");
  }
}

// [CP] The text table puts the unit right after the number.
TEST(CliUnitsTest, TextOutputPrintsTheUnitBesideEachValue) {
  std::string out, err;
  ASSERT_EQ(cli("measure" + kPair + " --measures w2,entropic,js,tv,energy", &out, &err), 0) << err;
  std::istringstream in(out);
  std::string line;
  std::map<std::string, std::string> unitAfterValue;
  while (std::getline(in, line)) {
    if (line.rfind("  ", 0) == 0) continue;  // detail lines
    std::istringstream s(line);
    std::string id, value, unit;
    s >> id >> value >> unit;
    unitAfterValue[id] = unit;
  }
  EXPECT_EQ(unitAfterValue["w2"], "length");
  EXPECT_EQ(unitAfterValue["entropic"], "length^2");
  EXPECT_EQ(unitAfterValue["js"], "nats");
  EXPECT_EQ(unitAfterValue["tv"], "probability");
  EXPECT_EQ(unitAfterValue["energy"], "length^0.5");
}

// [D] The sweep CSV's comment header names each column's unit.
TEST(CliUnitsTest, SweepCsvHeaderListsTheUnitOfEveryColumn) {
  const std::string path = test::tempPath("units-sweep.csv");
  std::string out, err;
  ASSERT_EQ(cli("sweep" + kPair + " --family shift --from 0 --to 1 --steps 3 --no-refine --measures w1,sinkhorn,js,mmd"
                " --set sinkhorn.p=1 --out " + path,
                &out, &err),
            0)
      << err;
  const std::string csv = test::readText(path);
  for (const char* line : {"# unit.w1=length\n", "# unit.sinkhorn=length\n", "# unit.js=nats\n",
                           "# unit.mmd=dimensionless\n"})
    EXPECT_NE(csv.find(line), std::string::npos) << line << csv;
  EXPECT_NE(csv.find("d_<id> is in that unit per unit of θ"), std::string::npos);
}

// [D] `measure --help` states each measure's unit and why, and every automatic rule as the
// code applies it (pooled_stats.h, kde_bandwidth.h, knn_kl.h, median_distance.h).
TEST(CliUnitsTest, MeasureHelpStatesUnitsAndEveryAutomaticRule) {
  std::string out, err;
  ASSERT_EQ(cli("measure --help", &out, &err), 0) << err;
  for (const Measure* m : MeasureRegistry::instance().all())
    EXPECT_NE(out.find("unit: " + m->unitRule()), std::string::npos) << m->id();
  for (const char* rule : {"50/50 mixture", "ddof = 0", "N = 1/sum w^2", "50 + 20 -> 57.14",
                           "3.504*sigma*N^(-1/4)", "sigma = sqrt((sd_x^2 + sd_y^2)/2)", "the pooled minimum per axis",
                           "linear-interpolation quantile", "numpy.quantile's default", "IQR/1.349",
                           "must be equal (relative spread <= 1e-9)", "k-th positive distances",
                           "unweighted, each unordered pair once", "mean of the two middle values"})
    EXPECT_NE(out.find(rule), std::string::npos) << rule;
}

}  // namespace
}  // namespace barrow
