// The critic's hand-derived gradients (core/critic/mlp_gradients.h): the loss Σ c_k f(x_k)
// and the gradient penalty λ w Σ (‖∇ₓf‖ − 1)² including its second-order term, checked
// against central differences [D] and against torch.autograd with create_graph=True
// (Debian's python3-torch; REFERENCES "Critic" C5) for ReLU, leaky ReLU and tanh.
#include <gtest/gtest.h>

#include <cmath>
#include <nlohmann/json.hpp>
#include <sstream>

#include "critic/mlp_gradients.h"
#include "support/test_support.h"

namespace barrow::critic {
namespace {

struct Case {
  MlpParams p;
  Activation act;
  Eigen::MatrixXd x;      // loss inputs
  Eigen::RowVectorXd c;   // loss coefficients
  Eigen::MatrixXd xh;     // penalty inputs
  double lambda = 3.0, weight = 0.25;
};

Case makeCase(Activation act, std::uint64_t seed) {
  Case k;
  MlpShape s;
  s.width = 7;
  s.hidden = 2;
  s.activation = act;
  k.p = initParams(s, seed);
  k.act = act;
  std::srand(unsigned(seed));
  k.x = 1.5 * Eigen::MatrixXd::Random(2, 6);
  k.c = Eigen::RowVectorXd::Random(6);
  k.xh = 1.5 * Eigen::MatrixXd::Random(2, 5);
  return k;
}

double penaltyOnly(const Case& k, const MlpParams& p) {
  MlpParams g = p.zerosLike();
  return penaltyGradient(p, k.act, forward(p, k.act, k.xh), k.lambda, k.weight, &g);
}

double lossOnly(const Case& k, const MlpParams& p) { return k.c.dot(forward(p, k.act, k.x).out()); }

// Visits every weight and bias of p with a mutable reference and the matching gradient entry.
template <typename F>
void eachParam(MlpParams& p, const MlpParams& g, F f) {
  for (int l = 0; l < p.layers(); ++l) {
    for (Eigen::Index i = 0; i < p.w[l].size(); ++i) f(p.w[l].data()[i], g.w[l].data()[i]);
    for (Eigen::Index i = 0; i < p.b[l].size(); ++i) f(p.b[l].data()[i], g.b[l].data()[i]);
  }
}

void expectMatchesDifferences(const Case& k, bool penalty) {
  MlpParams g = penalty ? k.p.zerosLike() : linearGradient(k.p, k.act, forward(k.p, k.act, k.x), k.c);
  if (penalty) penaltyGradient(k.p, k.act, forward(k.p, k.act, k.xh), k.lambda, k.weight, &g);
  MlpParams q = k.p;
  const double h = 1e-6;
  int checked = 0;
  eachParam(q, g, [&](double& v, double analytic) {
    const double keep = v;
    v = keep + h;
    const double up = penalty ? penaltyOnly(k, q) : lossOnly(k, q);
    v = keep - h;
    const double down = penalty ? penaltyOnly(k, q) : lossOnly(k, q);
    v = keep;
    EXPECT_NEAR(analytic, (up - down) / (2 * h), 1e-7 * (1 + std::abs(analytic)));
    ++checked;
  });
  EXPECT_EQ(checked, int(k.p.count()));
}

TEST(CriticGradientsTest, LossGradientMatchesCentralDifferences) {
  for (Activation a : {Activation::Relu, Activation::LeakyRelu, Activation::Tanh})
    expectMatchesDifferences(makeCase(a, 11), false);
}

TEST(CriticGradientsTest, PenaltyGradientWithSecondOrderTermMatchesCentralDifferences) {
  for (Activation a : {Activation::Relu, Activation::LeakyRelu, Activation::Tanh})
    expectMatchesDifferences(makeCase(a, 12), true);
}

TEST(CriticGradientsTest, InputGradientMatchesCentralDifferences) {
  const Case k = makeCase(Activation::Tanh, 13);
  const Eigen::MatrixXd g = inputGradients(k.p, k.act, forward(k.p, k.act, k.xh));
  const double h = 1e-6;
  for (Eigen::Index col = 0; col < k.xh.cols(); ++col)
    for (int d = 0; d < 2; ++d) {
      Eigen::MatrixXd up = k.xh.col(col), down = up;
      up(d) += h;
      down(d) -= h;
      const double fd = (evaluate(k.p, k.act, up)(0) - evaluate(k.p, k.act, down)(0)) / (2 * h);
      EXPECT_NEAR(g(d, col), fd, 1e-8);
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

// [P] reference: torch.autograd.grad(..., create_graph=True) differentiates the input
// gradient's norm with respect to the weights (double back-propagation) in float64.
TEST(CriticGradientsTest, GradientsMatchTorchAutograd) {
  if (!test::pythonHas("torch")) GTEST_SKIP() << "python3-torch is not installed";
  for (Activation a : {Activation::Relu, Activation::LeakyRelu, Activation::Tanh}) {
    const Case k = makeCase(a, 21);
    std::ostringstream py;
    py << "import json, torch\ntorch.set_default_dtype(torch.float64)\n";
    py << "W = [";
    for (int l = 0; l < k.p.layers(); ++l) py << (l ? "," : "") << "torch.tensor(" << pyMatrix(k.p.w[l]) << ", requires_grad=True)";
    py << "]\nB = [";
    for (int l = 0; l < k.p.layers(); ++l)
      py << (l ? "," : "") << "torch.tensor(" << pyMatrix(k.p.b[l].transpose()) << "[0], requires_grad=True)";
    py << "]\n";
    py << "act = {'relu': torch.relu, 'tanh': torch.tanh, 'leaky_relu': lambda z: torch.nn.functional.leaky_relu(z, 0.2)}['"
       << activationName(a) << "']\n";
    py << "def f(x):\n  h = x\n  for l in range(len(W)):\n    z = h @ W[l].T + B[l]\n    h = act(z) if l + 1 < len(W) else z\n  return h[:, 0]\n";
    py << "x = torch.tensor(" << pyMatrix(k.x.transpose()) << ")\nc = torch.tensor(" << pyMatrix(k.c) << "[0])\n";
    py << "xh = torch.tensor(" << pyMatrix(k.xh.transpose()) << ", requires_grad=True)\n";
    py << "loss = (c * f(x)).sum()\ngl = torch.autograd.grad(loss, W + B)\n";
    py << "g = torch.autograd.grad(f(xh).sum(), xh, create_graph=True)[0]\n";
    py << "pen = " << k.lambda << " * " << k.weight << " * ((g.norm(dim=1) - 1) ** 2).sum()\n";
    // Biases that ∇ₓf does not depend on come back as None: zero gradients.
    py << "gp = [t if t is not None else torch.zeros_like(p) for t, p in zip(torch.autograd.grad(pen, W + B, allow_unused=True), W + B)]\n";
    py << "print(json.dumps({'loss': [t.tolist() for t in gl], 'pen': [t.tolist() for t in gp], 'value': pen.item(), "
          "'input': g.detach().tolist()}))\n";
    const std::string out = test::runPython(py.str());
    ASSERT_FALSE(out.empty());
    const auto js = nlohmann::json::parse(out);

    const MlpParams gl = linearGradient(k.p, a, forward(k.p, a, k.x), k.c);
    MlpParams gp = k.p.zerosLike();
    const ForwardCache ch = forward(k.p, a, k.xh);
    const double pen = penaltyGradient(k.p, a, ch, k.lambda, k.weight, &gp);
    EXPECT_NEAR(pen, js["value"].get<double>(), 1e-12 * (1 + pen));
    const Eigen::MatrixXd gin = inputGradients(k.p, a, ch);
    for (Eigen::Index c = 0; c < gin.cols(); ++c)
      for (int d = 0; d < 2; ++d) EXPECT_NEAR(gin(d, c), js["input"][c][d].get<double>(), 1e-12);
    const int L = k.p.layers();
    for (const auto& [name, mine] : {std::pair<const char*, const MlpParams*>{"loss", &gl}, {"pen", &gp}}) {
      for (int l = 0; l < L; ++l) {
        const auto& tw = js[name][l];
        for (Eigen::Index r = 0; r < mine->w[l].rows(); ++r)
          for (Eigen::Index c = 0; c < mine->w[l].cols(); ++c)
            EXPECT_NEAR(mine->w[l](r, c), tw[r][c].get<double>(), 1e-11) << name << " W" << l << " " << activationName(a);
        const auto& tb = js[name][L + l];
        for (Eigen::Index r = 0; r < mine->b[l].size(); ++r)
          EXPECT_NEAR(mine->b[l](r), tb[r].get<double>(), 1e-11) << name << " b" << l << " " << activationName(a);
      }
    }
  }
}

}  // namespace
}  // namespace barrow::critic
