// Fréchet distance (W2 between fitted Gaussians): the closed form on samples with exact
// moments, SciPy's sqrtm form on random weighted clouds, singular covariances, the gradient.
#include <gtest/gtest.h>

#include <Eigen/Cholesky>
#include <Eigen/Eigenvalues>
#include <Eigen/Geometry>
#include <cmath>
#include <random>
#include <sstream>

#include "measures/evaluate.h"
#include "measures/registry.h"
#include "support/test_support.h"

namespace barrow {
namespace {

const Measure& frechet() { return *MeasureRegistry::instance().find("frechet"); }

Result runFrechet(const Cloud& a, const Cloud& b) { return evaluateMeasure(frechet(), a, b, EvalRequest{}); }

// A cloud whose weighted mean is exactly m and weighted (ddof = 0) covariance exactly S, up
// to rounding: whiten a random sample with its own moments, colour it with chol(S), shift.
Cloud withExactMoments(const char* name, int n, unsigned seed, const Eigen::Vector2d& m, const Eigen::Matrix2d& S,
                       bool weighted) {
  std::mt19937 rng(seed);
  std::normal_distribution<double> g(0, 1);
  std::uniform_real_distribution<double> u(0.2, 2.0);
  Eigen::MatrixX2d z(n, 2);
  Eigen::VectorXd w = Eigen::VectorXd::Ones(n);
  for (int i = 0; i < n; ++i) {
    z(i, 0) = g(rng);
    z(i, 1) = g(rng);
    if (weighted) w(i) = u(rng);
  }
  const Eigen::VectorXd wn = w / w.sum();
  const Eigen::RowVector2d mean = wn.transpose() * z;
  z.rowwise() -= mean;
  const Eigen::Matrix2d C = z.transpose() * wn.asDiagonal() * z;
  const Eigen::SelfAdjointEigenSolver<Eigen::Matrix2d> eig(C);
  const Eigen::Matrix2d whiten = eig.eigenvectors() * eig.eigenvalues().cwiseInverse().cwiseSqrt().asDiagonal() *
                                 eig.eigenvectors().transpose();
  const Eigen::Matrix2d L = S.llt().matrixL();
  Eigen::MatrixX2d p = (z * whiten.transpose()) * L.transpose();
  p.rowwise() += m.transpose();
  return Cloud(name, p, w);
}

// [P] Dowson & Landau 1982; REFERENCES 2a: m1 = 0, S1 = [[2,.5],[.5,1]], m2 = (1,-1),
// S2 = [[1,-.3],[-.3,.5]]: W2^2 = 2.553301412771 (W2 = 1.597905320340), tol 1e-10 rel.
// 2b: the same number is the FID-style squared score, kept in details as fd2.
TEST(FrechetTest, MatchesGaussianClosedFormOnSamplesWithExactMoments) {
  Eigen::Matrix2d S1, S2;
  S1 << 2, 0.5, 0.5, 1;
  S2 << 1, -0.3, -0.3, 0.5;
  const Cloud a = withExactMoments("A", 50, 1, Eigen::Vector2d(0, 0), S1, false);
  const Cloud b = withExactMoments("B", 37, 2, Eigen::Vector2d(1, -1), S2, true);
  const Result r = runFrechet(a, b);
  ASSERT_EQ(r.status, Status::Ok) << r.message;
  EXPECT_NEAR(r.details["fd2"].get<double>(), 2.553301412771, 1e-10 * 2.553301412771);
  EXPECT_NEAR(r.value, 1.597905320340, 1e-10 * 1.597905320340);
  EXPECT_TRUE(r.message.empty()) << r.message;
}

// Reference: the FID-style form |m1-m2|^2 + tr(S1 + S2 - 2 sqrtm(S1 S2).real) with
// scipy.linalg.sqrtm and np.cov(aweights = w, bias = True) (ddof = 0; Heusel et al. 2017).
TEST(FrechetTest, MatchesScipySqrtmFormOnWeightedClouds) {
  if (!test::pythonHas("numpy, scipy")) GTEST_SKIP() << "python3-scipy missing";
  std::mt19937 rng(3);
  std::normal_distribution<double> g(0, 1);
  std::uniform_real_distribution<double> u(0.1, 1.0);
  Eigen::MatrixX2d pa(70, 2), pb(45, 2);
  Eigen::VectorXd wa(70), wb(45);
  for (int i = 0; i < 70; ++i) {
    pa.row(i) << g(rng), 0.6 * g(rng) + 0.4 * pa(i, 0);
    wa(i) = u(rng);
  }
  for (int i = 0; i < 45; ++i) {
    pb.row(i) << 2 + 1.5 * g(rng), -1 + 0.3 * g(rng);
    wb(i) = u(rng);
  }
  wa(4) = 0;  // no mass: leaves the moments unchanged
  const Cloud a("A", pa, wa), b("B", pb, wb);
  const std::string py = "import numpy as np\nfrom scipy.linalg import sqrtm\nX = " + test::pyPoints(a) + "\nY = " +
                         test::pyPoints(b) + "\na = " + test::pyWeights(a) + "\nb = " + test::pyWeights(b) +
                         "\nm1, m2 = a @ X, b @ Y\n"
                         "S1, S2 = np.cov(X.T, aweights=a, bias=True), np.cov(Y.T, aweights=b, bias=True)\n"
                         "fd2 = np.sum((m1 - m2) ** 2) + np.trace(S1 + S2 - 2 * sqrtm(S1 @ S2).real)\n"
                         "print(repr(float(fd2)))\n";
  const double fd2 = std::stod(test::runPython(py));
  EXPECT_NEAR(runFrechet(a, b).details["fd2"].get<double>(), fd2, 1e-10 * fd2);
}

// REFERENCES 1j [D]: the parallel segments (0, z) and (theta, z) with the same z have equal
// singular covariances diag(0, var z), and FD^2 = theta^2. A warning names the singularity.
TEST(FrechetTest, ParallelSegmentsGiveTheShift) {
  std::mt19937 rng(4);
  std::uniform_real_distribution<double> u(0, 1);
  Eigen::MatrixX2d p(200, 2);
  for (int i = 0; i < 200; ++i) p.row(i) << 0, u(rng);
  for (double angle : {0.0, 0.3}) {  // also turned as a whole: the same numbers [D]
    const Eigen::Matrix2d turn = Eigen::Rotation2Dd(angle).toRotationMatrix();
    for (double theta : {1e-3, 0.5, 2.0}) {
      Eigen::MatrixX2d q = p;
      q.col(0).array() += theta;
      const Result r = runFrechet(Cloud("A", p * turn.transpose()), Cloud("B", q * turn.transpose()));
      ASSERT_EQ(r.status, Status::Ok);
      EXPECT_NEAR(r.value, theta, 1e-12) << theta << " at angle " << angle;
      EXPECT_NE(r.message.find("singular"), std::string::npos) << r.message;
    }
  }
}

// [D] degenerate Gaussians: one point each -> FD = distance of the points. Two segments
// through the same centre, unit variance along directions at angle phi: W2^2 = 2 - 2|cos phi|
// (the best coupling of the two 1-D laws is the monotone one); phi = 90 deg gives sqrt(2).
TEST(FrechetTest, OneAndTwoPointCloudsGiveTheDegenerateGaussianDistance) {
  const Cloud p1("A", (Eigen::MatrixX2d(1, 2) << 1, 1).finished()), p2("B", (Eigen::MatrixX2d(1, 2) << 4, 5).finished());
  EXPECT_NEAR(runFrechet(p1, p2).value, 5.0, 1e-14);
  const Cloud ax("A", (Eigen::MatrixX2d(2, 2) << -1, 0, 1, 0).finished());
  for (double phi : {0.0, 0.4, M_PI / 2, 2.5}) {
    const Cloud line("B", (Eigen::MatrixX2d(2, 2) << -std::cos(phi), -std::sin(phi), std::cos(phi), std::sin(phi)).finished());
    const Result r = runFrechet(ax, line);
    EXPECT_NEAR(r.value * r.value, 2 - 2 * std::abs(std::cos(phi)), 1e-12) << phi;
    EXPECT_NE(r.message.find("collinear"), std::string::npos);
  }
}

// [D] derivative of FD^2 through the weighted moments (d tr M^{1/2} = tr(M^{-1/2} dM)/2),
// against central finite differences of the value. Singular clouds: no closed form.
TEST(FrechetTest, GradientMatchesFiniteDifferences) {
  Eigen::Matrix2d S1, S2;
  S1 << 1.2, 0.3, 0.3, 0.7;
  S2 << 0.5, -0.2, -0.2, 1.5;
  Cloud a = withExactMoments("A", 9, 5, Eigen::Vector2d(0.3, 0), S1, true);
  const Cloud b = withExactMoments("B", 7, 6, Eigen::Vector2d(1, 2), S2, true);
  a.weights(1) = 0.0;
  const auto g = test::analyticGradientA(frechet(), a, b, ParamSet{});
  ASSERT_TRUE(g.has_value());
  EXPECT_LT((*g - test::finiteDifferenceGradientA(frechet(), a, b, ParamSet{}, 1e-6)).cwiseAbs().maxCoeff(), 1e-7);
  EXPECT_EQ(g->row(1).norm(), 0.0);
  const Cloud ax("A", (Eigen::MatrixX2d(2, 2) << -1, 0, 1, 0).finished());
  EXPECT_FALSE(test::analyticGradientA(frechet(), ax, b, ParamSet{}).has_value());
}

}  // namespace
}  // namespace barrow
