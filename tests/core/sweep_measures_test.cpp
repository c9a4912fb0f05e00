// Sweeps of the real measures (from the registry) against published and derived values.
// A measure missing from the registry fails these tests (they never skip for it).
#include <gtest/gtest.h>

#include <cmath>

#include "families/family_map.h"
#include "io/cloud_file.h"
#include "measures/evaluate.h"
#include "measures/registry.h"
#include "scenario/generators.h"
#include "support/test_support.h"
#include "sweep/continuity.h"
#include "sweep/sweep_engine.h"

namespace barrow {
namespace {

const Measure* measure(const std::string& id) { return MeasureRegistry::instance().find(id); }

Cloud sample(const std::string& path) {
  auto c = readCloudFile(test::samplesDir() + "/" + path);
  EXPECT_TRUE(c) << c.error.text();
  return c ? *c.value : Cloud();
}

const SweepSeries* series(const SweepResult& r, const std::string& id) {
  for (const auto& s : r.series)
    if (s.id == id) return &s;
  return nullptr;
}
const Finding* finding(const std::vector<Finding>& f, const std::string& id) {
  for (const auto& x : f)
    if (x.id == id) return &x;
  return nullptr;
}

// Parallel segments, [P] Arjovsky, Chintala, Bottou 2017, Sec. 2, Example 1: A = {(0, z_i)},
// B = A, A_θ = A + (θ, 0). With the same samples W1 = W2 = |θ| exactly (REFERENCES 1b).
class ParallelSegmentsSweep : public ::testing::Test {
 protected:
  static void SetUpTestSuite() {
    const std::vector<std::string> wanted = {"w1", "w2", "sliced", "mmd", "energy", "sinkhorn", "frechet",
                                             "hausdorff", "chamfer", "js", "tv", "kl_ab", "kl_ba", "hellinger"};
    SweepRequest req;
    req.settings.measures = wanted;  // an unregistered id fails the sweep, and every test here
    const Cloud a = sample("parallel_segments/a.csv");
    req.settings.family = Family::Shift;
    req.settings.from = -1;
    req.settings.to = 1;
    req.settings.steps = 41;  // as in REFERENCES row 12
    // Histogram with x-bin width h = 0.25 and edges at −h/2 + kh (REFERENCES 1d), so A_θ and
    // B leave their common bin at |θ| = 0.125.
    for (const char* kv : {"density.estimator=hist", "density.bin=0.25", "density.origin=-0.125,-0.125",
                           "mmd.sigma=0.25", "sinkhorn.p=1", "sinkhorn.epsilon=0.01"})
      req.params.assign(kv);
    result_ = new SweepResult(runSweep(a, a, req));
    findings_ = new std::vector<Finding>(findContinuity(*result_));
  }
  static void TearDownTestSuite() {
    delete result_;
    delete findings_;
    result_ = nullptr;
    findings_ = nullptr;
  }
  // True when the sweep ran and `id` is in it.
  static bool have(const std::string& id) { return measure(id) && result_ && series(*result_, id); }
  void SetUp() override {
    ASSERT_TRUE(result_);
    ASSERT_TRUE(result_->message.empty()) << result_->message;
  }
  static SweepResult* result_;
  static std::vector<Finding>* findings_;
};
SweepResult* ParallelSegmentsSweep::result_ = nullptr;
std::vector<Finding>* ParallelSegmentsSweep::findings_ = nullptr;

TEST_F(ParallelSegmentsSweep, WassersteinIsAbsThetaAtEveryGridPoint) {
  for (const char* id : {"w1", "w2"}) {
    const SweepSeries* s = series(*result_, id);
    ASSERT_TRUE(s);
    for (std::size_t k = 0; k < result_->theta.size(); ++k)
      EXPECT_NEAR(s->value[k], std::abs(result_->theta[k]), 1e-12) << id << " θ=" << result_->theta[k];
  }
}

TEST_F(ParallelSegmentsSweep, TransportKernelAndSlicedMeasuresAreContinuous) {
  for (const char* id : {"w1", "w2", "sliced", "mmd", "energy", "sinkhorn"}) {
    ASSERT_TRUE(have(id)) << id;
    const Finding* f = finding(*findings_, id);
    ASSERT_TRUE(f) << id;
    EXPECT_TRUE(f->continuous) << f->summary;
    EXPECT_TRUE(f->jumps.empty()) << f->summary;
  }
}

// Slope bounds of REFERENCES row 12 [D] (triangle inequality): W_p, Hausdorff, FD and S_ε with
// cost |x−y| at most 1; SW2 at most 1/√2; MMD at most 1/σ (here σ = 0.25); Chamfer (mean,
// unsquared, added) at most 2. The energy bound 2 is for E = 2E|X−Y| − E|X−X'| − E|Y−Y'|
// (|E(θ) − E(θ')| ≤ 2|θ − θ'| by the triangle inequality [D]); the measure reports √E, which is
// not Lipschitz near θ = 0 (√E ≥ √(2|θ|/n) from the diagonal terms), so E = value² is checked.
TEST_F(ParallelSegmentsSweep, LipschitzEstimatesRespectTheTheoreticalBounds) {
  const std::vector<std::pair<std::string, double>> bounds = {
      {"w1", 1.0},       {"w2", 1.0},      {"hausdorff", 1.0}, {"frechet", 1.0},  {"sinkhorn", 1.0},
      {"sliced", M_SQRT1_2}, {"mmd", 4.0}, {"chamfer", 2.0}};
  int checked = 0;
  ASSERT_TRUE(have("energy"));
  {
    const SweepSeries* e = series(*result_, "energy");
    double worst = 0;
    for (std::size_t k = 1; k < result_->theta.size(); ++k)
      worst = std::max(worst, std::abs(e->value[k] * e->value[k] - e->value[k - 1] * e->value[k - 1]) /
                                  (result_->theta[k] - result_->theta[k - 1]));
    EXPECT_LE(worst, 2.0 * (1 + 1e-9));
    EXPECT_GT(worst, 0.5);
    ++checked;
  }
  for (const auto& [id, bound] : bounds) {
    ASSERT_TRUE(have(id)) << id;
    const Finding* f = finding(*findings_, id);
    ASSERT_TRUE(f);
    EXPECT_LE(f->lipschitz, bound * (1 + 1e-9)) << f->summary;
    EXPECT_GT(f->lipschitz, 0.0) << f->summary;
    ++checked;
  }
  EXPECT_EQ(checked, int(bounds.size()) + 1);
  if (measure("w1")) {
    EXPECT_NEAR(finding(*findings_, "w1")->lipschitz, 1.0, 1e-9);  // W1 = |θ| exactly
  }
}

// Histogram divergences: a step function of θ (REFERENCES 1d) — JS 0 → ln 2, TV 0 → 1,
// KL 0 → +∞ when A_θ leaves B's x-bin at |θ| = 0.125, then saturated: no gradient.
TEST_F(ParallelSegmentsSweep, HistogramDivergencesJumpAtTheBinEdgesAndSaturate) {
  const std::vector<std::pair<std::string, double>> top = {
      {"js", std::log(2.0)}, {"tv", 1.0}, {"kl_ab", INFINITY}, {"kl_ba", INFINITY}, {"hellinger", 1.0}};
  int checked = 0;
  for (const auto& [id, high] : top) {
    ASSERT_TRUE(have(id)) << id;
    const Finding* f = finding(*findings_, id);
    ASSERT_TRUE(f);
    EXPECT_FALSE(f->continuous) << f->summary;
    ASSERT_EQ(f->jumps.size(), 2u) << f->summary;
    EXPECT_NEAR(f->jumps[0].theta, -0.125, 2 * result_->refineTolerance) << f->summary;
    EXPECT_NEAR(f->jumps[1].theta, 0.125, 2 * result_->refineTolerance) << f->summary;
    if (std::isinf(high)) {
      EXPECT_TRUE(std::isinf(f->jumps[1].size) && f->jumps[1].size > 0) << f->summary;
    } else {
      EXPECT_NEAR(f->jumps[1].size, high, 1e-12) << f->summary;
      EXPECT_NEAR(f->jumps[0].size, -high, 1e-12) << f->summary;
    }
    ASSERT_EQ(f->flat.size(), 2u) << f->summary;
    EXPECT_EQ(f->flat[0].first, -1.0);
    EXPECT_NEAR(f->flat[0].second, -0.125, 1e-3);
    EXPECT_NEAR(f->flat[1].first, 0.125, 1e-3);
    EXPECT_EQ(f->flat[1].second, 1.0);
    EXPECT_TRUE(f->monotone) << f->summary;
    ++checked;
  }
  EXPECT_EQ(checked, int(top.size()));
  if (const Finding* js = finding(*findings_, "js")) {
    EXPECT_NE(js->summary.find("constant at 0.693 for θ ≤ -0.125 and for θ ≥ 0.125"), std::string::npos) << js->summary;
  }
}

// Displacement interpolation is a constant-speed geodesic: W2(A_t, B) = (1 − t) W2(A, B)
// [P] Santambrogio 2015 §5.4; Villani 2003 §5.1 (mem).
TEST(SweepMeasuresTest, InterpolationIsAConstantSpeedW2Geodesic) {
  ASSERT_NE(measure("w2"), nullptr) << "w2 is not registered";
  ShapeSpec sa{"mixture", 40, {0.0, 0.0}, 1.0, 0.3, 0.0, 11};
  ShapeSpec sb{"ring", 35, {1.5, -0.5}, 1.2, 0.0, 0.05, 12};
  Cloud a = generate(sa, "A"), b = generate(sb, "B");
  for (Eigen::Index i = 0; i < a.size(); ++i) a.weights(i) = 1.0 + (i % 4);  // uneven masses
  SweepRequest req;
  req.settings.family = Family::Interpolate;
  req.settings.from = 0;
  req.settings.to = 1;
  req.settings.steps = 11;
  req.settings.measures = {"w2"};
  const SweepResult r = runSweep(a, b, req);
  ASSERT_TRUE(r.message.empty()) << r.message;
  const double w0 = r.series[0].value[0];
  ASSERT_GT(w0, 0.5);
  // At t = 1, A_1 holds B's masses up to rounding (~1e-16); moving that much mass a unit
  // distance costs ~1e-16, so W2 = √cost is ~1e-8 there: checked on W2² at t = 1.
  for (std::size_t k = 0; k + 1 < r.theta.size(); ++k)
    EXPECT_NEAR(r.series[0].value[k], (1 - r.theta[k]) * w0, 1e-9) << "t=" << r.theta[k];
  EXPECT_EQ(r.theta.back(), 1.0);
  EXPECT_LT(r.series[0].value.back() * r.series[0].value.back(), 1e-15);
  EXPECT_EQ(r.series[0].gradientMethod, "analytic");
  for (std::size_t k = 1; k + 1 < r.theta.size(); ++k) EXPECT_NEAR(r.series[0].slope[k], -w0, 1e-6);
  EXPECT_TRUE(findContinuity(r)[0].monotone);
}

// Every analytic dD/dθ agrees with a central difference of the values at θ ± h, where the
// measure is differentiable (plan unique) [D].
TEST(SweepMeasuresTest, AnalyticSlopesAgreeWithFiniteDifferences) {
  ShapeSpec sa{"gaussian", 60, {0.0, 0.0}, 1.0, 0.0, 0.0, 21};
  ShapeSpec sb{"arcs", 50, {0.8, 0.3}, 1.0, 0.4, 0.05, 22};
  const Cloud a = generate(sa, "A"), b = generate(sb, "B");
  int checked = 0;
  for (const Family family : {Family::Shift, Family::Rotate}) {
    SweepRequest req;
    req.settings.family = family;
    req.settings.direction = {0.6, 0.8};
    req.settings.from = family == Family::Shift ? -0.4 : -20;
    req.settings.to = family == Family::Shift ? 0.4 : 20;
    req.settings.steps = 5;
    req.refineJumps = false;
    req.params.assign("mmd.sigma=0.7");
    req.params.assign("sinkhorn.epsilon=0.1");
    const SweepResult r = runSweep(a, b, req);
    ASSERT_FALSE(r.series.empty()) << r.message;
    for (const auto& s : r.series) {
      if (s.gradientMethod != "analytic") continue;
      const Measure* m = measure(s.id);
      ASSERT_TRUE(m);
      const FamilyMap probe(a, b, req.settings);
      for (std::size_t k = 1; k + 1 < r.theta.size(); ++k) {
        if (s.oneSided[k] || !std::isfinite(s.slope[k])) continue;
        const double h = 1e-5 * (req.settings.to - req.settings.from);
        EvalRequest er;
        er.params = s.frozen;
        const double up = evaluateMeasure(*m, probe.at(r.theta[k] + h), b, er).value;
        const double down = evaluateMeasure(*m, probe.at(r.theta[k] - h), b, er).value;
        const double fd = (up - down) / (2 * h);
        EXPECT_NEAR(s.slope[k], fd, 2e-4 * (1 + std::abs(fd))) << s.id << " " << familyName(family) << " θ=" << r.theta[k];
        ++checked;
      }
    }
  }
  EXPECT_GT(checked, 0) << "no measure gave an analytic slope";
}

// A steep but continuous curve is never a jump: MMD with σ = 0.01 on the parallel segments
// rises over a few σ, five times faster than the grid spacing, yet is continuous.
TEST(SweepMeasuresTest, MmdWithSmallSigmaIsSteepButNotAJump) {
  ASSERT_NE(measure("mmd"), nullptr) << "mmd is not registered";
  const Cloud a = sample("parallel_segments/a.csv");
  SweepRequest req;
  req.settings.family = Family::Shift;
  req.settings.from = -0.5;
  req.settings.to = 0.5;
  req.settings.steps = 21;
  req.settings.measures = {"mmd"};
  req.params.assign("mmd.sigma=0.01");
  const SweepResult r = runSweep(a, a, req);
  ASSERT_TRUE(r.message.empty()) << r.message;
  const Finding f = findContinuity(r)[0];
  EXPECT_TRUE(f.continuous) << f.summary;
  EXPECT_LE(f.lipschitz, 1.0 / 0.01 * (1 + 1e-9)) << f.summary;  // REFERENCES row 12
  EXPECT_GT(f.lipschitz, 6.0) << f.summary;  // steeper than any grid secant (≈ 4.9 at h = 0.05)
}

}  // namespace
}  // namespace barrow
