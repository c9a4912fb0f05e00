// The histogram estimator of the density measures: grid convention, the parallel-segments
// example, the auto rules, and agreement with numpy.histogram2d + SciPy on weighted clouds.
#include <gtest/gtest.h>

#include <cmath>
#include <random>
#include <sstream>

#include "density/histogram_grid.h"
#include "density/pooled_stats.h"
#include "measures/density_measures.h"
#include "measures/evaluate.h"
#include "measures/registry.h"
#include "support/test_support.h"

namespace barrow {
namespace {

// A = {(0, z_i)}, B = {(θ, z_i)} with the same z (REFERENCES.md row 1a/1d).
void segments(double theta, int n, unsigned seed, Cloud* a, Cloud* b) {
  std::mt19937 rng(seed);
  std::uniform_real_distribution<double> u(0.0, 1.0);
  Eigen::MatrixX2d pa(n, 2), pb(n, 2);
  for (int i = 0; i < n; ++i) {
    const double z = u(rng);
    pa.row(i) << 0.0, z;
    pb.row(i) << theta, z;
  }
  *a = Cloud("A", pa);
  *b = Cloud("B", pb);
}

Result run(const char* id, const Cloud& a, const Cloud& b, std::initializer_list<const char*> sets) {
  EvalRequest req;
  for (const char* s : sets) EXPECT_FALSE(req.params.assign(s)) << s;
  return evaluateMeasure(*MeasureRegistry::instance().find(id), a, b, req);
}

// [P] Arjovsky, Chintala, Bottou 2017, Sec. 2, Example 1 with the histogram plug-in of
// REFERENCES.md row 1d ([D] + scipy definitions): bin 0.25, edges at −h/2 + kh. While both
// segments share an x-bin the clouds bin identically (all exactly 0); once θ crosses the edge
// at h/2 the supports are disjoint: JS = ln 2, TV = 1, KL = +∞ both ways, H = 1.
TEST(HistogramTest, ParallelSegmentsJumpExactlyAtTheBinEdge) {
  const auto sets = {"density.estimator=hist", "density.bin=0.25", "density.origin=-0.125"};
  for (double theta : {0.124, -0.124, 0.0}) {
    Cloud a, b;
    segments(theta, 400, 3, &a, &b);
    for (const char* id : {"kl_ab", "kl_ba", "js", "tv", "hellinger"}) {
      const Result r = run(id, a, b, sets);
      EXPECT_EQ(r.status, Status::Ok) << id << " " << r.message;
      EXPECT_EQ(r.value, 0.0) << id << " at theta " << theta;
    }
  }
  for (double theta : {0.126, -0.126, 2.0}) {
    Cloud a, b;
    segments(theta, 400, 3, &a, &b);
    EXPECT_NEAR(run("js", a, b, sets).value, std::log(2.0), 1e-12);
    EXPECT_NEAR(run("tv", a, b, sets).value, 1.0, 1e-12);
    EXPECT_NEAR(run("hellinger", a, b, sets).value, 1.0, 1e-12);
    for (const char* id : {"kl_ab", "kl_ba"}) {
      const Result r = run(id, a, b, sets);
      EXPECT_EQ(r.status, Status::Infinite) << id;
      EXPECT_TRUE(std::isinf(r.value) && r.value > 0) << id;
      // The message says why: z in [0, 1) fills the 5 y-bins from −0.125 to 1.125, and all 5
      // occupied bins of one cloud are empty in the other.
      EXPECT_NE(r.message.find("+inf: 5 of the 5 bins"), std::string::npos) << r.message;
      EXPECT_EQ(r.details["empty_bins"], 5);
      EXPECT_NEAR(r.details["unmatched_mass"].get<double>(), 1.0, 1e-12);
    }
  }
}

// Bin (i, j) = [o + i·h, o + (i+1)·h) × ...: a point on an edge belongs to the bin above it
// [D] (the half-open convention of numpy.histogram for all but the last edge).
TEST(HistogramTest, EdgesBelongToTheBinAbove) {
  Eigen::MatrixX2d pa(1, 2), pb(1, 2);
  pa << 0.5, 0.0;
  pb << 0.4999999, 0.0;
  HistogramGrid g;
  g.bin = 0.5;
  const BinnedMasses m = binMasses(Cloud("A", pa), Cloud("B", pb), g);
  ASSERT_EQ(m.p.size(), 2);
  EXPECT_EQ(m.loX, 0);
  EXPECT_EQ(m.hiX, 1);
  EXPECT_EQ(m.binsA, 1);
  EXPECT_EQ(m.binsB, 1);
}

// Reference library: numpy.histogram2d with the same edges and weights, then
// scipy.stats.entropy, jensenshannon(p, q)**2, and the definitions of TV and H in NumPy.
TEST(HistogramTest, WeightedCloudsAgreeWithNumpyHistogramAndScipy) {
  if (!test::pythonHas("scipy, numpy")) GTEST_SKIP() << "python3-scipy not installed";
  std::mt19937 rng(11);
  std::normal_distribution<double> g(0.0, 1.0);
  std::uniform_real_distribution<double> u(0.2, 3.0);
  Eigen::MatrixX2d pa(300, 2), pb(250, 2);
  Eigen::VectorXd wa(300), wb(250);
  for (int i = 0; i < 300; ++i) {
    pa.row(i) << g(rng), 0.5 * g(rng);
    wa(i) = u(rng);
  }
  for (int i = 0; i < 250; ++i) {
    pb.row(i) << 0.7 + 1.2 * g(rng), g(rng);
    wb(i) = u(rng);
  }
  const Cloud a("A", pa, wa), b("B", pb, wb);
  const double bin = 0.4, ox = -0.13, oy = 0.07;
  std::ostringstream py;
  py.precision(17);
  py << "import numpy as np\nfrom scipy.stats import entropy\nfrom scipy.spatial.distance import jensenshannon\n"
     << "a=" << test::pyPoints(a) << "\nb=" << test::pyPoints(b) << "\nwa=" << test::pyWeights(a)
     << "\nwb=" << test::pyWeights(b) << "\nh=" << bin << "\nox=" << ox << "\noy=" << oy << "\n"
     << "ex=ox+h*np.arange(-40,41)\ney=oy+h*np.arange(-40,41)\n"
        "p=np.histogram2d(a[:,0],a[:,1],bins=[ex,ey],weights=wa)[0].ravel()\n"
        "q=np.histogram2d(b[:,0],b[:,1],bins=[ex,ey],weights=wb)[0].ravel()\n"
        "print(repr(entropy(q,p)), repr(jensenshannon(p,q)**2), repr(0.5*np.abs(p-q).sum()),"
        " repr(np.sqrt(0.5*((np.sqrt(p)-np.sqrt(q))**2).sum())), int((p>0).sum()), int((q>0).sum()))\n";
  std::istringstream out(test::runPython(py.str()));
  std::string klba;
  double js = 0, tv = 0, h = 0;
  int binsA = 0, binsB = 0;
  out >> klba >> js >> tv >> h >> binsA >> binsB;
  ASSERT_TRUE(out);
  const auto sets = {"density.bin=0.4", "density.origin=-0.13,0.07"};
  const Result rjs = run("js", a, b, sets);
  EXPECT_NEAR(rjs.value, js, 1e-12);
  EXPECT_EQ(rjs.details["bins_a"], binsA);
  EXPECT_EQ(rjs.details["bins_b"], binsB);
  EXPECT_NEAR(run("tv", a, b, sets).value, tv, 1e-12);
  EXPECT_NEAR(run("hellinger", a, b, sets).value, h, 1e-12);
  const Result rkl = run("kl_ba", a, b, sets);
  if (klba == "inf") {
    EXPECT_EQ(rkl.status, Status::Infinite);
  } else {
    EXPECT_NEAR(rkl.value, std::stod(klba), 1e-12);
  }
}

// The auto rules, recomputed in NumPy from their stated formulas (weighted pooled sample
// ½A + ½B): bin = 3.504·rms(sd_x, sd_y)·N^{-1/4} (Scott 1992, Sec. 3.4 (mem)), N = 1/Σw²;
// origin = the pooled minimum per axis. [CP] for the pooling, the formulas as documented.
TEST(HistogramTest, AutoBinAndOriginFollowTheirDocumentedFormulas) {
  if (!test::pythonHas("numpy")) GTEST_SKIP() << "python3-numpy not installed";
  std::mt19937 rng(2);
  std::normal_distribution<double> g(0.0, 1.0);
  Eigen::MatrixX2d pa(120, 2), pb(80, 2);
  Eigen::VectorXd wa(120), wb(80);
  for (int i = 0; i < 120; ++i) {
    pa.row(i) << 3 + g(rng), -2 + 0.3 * g(rng);
    wa(i) = 1 + (i % 3);
  }
  for (int i = 0; i < 80; ++i) {
    pb.row(i) << 4 + 2 * g(rng), g(rng);
    wb(i) = 1;
  }
  const Cloud a("A", pa, wa), b("B", pb, wb);
  std::ostringstream py;
  py << "import numpy as np\na=" << test::pyPoints(a) << "\nb=" << test::pyPoints(b)
     << "\nwa=" << test::pyWeights(a) << "\nwb=" << test::pyWeights(b) << "\n"
     << "x=np.vstack([a,b]); w=np.concatenate([wa/2,wb/2])\n"
        "sd=np.sqrt(np.diag(np.cov(x.T,aweights=w,bias=True)))\n"
        "N=1/np.sum(w**2)\nh=3.504*np.sqrt(np.mean(sd**2))*N**-0.25\n"
        "o=x.min(axis=0)\nprint(repr(h), repr(o[0]), repr(o[1]))\n";
  std::istringstream out(test::runPython(py.str()));
  double h = 0, ox = 0, oy = 0;
  out >> h >> ox >> oy;
  ASSERT_TRUE(out);
  const PooledStats s = pooledStats(a, b);
  EXPECT_NEAR(autoBinWidth(s), h, 1e-12 * h);
  EXPECT_NEAR(autoOrigin(s, autoBinWidth(s)).x(), ox, 1e-12);
  EXPECT_NEAR(autoOrigin(s, autoBinWidth(s)).y(), oy, 1e-12);

  // The result names what it used, and freeze() writes those numbers so a sweep keeps them.
  const Result r = run("js", a, b, {});
  EXPECT_EQ(r.details["estimator"], "hist");
  EXPECT_NEAR(r.details["bin"].get<double>(), h, 1e-12 * h);
  EXPECT_NE(r.details["bin_rule"].get<std::string>().find("auto"), std::string::npos);
  EXPECT_NE(r.details["origin_rule"].get<std::string>().find("auto"), std::string::npos);
  const Measure& js = *MeasureRegistry::instance().find("js");
  std::string error;
  const ParamSet frozen = js.freeze(a, b, resolveParams(js, ParamSet(), &error));
  ASSERT_TRUE(error.empty());
  EXPECT_NEAR(frozen.real("density.bin"), h, 1e-12 * h);
  EXPECT_NEAR(frozen.pair("density.origin").first, ox, 1e-12);
  EvalRequest req;
  req.params = frozen;
  const Result again = evaluateMeasure(js, a, b, req);
  EXPECT_EQ(again.value, r.value);
  EXPECT_EQ(again.details["bin_rule"], "given");
  // Frozen at this configuration, the grid stays put when A moves (a sweep's θ).
  Cloud moved = a;
  moved.points.col(0).array() += 5.0;
  req.params = frozen;
  EXPECT_DOUBLE_EQ(evaluateMeasure(js, moved, b, req).details["bin"].get<double>(), frozen.real("density.bin"));
}

// REFERENCES.md row 1e: at θ = 0 with independent z (n = 400, 8 y-bins) the plug-in is not 0
// but sampling noise (JS ≈ 0.0052, TV ≈ 0.073 in one draw). [D] second order in p̂ − q̂ with K
// equal bins: E JS ≈ Σ E(p̂−q̂)²/(8m) = (K−1)/(4n) = 0.004375; E TV ≈ ½K·√(2/π)·√(2(1/K)(1−1/K)/n)
// = 0.0747. Means over 40 seeds; tolerances 3 sd of those means (sd of one draw: 0.0024, 0.021).
TEST(HistogramTest, IndependentSamplesAtThetaZeroShowTheNoiseFloor) {
  double js = 0, tv = 0;
  const int seeds = 40;
  for (int seed = 0; seed < seeds; ++seed) {
    std::mt19937_64 rng(1000 + seed);
    std::uniform_real_distribution<double> u(0.0, 1.0);
    Eigen::MatrixX2d pa(400, 2), pb(400, 2);
    for (int i = 0; i < 400; ++i) {
      pa.row(i) << 0.0, u(rng);
      pb.row(i) << 0.0, u(rng);
    }
    const Cloud a("A", pa), b("B", pb);
    js += run("js", a, b, {"density.bin=0.125", "density.origin=-0.0625,0"}).value / seeds;
    tv += run("tv", a, b, {"density.bin=0.125", "density.origin=-0.0625,0"}).value / seeds;
  }
  EXPECT_NEAR(js, 7.0 / 1600.0, 3 * 0.0024 / std::sqrt(40.0));
  EXPECT_NEAR(tv, 0.0747, 3 * 0.021 / std::sqrt(40.0));
}

// [D] every point coincides: σ = 0, so the rule falls back to bin 1 and all divergences are 0.
TEST(HistogramTest, CoincidentCloudsFallBackToUnitBin) {
  const Cloud a("A", Eigen::MatrixX2d::Constant(5, 2, 2.5)), b("B", Eigen::MatrixX2d::Constant(3, 2, 2.5));
  const Result r = run("kl_ab", a, b, {});
  EXPECT_EQ(r.status, Status::Ok);
  EXPECT_EQ(r.value, 0.0);
  EXPECT_EQ(r.details["bin"], 1.0);
}

TEST(HistogramTest, BinTooSmallForTheCoordinatesIsInvalidInput) {
  Eigen::MatrixX2d pa(2, 2), pb(1, 2);
  pa << 0, 0, 1e6, 0;
  pb << 0, 1;
  const Result r = run("js", Cloud("A", pa), Cloud("B", pb), {"density.bin=1e-12", "density.origin=0"});
  EXPECT_EQ(r.status, Status::InvalidInput);
  EXPECT_NE(r.message.find("row 2"), std::string::npos) << r.message;
  EXPECT_NE(r.message.find("density.bin"), std::string::npos) << r.message;
}

}  // namespace
}  // namespace barrow
