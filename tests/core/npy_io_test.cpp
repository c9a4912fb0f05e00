// .npy cloud files, including fixtures written by NumPy itself (Debian python3-numpy).
#include <gtest/gtest.h>

#include "io/npy_io.h"
#include "support/test_support.h"

namespace barrow {
namespace {

TEST(NpyIoTest, WriteThenReadIsExact) {
  Eigen::MatrixX2d p(3, 2);
  p << 0.1, 1.0 / 3.0, -2e-300, 1e300, 5, -0.0;
  Eigen::VectorXd w(3);
  w << 0.2, 0.3, 0.5;
  const Cloud c("rt", p, w);
  const std::string bytes = formatCloudNpy(c);
  EXPECT_EQ((bytes.size() - 3 * 3 * 8) % 64, 0u);  // header padded to 64 bytes (NEP 1)
  auto back = parseCloudNpy(bytes, "rt.npy");
  ASSERT_TRUE(back) << back.error.text();
  EXPECT_EQ(back.value->points, c.points);
  EXPECT_EQ(back.value->weights, c.weights);
}

// Reference: numpy.save / numpy.lib.format.write_array for each layout and dtype.
TEST(NpyIoTest, ReadsWhatNumpyWrites) {
  if (!test::pythonHas("numpy")) GTEST_SKIP() << "python3-numpy missing";
  const std::string dir = test::tempPath("npy");
  const std::string script = R"(
import numpy as np, numpy.lib.format as f, os
d = ')" + dir + R"('
os.makedirs(d)
a = np.array([[0.1, 1/3, 0.25], [-2.5, 1e10, 0.75], [7.0, -0.5, 0.0]])
np.save(d + '/c64.npy', a)
np.save(d + '/f64.npy', np.asfortranarray(a))
np.save(d + '/c32.npy', a.astype('<f4'))
np.save(d + '/be64.npy', a.astype('>f8'))
np.save(d + '/fbe32.npy', np.asfortranarray(a[:, :2].astype('>f4')))
np.save(d + '/i32.npy', np.array([[1, 2], [3, 4]], dtype='<i4'))
np.save(d + '/u8.npy', np.array([[1, 2], [3, 4]], dtype='u1'))
for v in [(2, 0), (3, 0)]:
    with open(d + '/v%d.npy' % v[0], 'wb') as fh:
        f.write_array(fh, a, version=v)
)";
  test::runPython(script);
  const double a[3][3] = {{0.1, 1.0 / 3.0, 0.25}, {-2.5, 1e10, 0.75}, {7.0, -0.5, 0.0}};
  for (const std::string name : {"c64", "f64", "be64", "v2", "v3"}) {
    auto r = readCloudNpy(dir + "/" + name + ".npy");
    ASSERT_TRUE(r) << r.error.text();
    ASSERT_EQ(r.value->size(), 3);
    for (int i = 0; i < 3; ++i) {
      EXPECT_EQ(r.value->points(i, 0), a[i][0]) << name;
      EXPECT_EQ(r.value->points(i, 1), a[i][1]) << name;
      EXPECT_EQ(r.value->weights(i), a[i][2]) << name;
    }
  }
  auto c32 = readCloudNpy(dir + "/c32.npy");
  ASSERT_TRUE(c32);
  EXPECT_EQ(c32.value->points(0, 1), double(float(1.0 / 3.0)));
  auto fbe = readCloudNpy(dir + "/fbe32.npy");
  ASSERT_TRUE(fbe) << fbe.error.text();
  EXPECT_EQ(fbe.value->points(1, 1), double(float(1e10)));
  EXPECT_DOUBLE_EQ(fbe.value->weights(0), 1.0 / 3.0);
  auto i32 = readCloudNpy(dir + "/i32.npy");
  ASSERT_TRUE(i32);
  EXPECT_EQ(i32.value->points(1, 0), 3);
  auto u8 = readCloudNpy(dir + "/u8.npy");
  ASSERT_TRUE(u8);
  EXPECT_EQ(u8.value->points(1, 1), 4);
}

// Reference: numpy.load of our file gives the same numbers.
TEST(NpyIoTest, NumpyReadsWhatWeWrite) {
  if (!test::pythonHas("numpy")) GTEST_SKIP() << "python3-numpy missing";
  Eigen::MatrixX2d p(2, 2);
  p << 0.1, 0.2, 0.3, 1.0 / 7.0;
  const Cloud c("w", p);
  const std::string path = test::tempPath("ours.npy");
  ASSERT_FALSE(writeCloudNpy(path, c));
  const auto out = test::runPython("import numpy as np\na = np.load('" + path +
                                   "')\nprint(a.shape, a.dtype, repr(float(a[1,1])))\n");
  EXPECT_EQ(out, "(2, 3) float64 0.14285714285714285\n");
}

std::string header(const std::string& dict, int major = 1) {
  std::string out("\x93NUMPY", 6);
  out += char(major);
  out += char(0);
  const std::string d = dict + "\n";
  out += char(d.size() & 0xff);
  out += char((d.size() >> 8) & 0xff);
  if (major > 1) out += std::string("\0\0", 2);
  return out + d;
}

TEST(NpyIoTest, BadFilesNameFieldAndReason) {
  const std::string f8 = "{'descr': '<f8', 'fortran_order': False, 'shape': (2, 2), }";
  struct Case {
    std::string bytes;
    const char* expect;
  } cases[] = {
      {"", "not a .npy file"},
      {"hello world, not numpy", "not a .npy file"},
      {header(f8) + std::string(20, '\0'), "truncated"},
      {header("{'descr': '<c16', 'fortran_order': False, 'shape': (2, 2), }"), "'<c16' is not supported"},
      {header("{'descr': '<f8', 'fortran_order': False, 'shape': (2, 4), }"), "not (n, 2) or (n, 3)"},
      {header("{'descr': '<f8', 'fortran_order': False, 'shape': (0, 2), }"), "no rows"},
      {header("{'descr': '<f8', 'shape': (2, 2), }"), "fortran_order"},
      {std::string("\x93NUMPY\x01\x00\xff\xff", 10), "truncated inside the header"},
      {std::string("\x93NUMPY\x02\x00\xff\xff\xff\x7f", 12), "exceeds"},
      {header(f8, 9), "version 9"},
  };
  for (const auto& c : cases) {
    auto r = parseCloudNpy(c.bytes, "bad.npy");
    ASSERT_FALSE(r) << c.expect;
    EXPECT_NE(r.error.text().find(c.expect), std::string::npos) << r.error.text();
    EXPECT_EQ(r.error.text().rfind("bad.npy", 0), 0u);
  }
  // NaN in the data names the row and column.
  std::string nan = header(f8);
  const double vals[4] = {1, 2, NAN, 4};
  nan.append(reinterpret_cast<const char*>(vals), sizeof vals);
  auto r = parseCloudNpy(nan, "bad.npy");
  ASSERT_FALSE(r);
  EXPECT_NE(r.error.text().find("row 2, column x"), std::string::npos) << r.error.text();
  EXPECT_NE(r.error.text().find("NaN"), std::string::npos);
}

}  // namespace
}  // namespace barrow
