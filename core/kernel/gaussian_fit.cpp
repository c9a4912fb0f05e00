#include "kernel/gaussian_fit.h"

#include <Eigen/Eigenvalues>
#include <cmath>

namespace barrow {

GaussianFit fitGaussian(const SupportPoints& s) {
  GaussianFit g;
  g.mean = s.points.transpose() * s.weights;
  const Eigen::MatrixX2d centred = s.points.rowwise() - g.mean.transpose();
  g.cov = centred.transpose() * s.weights.asDiagonal() * centred;
  g.cov(0, 1) = g.cov(1, 0) = 0.5 * (g.cov(0, 1) + g.cov(1, 0));
  g.rank = psdRank(g.cov);
  return g;
}

namespace {
template <class F>
Eigen::Matrix2d spectralMap(const Eigen::Matrix2d& m, F&& f) {
  const Eigen::SelfAdjointEigenSolver<Eigen::Matrix2d> eig(m);
  const Eigen::Vector2d lambda = eig.eigenvalues().unaryExpr(f);
  return eig.eigenvectors() * lambda.asDiagonal() * eig.eigenvectors().transpose();
}
}  // namespace

Eigen::Matrix2d psdSqrt(const Eigen::Matrix2d& m) {
  // An eigenvalue that should be 0 comes out as +-eps * |m| and its root as sqrt(eps) * |m|^(1/2),
  // which would leave ~1e-8 errors in FD for collinear clouds: treat rounding-level
  // eigenvalues (<= 1e-14 of the largest) as the zeros they are.
  const double top = Eigen::SelfAdjointEigenSolver<Eigen::Matrix2d>(m, Eigen::EigenvaluesOnly).eigenvalues()(1);
  const double floor = 1e-14 * std::max(top, 0.0);
  return spectralMap(m, [floor](double l) { return l > floor ? std::sqrt(l) : 0.0; });
}

int psdRank(const Eigen::Matrix2d& m) {
  const Eigen::Vector2d l = Eigen::SelfAdjointEigenSolver<Eigen::Matrix2d>(m, Eigen::EigenvaluesOnly).eigenvalues();
  const double top = l(1);
  if (!(top > 1e-300)) return 0;
  return l(0) > 1e-12 * top ? 2 : 1;
}

double gaussianW2Squared(const GaussianFit& g1, const GaussianFit& g2) {
  const Eigen::Matrix2d r2 = psdSqrt(g2.cov);
  Eigen::Matrix2d mid = r2 * g1.cov * r2;
  mid(0, 1) = mid(1, 0) = 0.5 * (mid(0, 1) + mid(1, 0));
  return (g1.mean - g2.mean).squaredNorm() + g1.cov.trace() + g2.cov.trace() - 2.0 * psdSqrt(mid).trace();
}

Eigen::Matrix2d gaussianW2CovGradient(const GaussianFit& g1, const GaussianFit& g2) {
  const Eigen::Matrix2d r2 = psdSqrt(g2.cov);
  Eigen::Matrix2d mid = r2 * g1.cov * r2;
  mid(0, 1) = mid(1, 0) = 0.5 * (mid(0, 1) + mid(1, 0));
  const Eigen::Matrix2d invRoot = spectralMap(mid, [](double l) { return 1.0 / std::sqrt(l); });
  return Eigen::Matrix2d::Identity() - r2 * invRoot * r2;
}

}  // namespace barrow
