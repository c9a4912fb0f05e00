// barrow-cli from the outside: the things a user must be able to trust — a value with status ok
// is right (weights that overflow, coordinates too large for squared costs), warm starts do not
// change a mix sweep, and the smaller promises of each command (help, output checks, θ text).
#include <gtest/gtest.h>

#include <cmath>
#include <nlohmann/json.hpp>
#include <sstream>

#include "support/test_support.h"

namespace barrow {
namespace {

int cli(const std::string& args, std::string* out = nullptr, std::string* err = nullptr) {
  return test::runCommand(std::string(BARROW_CLI) + " " + args, out, err);
}

std::string sample(const std::string& scenario, const char* which) {
  return test::samplesDir() + "/" + scenario + "/" + which;
}

nlohmann::json measureJson(const std::string& a, const std::string& b, const std::string& extra = "") {
  std::string out, err;
  cli("measure --a " + a + " --b " + b + " --json " + extra, &out, &err);
  return nlohmann::json::parse(out);
}

// Weights are normalised at use, so multiplying all of A's weights by one factor changes
// nothing [D: scale invariance of the normalisation]. With weights of 1e308 the plain sum
// overflows; every measure must still give the values of the same cloud with weights 1.
TEST(CliTrustTest, HugeWeightsGiveTheSameValuesAsTheirNormalisedForm) {
  const std::string big = test::tempPath("big_w.csv"), small = test::tempPath("small_w.csv"),
                    b = test::tempPath("b_for_w.csv");
  test::writeText(big, "x,y,w\n0,0,1e308\n1,0,1e308\n0.3,0.8,5e307\n");
  test::writeText(small, "x,y,w\n0,0,1\n1,0,1\n0.3,0.8,0.5\n");
  test::writeText(b, "x,y\n3,0\n4,1\n3.5,-0.5\n");
  const auto jb = measureJson(big, b), js = measureJson(small, b);
  ASSERT_EQ(jb["measures"].size(), js["measures"].size());
  for (std::size_t k = 0; k < js["measures"].size(); ++k) {
    const auto& x = jb["measures"][k];
    const auto& y = js["measures"][k];
    EXPECT_EQ(x["status"], y["status"]) << y["id"];
    if (y["value"].is_number()) {
      ASSERT_TRUE(x["value"].is_number()) << y["id"];
      EXPECT_NEAR(x["value"].get<double>(), y["value"].get<double>(), 1e-12 * std::max(1.0, std::abs(y["value"].get<double>())))
          << y["id"];
    }
  }
}

// Coordinates of 1e300: squared costs overflow. The measures that need them say so (not a
// parameter the user never set), and the command exits 2 naming them.
TEST(CliTrustTest, CoordinatesTooLargeForSquaredCostsExitTwoWithTheRealCause) {
  const std::string a = test::tempPath("huge_a.csv"), b = test::tempPath("huge_b.csv");
  test::writeText(a, "0,0\n1e300,0\n");
  test::writeText(b, "0,1e300\n1,1\n");
  std::string out, err;
  EXPECT_EQ(cli("measure --a " + a + " --b " + b + " --measures entropic,sinkhorn,w2 --json", &out, &err), 2) << out;
  EXPECT_NE(err.find("entropic"), std::string::npos) << err;
  EXPECT_NE(err.find("too large"), std::string::npos) << err;
  EXPECT_EQ(err.find("epsilon"), std::string::npos) << err;
  EXPECT_EQ(std::count(err.begin(), err.end(), '\n'), 1) << err;
  const auto j = nlohmann::json::parse(out);
  for (const auto& m : j["measures"])
    if (m["status"] == "ok") {
      EXPECT_TRUE(m["value"].is_number() && std::isfinite(m["value"].get<double>())) << m.dump();
    }
}

// Under the mix family A_1 = B, so the debiased Sinkhorn divergence is 0 there [D: S(b,b)=0],
// warm starts or not, on any thread count.
TEST(CliTrustTest, MixSweepEndsAtZeroSinkhornDivergenceWarmOrCold) {
  for (const char* flags : {"", " --no-warm-start", " --threads 2", " --threads 4"}) {
    const std::string path = test::tempPath("mix.csv");
    std::string out, err;
    ASSERT_EQ(cli("sweep --a " + sample("sensor_drift", "a.csv") + " --b " + sample("sensor_drift", "b.csv") +
                      " --family mix --steps 11 --no-refine --measures sinkhorn --out " + path + flags,
                  &out, &err),
              0)
        << err;
    std::istringstream in(test::readText(path));
    std::string line, last;
    while (std::getline(in, line))
      if (!line.empty() && line[0] != '#') last = line;
    ASSERT_EQ(last.rfind("1,", 0), 0u) << last;
    const double s = std::stod(last.substr(2, last.find(',', 2) - 2));
    EXPECT_NEAR(s, 0.0, 1e-6) << flags << ": " << last;
  }
}

TEST(CliTrustTest, EachCommandHasItsOwnHelp) {
  std::string out, err;
  ASSERT_EQ(cli("sweep --help", &out, &err), 0);
  for (const char* s : {"shift", "rotate", "degrees", "scale", "interpolate", "mix", "--center", "--threads",
                        "--refine-budget", "--reference", "identity"})
    EXPECT_NE(out.find(s), std::string::npos) << s;
  ASSERT_EQ(cli("findings --help", &out, &err), 0);
  for (const char* s : {"unresolved", "Assumption", "resolution"}) EXPECT_NE(out.find(s), std::string::npos) << s;
  ASSERT_EQ(cli("plan --help", &out, &err), 0);
  for (const char* s : {"i,j,mass,ax,ay,bx,by,cost", "--out -"}) EXPECT_NE(out.find(s), std::string::npos) << s;
}

TEST(CliTrustTest, SmallPromisesOfTheCommands) {
  const std::string a = sample("parallel_segments", "a.csv"), b = sample("parallel_segments", "b.csv");
  std::string out, err;
  // A folder given as a cloud file says so.
  EXPECT_EQ(cli("measure --a " + test::samplesDir() + " --b " + b, &out, &err), 2);
  EXPECT_NE(err.find("directory"), std::string::npos) << err;
  // A number beyond the doubles is "out of range", not "not a number".
  const std::string huge = test::tempPath("e400.csv");
  test::writeText(huge, "x,y\n0,0\n1e400,1\n");
  EXPECT_EQ(cli("measure --a " + huge + " --b " + b, &out, &err), 2);
  EXPECT_NE(err.find("out of range"), std::string::npos) << err;
  EXPECT_NE(err.find(":3"), std::string::npos) << err;  // the line
  // A repeated option is an error, not a silent override.
  EXPECT_EQ(cli("measure --a " + a + " --a " + b + " --b " + b, &out, &err), 2);
  EXPECT_NE(err.find("twice"), std::string::npos) << err;
  // plan --out - writes the CSV to standard output.
  ASSERT_EQ(cli("plan --a " + a + " --b " + b + " --out -", &out, &err), 0) << err;
  EXPECT_EQ(out.rfind("i,j,mass,ax,ay,bx,by,cost\n", 0), 0u) << out.substr(0, 80);
  // An output that cannot be written fails before the work starts.
  EXPECT_EQ(cli("sweep --a " + a + " --b " + b + " --family shift --out /nonexistent-folder/s.csv", &out, &err), 2);
  EXPECT_NE(err.find("does not exist"), std::string::npos) << err;
}

// θ on the grid is printed as the decimal a user expects, and the reference θ0 is the family's
// identity, printed after the run.
TEST(CliTrustTest, GridThetaIsTheExpectedDecimalAndTheReferenceIsPrinted) {
  const std::string path = test::tempPath("grid.csv");
  std::string out, err;
  ASSERT_EQ(cli("sweep --a " + sample("parallel_segments", "a.csv") + " --b " + sample("parallel_segments", "b.csv") +
                    " --family mix --steps 41 --no-refine --measures w1 --out " + path,
                &out, &err),
            0)
      << err;
  const std::string csv = test::readText(path);
  EXPECT_NE(csv.find("\n0.975,"), std::string::npos);
  EXPECT_EQ(csv.find("0.9750000000000001"), std::string::npos);
  EXPECT_NE(out.find("θ0 = 0 (the family's identity"), std::string::npos) << out;
  EXPECT_NE(csv.find("# reference=0\n"), std::string::npos);
}

// Histogram KL between clouds whose bins never meet is +∞ at every θ, and the findings say
// exactly that [D: an empty q-bin under p-mass gives +∞].
TEST(CliTrustTest, InfiniteEverywhereFindingIsPlain) {
  const std::string a = test::tempPath("far_a.csv"), b = test::tempPath("far_b.csv");
  test::writeText(a, "0,0\n0.1,0.1\n0.2,0\n");
  test::writeText(b, "10,10\n10.1,10.1\n10.2,10\n");
  std::string out, err;
  ASSERT_EQ(cli("findings --a " + a + " --b " + b + " --family shift --from 0 --to 1 --steps 11 --measures kl_ab "
                "--set density.bin=0.25",
                &out, &err),
            0)
      << err;
  EXPECT_NE(out.find("kl_ab is +∞ at every θ of the sweep"), std::string::npos) << out;
}

}  // namespace
}  // namespace barrow
