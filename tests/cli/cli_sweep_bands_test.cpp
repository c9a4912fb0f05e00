// barrow-cli sweep --resamples B: lo_<id>,hi_<id> columns after the d_<id> columns, and
// findings that read jumps and flat stretches against the bands.
#include <gtest/gtest.h>

#include <algorithm>
#include <sstream>

#include "support/test_support.h"

namespace barrow {
namespace {

int cli(const std::string& args, std::string* out = nullptr, std::string* err = nullptr) {
  return test::runCommand(std::string(BARROW_CLI) + " " + args, out, err);
}

TEST(CliSweepBandsTest, ResamplesAddBandColumnsAfterTheSlopes) {
  const std::string d = test::samplesDir() + "/ring_vs_blob/";
  const std::string csv = test::tempPath("bands_sweep.csv");
  std::string out, err;
  ASSERT_EQ(cli("sweep --a " + d + "a.csv --b " + d + "b.csv --family shift --from -1 --to 1 --steps 5 "
                "--measures w1,js --no-refine --resamples 10 --seed 3 --out " + csv, &out, &err), 0) << err;
  std::istringstream in(test::readText(csv));
  std::string line, header;
  while (std::getline(in, line))
    if (!line.empty() && line[0] != '#') {
      header = line;
      break;
    }
  EXPECT_EQ(header, "theta,w1,js,d_w1,d_js,lo_w1,hi_w1,lo_js,hi_js");
  std::getline(in, line);
  EXPECT_EQ(std::count(line.begin(), line.end(), ','), 8) << line;
  ASSERT_EQ(cli("findings --sweep " + csv, &out, &err), 0) << err;
  EXPECT_EQ(cli("sweep --a " + d + "a.csv --b " + d + "b.csv --family shift --resamples 0 --out " + csv, &out, &err), 2);
  EXPECT_NE(err.find("resamples"), std::string::npos) << err;
}

}  // namespace
}  // namespace barrow
