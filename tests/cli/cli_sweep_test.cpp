// barrow-cli sweep / findings / demo from the outside: CSV header and shape, inf and empty
// cells, the findings JSON shape, the demo, and exit code 2 for bad options.
#include <gtest/gtest.h>

#include <filesystem>
#include <nlohmann/json.hpp>
#include <sstream>

#include "measures/registry.h"
#include "support/test_support.h"

namespace barrow {
namespace {

int cli(const std::string& args, std::string* out = nullptr, std::string* err = nullptr) {
  return test::runCommand(std::string(BARROW_CLI) + " " + args, out, err);
}

std::string segments(const char* which) { return test::samplesDir() + "/parallel_segments/" + which; }

// The registered measures among `wanted`, comma-separated.
std::vector<std::string> split(const std::string& line) {
  std::vector<std::string> out;
  std::stringstream ss(line);
  std::string item;
  while (std::getline(ss, item, ',')) out.push_back(item);
  if (!line.empty() && line.back() == ',') out.push_back("");
  return out;
}

struct Csv {
  std::vector<std::string> comments;
  std::vector<std::string> header;
  std::vector<std::vector<std::string>> rows;
};

Csv readCsv(const std::string& path) {
  Csv c;
  std::istringstream in(test::readText(path));
  std::string line;
  while (std::getline(in, line)) {
    if (line.empty()) continue;
    if (line[0] == '#') c.comments.push_back(line);
    else if (c.header.empty()) c.header = split(line);
    else c.rows.push_back(split(line));
  }
  return c;
}

TEST(CliSweepTest, SweepWritesTheContractHeaderOneRowPerThetaAndSettings) {
  const std::string ids = "sliced,mmd,js,w1";
  const std::string path = test::tempPath("sweep.csv");
  std::string out, err;
  ASSERT_EQ(cli("sweep --a " + segments("a.csv") + " --b " + segments("b.csv") +
                    " --family shift --direction 2,0 --from -1 --to 1 --steps 21 --measures " + ids +
                    " --set density.bin=0.25 --out " + path,
                &out, &err),
            0)
      << err;
  EXPECT_TRUE(err.empty()) << err;  // no progress lines when stderr is not a terminal
  EXPECT_NE(out.find("wrote " + path), std::string::npos) << out;
  const Csv c = readCsv(path);
  const auto idList = split(ids);
  std::vector<std::string> expected = {"theta"};
  for (const auto& id : idList) expected.push_back(id);
  for (const auto& id : idList) expected.push_back("d_" + id);
  EXPECT_EQ(c.header, expected);
  ASSERT_GE(c.rows.size(), 21u);
  double previous = -INFINITY;
  for (const auto& row : c.rows) {
    ASSERT_EQ(row.size(), expected.size());
    const double t = std::stod(row[0]);
    EXPECT_GT(t, previous);
    previous = t;
  }
  EXPECT_EQ(std::stod(c.rows.front()[0]), -1.0);
  EXPECT_EQ(std::stod(c.rows.back()[0]), 1.0);
  std::string comments;
  for (const auto& l : c.comments) comments += l + "\n";
  for (const char* s : {"# family=shift", "# direction=1,0", "# from=-1", "# to=1", "# steps=21", "# reference=0",
                        "# refine_budget=",
                        "# seed=", "# threads=", "# frozen."})
    EXPECT_NE(comments.find(s), std::string::npos) << s << "\n" << comments;
  std::remove(path.c_str());
}

// KL with a histogram is +∞ once A_θ leaves B's bins (REFERENCES 1d): written `inf`, with an
// empty slope; a measure that fails (σ too small for the kernel) leaves its cells empty.
TEST(CliSweepTest, InfiniteCellsAreInfAndFailedCellsAreEmpty) {
  const std::string path = test::tempPath("sweep.csv");
  std::string out, err;
  ASSERT_EQ(cli("sweep --a " + segments("a.csv") + " --b " + segments("a.csv") +
                    " --family shift --from 0 --to 1 --steps 11 --measures kl_ab,mmd --set density.bin=0.25"
                    " --set density.origin=-0.125,-0.125 --set mmd.sigma=1e-200 --out " + path,
                &out, &err),
            0)
      << err;
  EXPECT_NE(out.find("note: mmd failed at"), std::string::npos) << out;
  const Csv c = readCsv(path);
  ASSERT_EQ(c.header, (std::vector<std::string>{"theta", "kl_ab", "mmd", "d_kl_ab", "d_mmd"}));
  const auto& last = c.rows.back();
  EXPECT_EQ(last[1], "inf");
  EXPECT_EQ(last[3], "");
  EXPECT_EQ(c.rows.front()[1], "0");  // same cloud, same bins
  for (const auto& row : c.rows) {
    EXPECT_EQ(row[2], "");
    EXPECT_EQ(row[4], "");
  }
  std::remove(path.c_str());
}

void expectFindingsShape(const std::string& json, std::size_t measures) {
  const auto j = nlohmann::json::parse(json);
  ASSERT_TRUE(j.is_object());
  ASSERT_EQ(j.size(), 1u);
  ASSERT_TRUE(j["findings"].is_array());
  ASSERT_EQ(j["findings"].size(), measures);
  for (const auto& f : j["findings"]) {
    std::vector<std::string> keys;
    for (auto it = f.begin(); it != f.end(); ++it) keys.push_back(it.key());
    std::sort(keys.begin(), keys.end());
    EXPECT_EQ(keys, (std::vector<std::string>{"continuous", "flat", "id", "jumps", "lipschitz", "monotone", "summary",
                                              "unresolved"}));
    EXPECT_TRUE(f["id"].is_string());
    EXPECT_TRUE(f["continuous"].is_boolean());
    EXPECT_TRUE(f["monotone"].is_boolean());
    EXPECT_TRUE(f["lipschitz"].is_number() || f["lipschitz"].is_null());
    EXPECT_TRUE(f["summary"].is_string());
    for (const char* list : {"jumps", "unresolved"})
      for (const auto& jump : f[list]) {
        EXPECT_TRUE(jump["theta"].is_number());
        EXPECT_TRUE(jump["size"].is_number() || jump["size"].is_null());
        if (jump["size"].is_null()) {
          EXPECT_TRUE(jump.contains("to") || jump.contains("from")) << jump.dump();
        }
      }
    for (const auto& s : f["flat"]) {
      ASSERT_TRUE(s.is_array());
      EXPECT_EQ(s.size(), 2u);
    }
  }
  // The contract's key order.
  EXPECT_EQ(json.rfind("{\"findings\":[{\"id\":", 0), 0u) << json;
}

TEST(CliSweepTest, FindingsFromCsvAndFromSweepOptionsAgree) {
  const std::string ids = "js,sliced";
  const std::string opts = "--a " + segments("a.csv") + " --b " + segments("a.csv") +
                           " --family shift --from -1 --to 1 --steps 41 --measures " + ids +
                           " --set density.bin=0.25 --set density.origin=-0.125,-0.125";
  const std::string path = test::tempPath("sweep.csv");
  std::string direct, fromCsv, text, err;
  ASSERT_EQ(cli("findings " + opts + " --json --out " + path, &direct, &err), 0) << err;
  ASSERT_EQ(cli("findings --sweep " + path + " --json", &fromCsv, &err), 0) << err;
  const std::size_t n = split(ids).size();
  expectFindingsShape(direct, n);
  EXPECT_EQ(direct, fromCsv);  // the CSV keeps every number and the refinement tolerance
  ASSERT_EQ(cli("findings --sweep " + path, &text, &err), 0) << err;
  EXPECT_EQ(std::size_t(std::count(text.begin(), text.end(), '\n')), n) << text;  // one line each
  if (MeasureRegistry::instance().find("js")) {
    const auto j = nlohmann::json::parse(fromCsv);
    EXPECT_FALSE(j["findings"][0]["continuous"].get<bool>()) << fromCsv;
    EXPECT_EQ(j["findings"][0]["jumps"].size(), 2u) << fromCsv;
  }
  std::remove(path.c_str());
}

TEST(CliSweepTest, DemoWritesCloudsAndSweepAndPrintsFindings) {
  const std::string dir = test::tempPath("demo");
  std::string out, err;
  ASSERT_EQ(cli("demo --out " + dir, &out, &err), 0) << err;
  for (const char* f : {"a.csv", "b.csv", "sweep.csv"}) EXPECT_TRUE(std::filesystem::exists(dir + "/" + f)) << f;
  const Csv c = readCsv(dir + "/sweep.csv");
  EXPECT_EQ(c.header.size(), 1 + 2 * MeasureRegistry::instance().defaults().size());
  EXPECT_GE(c.rows.size(), 121u);
  for (const Measure* m : MeasureRegistry::instance().defaults())
    EXPECT_NE(out.find("\n" + m->id() + " "), std::string::npos) << m->id() << "\n" << out;
  std::string json;
  ASSERT_EQ(cli("findings --sweep " + dir + "/sweep.csv --json", &json, &err), 0) << err;
  expectFindingsShape(json, MeasureRegistry::instance().defaults().size());
  std::filesystem::remove_all(dir);
}

TEST(CliSweepTest, BadOptionsExitTwoWithOneLine) {
  const std::string ab = "--a " + segments("a.csv") + " --b " + segments("b.csv");
  const std::string out = " --out " + test::tempPath("never.csv");
  const std::string badCsv = test::tempPath("bad-sweep.csv");
  test::writeText(badCsv, "theta,w1,d_w2\n0,1,2\n");
  const struct {
    std::string args;
    std::string message;
  } cases[] = {
      {"sweep " + ab + " --family twist" + out, "unknown family 'twist'"},
      {"sweep " + ab + out, "needs --family"},
      {"sweep " + ab + " --family shift", "needs --out"},
      {"sweep " + ab + " --family shift --steps 1" + out, "at least 2 steps"},
      {"sweep " + ab + " --family shift --steps 2.5" + out, "--steps: '2.5' is not a whole number"},
      {"sweep " + ab + " --family shift --from 1 --to 0" + out, "'to' must be greater"},
      {"sweep " + ab + " --family shift --direction 1" + out, "--direction: expected two numbers"},
      {"sweep " + ab + " --family shift --direction 0,0" + out, "direction must not be zero"},
      {"sweep " + ab + " --family rotate --center 1,x" + out, "--center: expected two numbers"},
      {"sweep " + ab + " --family mix --to 2" + out, "takes θ in [0, 1]"},
      {"sweep " + ab + " --family shift --reference 5" + out, "reference θ lies outside"},
      {"sweep " + ab + " --family shift --threads -1" + out, "--threads"},
      {"sweep " + ab + " --family shift --measures nosuch" + out, "unknown measure 'nosuch'"},
      {"sweep " + ab + " --family shift --set nosuch.key=1" + out, "unknown parameter 'nosuch.key'"},
      {"sweep --a " + test::dataDir() + "/bad/nan.csv --b " + segments("b.csv") + " --family shift" + out,
       "nan.csv:3"},
      {"findings --sweep " + test::tempPath("missing.csv"), "cannot open"},
      {"findings --sweep " + badCsv, badCsv + ":1: field 'column 3': expected 'd_w1'"},
      {"findings --sweep " + badCsv + " --family shift", "either --sweep FILE or the sweep options"},
      {"findings", "needs --sweep FILE or the sweep options"},
      {"demo --threads -2", "--threads"},
      {"demo --bogus", "unknown option --bogus"},
  };
  for (const auto& c : cases) {
    std::string o, err;
    EXPECT_EQ(cli(c.args, &o, &err), 2) << c.args << "\n" << err;
    EXPECT_NE(err.find(c.message), std::string::npos) << c.args << "\n" << err;
    EXPECT_EQ(std::count(err.begin(), err.end(), '\n'), 1) << err;
  }
  std::remove(badCsv.c_str());
}

}  // namespace
}  // namespace barrow
