#include "critic_check/critic_check.h"

#include <algorithm>
#include <chrono>
#include <cmath>

#include "critic/mlp_gradients.h"

namespace barrow::critic {

Eigen::MatrixXd GridFrame::points() const {
  Eigen::MatrixXd p(2, Eigen::Index(nx) * ny);
  for (int r = 0; r < ny; ++r)
    for (int c = 0; c < nx; ++c) p.col(Eigen::Index(r) * nx + c) << x0 + c * dx, y0 + r * dy;
  return p;
}

GridFrame gridOver(const Cloud& a, const Cloud& b, int perSide) {
  Eigen::Vector2d lo = a.points.colwise().minCoeff().transpose().cwiseMin(b.points.colwise().minCoeff().transpose());
  Eigen::Vector2d hi = a.points.colwise().maxCoeff().transpose().cwiseMax(b.points.colwise().maxCoeff().transpose());
  const double extent = std::max((hi - lo).maxCoeff(), 1e-9);
  lo.array() -= 0.1 * extent;
  hi.array() += 0.1 * extent;
  GridFrame g;
  g.nx = g.ny = std::max(perSide, 2);
  g.x0 = lo.x();
  g.y0 = lo.y();
  g.dx = (hi.x() - lo.x()) / (g.nx - 1);
  g.dy = (hi.y() - lo.y()) / (g.ny - 1);
  return g;
}

namespace {

Eigen::MatrixXd asGrid(const Eigen::RowVectorXd& values, const GridFrame& g) {
  Eigen::MatrixXd m(g.ny, g.nx);
  for (int r = 0; r < g.ny; ++r)
    for (int c = 0; c < g.nx; ++c) m(r, c) = values[Eigen::Index(r) * g.nx + c];
  return m;
}

Eigen::RowVectorXd gradientNorms(const MlpParams& net, Activation act, const Eigen::MatrixXd& x) {
  return inputGradients(net, act, forward(net, act, x)).colwise().norm();
}

}  // namespace

Eigen::MatrixXd criticOnGrid(const MlpParams& net, Activation act, const GridFrame& g) {
  return asGrid(evaluate(net, act, g.points()), g);
}

Eigen::MatrixXd gradientNormOnGrid(const MlpParams& net, Activation act, const GridFrame& g) {
  return asGrid(gradientNorms(net, act, g.points()), g);
}

double weightedCorrelation(const Eigen::VectorXd& x, const Eigen::VectorXd& y, const Eigen::VectorXd& w) {
  const double total = w.sum();
  const double mx = x.dot(w) / total, my = y.dot(w) / total;
  const Eigen::ArrayXd dx = x.array() - mx, dy = y.array() - my;
  const double sxy = (w.array() * dx * dy).sum();
  const double sxx = (w.array() * dx * dx).sum();
  const double syy = (w.array() * dy * dy).sum();
  if (!(sxx > 0) || !(syy > 0)) return 0.0;
  return sxy / std::sqrt(sxx * syy);
}

CriticCheck checkCritic(const Cloud& a, const Cloud& b, const ExactReference& ref, const CriticSettings& s,
                        const RunControl* control, const TrainerState* warm,
                        const std::function<void(const CurvePoint&)>& onCurve) {
  const auto t0 = std::chrono::steady_clock::now();
  CriticCheck c;
  c.settings = s;
  c.w1 = ref.w1;
  TrainOutcome t = trainCritic(a, b, s, control, warm, onCurve);
  c.steps = t.steps;
  c.curve = std::move(t.curve);
  c.network = std::move(t.network);
  c.unitNetwork = std::move(t.unitNetwork);
  c.state = std::move(t.state);
  if (t.cancelled) {
    c.status = Status::Cancelled;
    c.message = "cancelled after " + std::to_string(t.steps) + " steps";
  } else if (t.diverged) {
    c.status = Status::NotConverged;
    c.message = "the weights became non-finite after " + std::to_string(t.steps) + " steps";
  } else {
    c.status = Status::Ok;
  }
  if (c.status == Status::Ok || c.status == Status::Cancelled) {
    const Activation act = s.shape.activation;
    c.estimate = fullEstimate(c.network, act, a, b);
    c.lipschitzUpper = lipschitzUpper(c.network);
    c.lowerBound = c.lipschitzUpper > 0 ? c.estimate / c.lipschitzUpper : 0.0;
    c.lipschitzGrid = gradientNorms(c.network, act, gridOver(a, b, s.grid).points()).maxCoeff();
    Eigen::MatrixXd data(2, a.size() + b.size());
    data << a.points.transpose(), b.points.transpose();
    const Eigen::RowVectorXd f = evaluate(c.network, act, data);
    c.lipschitzData = gradientNorms(c.network, act, data).maxCoeff();
    c.lipschitzMeasured = std::max(c.lipschitzGrid, c.lipschitzData);
    Eigen::VectorXd phi(data.cols()), w(data.cols());
    phi << ref.phiA, ref.phiB;
    w << 0.5 * a.normalizedWeights(), 0.5 * b.normalizedWeights();
    c.potentialCorrelation = weightedCorrelation(f.transpose(), phi, w);
  }
  c.seconds = std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count();
  return c;
}

}  // namespace barrow::critic
