// SHA-256 of the report's cloud hashes, against the standard's own example and Python's
// hashlib (an independent implementation) across the padding boundaries.
#include <gtest/gtest.h>

#include <sstream>

#include "report/sha256.h"
#include "support/test_support.h"

namespace barrow {
namespace {

// [P] FIPS 180-2, Appendix B.1 (one-block message "abc") and B.2 (two-block message)
// (REFERENCES: report / SHA-256).
TEST(Sha256Test, MatchesTheStandardsWorkedExamples) {
  EXPECT_EQ(sha256Hex("abc"), "ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad");
  EXPECT_EQ(sha256Hex("abcdbcdecdefdefgefghfghighijhijkijkljklmklmnlmnomnopnopq"),
            "248d6a61d20638b8e5c026930c3e6039a33ce45964ff2167f6ecedd419db06c1");
}

// [P] Python's hashlib.sha256 on messages of every length around the 55/56/64-byte padding
// boundaries, an empty message and a long one.
TEST(Sha256Test, AgreesWithHashlibAcrossPaddingBoundaries) {
  const std::string py =
      "import hashlib\n"
      "for n in [0,1,54,55,56,57,63,64,65,119,120,127,128,1000]:\n"
      "    print(hashlib.sha256(bytes((i*7+3) % 256 for i in range(n))).hexdigest())\n";
  const std::string out = test::runPython(py);
  std::istringstream lines(out);
  for (int n : {0, 1, 54, 55, 56, 57, 63, 64, 65, 119, 120, 127, 128, 1000}) {
    std::string msg;
    for (int i = 0; i < n; ++i) msg.push_back(char((i * 7 + 3) % 256));
    std::string expected;
    std::getline(lines, expected);
    EXPECT_EQ(sha256Hex(msg), expected) << "length " << n;
  }
}

}  // namespace
}  // namespace barrow
