// Trained critics against the exact W1 (core/critic/critic_check.h): the certified bound of
// Kantorovich–Rubinstein duality, the optimal critic's unit gradient on transport lines
// (Gulrajani et al. 2017, Prop. 1), the effect of clipping (Arjovsky et al. 2017, Sec. 3) and
// the layer norms after spectral normalisation (Miyato et al. 2018) against numpy.linalg.svd.
// Sources: tests/REFERENCES.md, section "Critic".
#include <gtest/gtest.h>

#include <cmath>
#include <filesystem>
#include <nlohmann/json.hpp>
#include <sstream>

#include "critic_check/critic_check.h"
#include "critic/mlp_gradients.h"
#include "io/cloud_file.h"
#include "support/test_support.h"

namespace barrow::critic {
namespace {

Cloud segment(double x, int n) {
  Eigen::MatrixX2d p(n, 2);
  for (int i = 0; i < n; ++i) p.row(i) << x, n > 1 ? double(i) / (n - 1) : 0.0;
  return Cloud("", p);
}

CriticSettings quick(Method m, int steps) {
  CriticSettings s = defaultSettings(m);
  s.steps = steps;
  s.grid = 16;
  s.curvePoints = 2;
  return s;
}

// [P] Kantorovich–Rubinstein duality (C1): E_A f − E_B f ≤ Lip(f)·W1 for any f, so
// estimate / L_upper ≤ W1, with L_upper = Π‖W_l‖₂ ≥ Lip(f) for 1-Lipschitz activations [D].
// Trained with a larger step (1e-3) so the bound comes close to W1 and the check has teeth.
TEST(CriticCheckTest, CertifiedBoundNeverExceedsExactW1OnRandomWeightedInstances) {
  int close = 0;
  for (int k = 0; k < 50; ++k) {
    const Cloud a = test::gaussianCloud(12 + k % 9, 100 + k, 0.0, 1.0, true);
    const Cloud b = test::gaussianCloud(9 + k % 7, 300 + k, 0.3 + 0.05 * k, 0.7, true);
    const ExactReference ref = exactReference(a, b, nullptr);
    ASSERT_TRUE(ref.usable()) << ref.message;
    CriticSettings s = quick(Method(k % 3), 150);
    s.optimizer.rate = 1e-3;
    s.seed = std::uint64_t(k);
    const CriticCheck c = checkCritic(a, b, ref, s, nullptr);
    ASSERT_EQ(c.status, Status::Ok) << c.message;
    EXPECT_LE(c.lowerBound, ref.w1 * (1 + 1e-12) + 1e-15) << "instance " << k << " " << methodName(s.method);
    close += c.lowerBound > 0.5 * ref.w1;
  }
  EXPECT_GT(close, 10);  // the trained critics are not trivially far below W1
}

TEST(CriticCheckTest, CertifiedBoundNeverExceedsExactW1OnEverySample) {
  int scenarios = 0;
  for (const auto& dir : std::filesystem::directory_iterator(test::samplesDir())) {
    if (!std::filesystem::exists(dir.path() / "a.csv") || !std::filesystem::exists(dir.path() / "b.csv")) continue;
    auto la = readCloudFile((dir.path() / "a.csv").string());
    auto lb = readCloudFile((dir.path() / "b.csv").string());
    ASSERT_TRUE(la && lb) << dir.path();
    const ExactReference ref = exactReference(*la.value, *lb.value, nullptr);
    ASSERT_TRUE(ref.usable()) << ref.message;
    for (Method m : {Method::Clip, Method::Gp, Method::Sn}) {
      CriticSettings s = quick(m, 200);
      s.optimizer.rate = 1e-3;
      const CriticCheck c = checkCritic(*la.value, *lb.value, ref, s, nullptr);
      ASSERT_EQ(c.status, Status::Ok) << c.message;
      EXPECT_LE(c.lowerBound, ref.w1 * (1 + 1e-12) + 1e-15) << dir.path() << " " << methodName(m);
      EXPECT_GE(c.lipschitzUpper * (1 + 1e-9), c.lipschitzMeasured) << dir.path() << " " << methodName(m);
    }
    ++scenarios;
  }
  EXPECT_GE(scenarios, 5);
}

// [P] Gulrajani et al. 2017, Prop. 1 (C3): the optimal critic has ‖∇f‖ = 1 on the lines
// between coupled points. With λ = 10 the penalised optimum sits at ‖∇f‖ ≈ 1 + 1/(2λ) [D],
// so the mean over the lines is held to 0.1 and single points to 0.2 (minibatch noise).
void expectUnitGradientBetween(const Cloud& a, const Cloud& b, double d) {
  const ExactReference ref = exactReference(a, b, nullptr);
  ASSERT_NEAR(ref.w1, d, 1e-12);  // [D] every point moves straight across by d
  const CriticCheck c = checkCritic(a, b, ref, quick(Method::Gp, 2000), nullptr);
  ASSERT_EQ(c.status, Status::Ok);
  EXPECT_GE(c.estimate, 0.95 * d);
  Eigen::MatrixXd x(2, 19 * a.size());
  for (Eigen::Index i = 0; i < a.size(); ++i)
    for (int t = 1; t <= 19; ++t) x.col(i * 19 + t - 1) = (1 - t / 20.0) * a.point(i) + (t / 20.0) * b.point(i);
  const Activation act = c.settings.shape.activation;
  const Eigen::RowVectorXd norms = inputGradients(c.network, act, forward(c.network, act, x)).colwise().norm();
  EXPECT_NEAR(norms.mean(), 1.0, 0.1);
  EXPECT_LE((norms.array() - 1.0).abs().maxCoeff(), 0.2);
}

TEST(CriticCheckTest, GradientPenaltyCriticReachesDistanceOfTwoDiracs) {
  expectUnitGradientBetween(segment(0.0, 1), segment(1.5, 1), 1.5);
}

TEST(CriticCheckTest, GradientPenaltyCriticReachesDistanceOfParallelSegments) {
  expectUnitGradientBetween(segment(0.0, 60), segment(1.5, 60), 1.5);
}

// [P] Arjovsky et al. 2017, Sec. 3 (C2): clipping to [−c, c] makes f K(c)-Lipschitz with K
// set by c, so the estimate tracks K rather than W1: doubling c multiplies the estimate and
// L_upper alike (≈ 2^3 for three layers [D]), and estimate / L_upper stays ≤ W1.
TEST(CriticCheckTest, ClippedEstimateScalesLikeItsLipschitzBound) {
  const Cloud a = segment(0.0, 40), b = segment(1.5, 40);
  const ExactReference ref = exactReference(a, b, nullptr);
  std::vector<CriticCheck> runs;
  for (double c : {0.005, 0.01, 0.02}) {
    CriticSettings s = quick(Method::Clip, 1000);
    s.clip = c;
    runs.push_back(checkCritic(a, b, ref, s, nullptr));
    ASSERT_EQ(runs.back().status, Status::Ok);
    EXPECT_LE(runs.back().lowerBound, ref.w1 * (1 + 1e-12));
    EXPECT_LT(runs.back().estimate, 0.1 * ref.w1);  // a small c underestimates badly
  }
  for (std::size_t k = 1; k < runs.size(); ++k) {
    const double estRatio = runs[k].estimate / runs[k - 1].estimate;
    const double boundRatio = runs[k].lipschitzUpper / runs[k - 1].lipschitzUpper;
    EXPECT_GT(estRatio, 4.0);
    EXPECT_NEAR(std::log(estRatio), std::log(boundRatio), 0.2);
  }
}

std::string pyMatrix(const Eigen::MatrixXd& m) {
  std::ostringstream o;
  o.precision(17);
  o << "[";
  for (Eigen::Index r = 0; r < m.rows(); ++r) {
    o << (r ? "," : "") << "[";
    for (Eigen::Index c = 0; c < m.cols(); ++c) o << (c ? "," : "") << m(r, c);
    o << "]";
  }
  return o.str() + "]";
}

// [P] Miyato et al. 2018, Alg. 1 (C4): after normalisation each layer has spectral norm 1 up
// to the power iteration's error; reference singular values from numpy.linalg.svd (C5).
TEST(CriticCheckTest, SpectrallyNormalisedLayersHaveUnitNormByNumpySvd) {
  if (!test::pythonHas("numpy")) GTEST_SKIP() << "numpy is not installed";
  const Cloud a = segment(0.0, 40), b = segment(1.5, 40);
  const ExactReference ref = exactReference(a, b, nullptr);
  const CriticCheck c = checkCritic(a, b, ref, quick(Method::Sn, 1000), nullptr);
  ASSERT_EQ(c.status, Status::Ok);
  std::string py = "import numpy as np, json\nprint(json.dumps([float(np.linalg.svd(np.array(m), compute_uv=False)[0]) for m in [";
  // The layers of g, the network on the input frame's coordinates; f's first and last layers
  // carry 1/s and s on top (critic/input_frame.h), which leaves the product unchanged.
  for (int l = 0; l < c.unitNetwork.layers(); ++l) py += (l ? "," : "") + pyMatrix(c.unitNetwork.w[l]);
  py += "]]))\n";
  const auto sv = nlohmann::json::parse(test::runPython(py));
  ASSERT_EQ(int(sv.size()), c.unitNetwork.layers());
  double product = 1.0;
  for (int l = 0; l < c.unitNetwork.layers(); ++l) {
    EXPECT_NEAR(sv[l].get<double>(), 1.0, 0.01) << "layer " << l;
    EXPECT_NEAR(spectralNorm(c.unitNetwork.w[l]), sv[l].get<double>(), 1e-10);
    product *= sv[l].get<double>();
  }
  EXPECT_NEAR(c.lipschitzUpper, product, 1e-9);
}

TEST(CriticCheckTest, SameSeedGivesSameRunAndCancelStops) {
  const Cloud a = test::gaussianCloud(30, 1), b = test::gaussianCloud(25, 2, 1.0);
  const ExactReference ref = exactReference(a, b, nullptr);
  const CriticCheck x = checkCritic(a, b, ref, quick(Method::Gp, 100), nullptr);
  const CriticCheck y = checkCritic(a, b, ref, quick(Method::Gp, 100), nullptr);
  EXPECT_EQ(x.estimate, y.estimate);
  EXPECT_EQ(x.network.w[1], y.network.w[1]);
  std::atomic<bool> cancel{false};
  RunControl control;
  control.cancel = &cancel;
  int calls = 0;
  control.onProgress = [&](double) {
    if (++calls == 3) cancel = true;
    return true;
  };
  const CriticCheck z = checkCritic(a, b, ref, quick(Method::Gp, 1000), &control);
  EXPECT_EQ(z.status, Status::Cancelled);
  EXPECT_LT(z.steps, 1000);
}

TEST(CriticCheckTest, CorrelationWithExactPotentialIsHighForTrainedCritic) {
  // [D] Two parallel segments: the exact potential is x-linear; a trained GP critic follows it.
  const Cloud a = segment(0.0, 40), b = segment(1.5, 40);
  const ExactReference ref = exactReference(a, b, nullptr);
  const CriticCheck c = checkCritic(a, b, ref, quick(Method::Gp, 1000), nullptr);
  EXPECT_GT(c.potentialCorrelation, 0.95);
  EXPECT_LE(c.potentialCorrelation, 1.0 + 1e-12);
}

}  // namespace
}  // namespace barrow::critic
