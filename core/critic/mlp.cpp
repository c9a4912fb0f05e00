#include "critic/mlp.h"

#include <cmath>

#include "critic/random_stream.h"

namespace barrow::critic {

const char* activationName(Activation a) {
  switch (a) {
    case Activation::Relu: return "relu";
    case Activation::LeakyRelu: return "leaky_relu";
    case Activation::Tanh: return "tanh";
  }
  return "relu";
}

bool parseActivation(const std::string& word, Activation* out) {
  for (Activation a : {Activation::Relu, Activation::LeakyRelu, Activation::Tanh})
    if (word == activationName(a)) {
      *out = a;
      return true;
    }
  return false;
}

Eigen::MatrixXd activate(Activation a, const Eigen::MatrixXd& z) {
  switch (a) {
    case Activation::Relu: return z.cwiseMax(0.0);
    case Activation::LeakyRelu: return z.unaryExpr([](double v) { return v > 0 ? v : kLeakySlope * v; });
    case Activation::Tanh: return z.array().tanh().matrix();
  }
  return z;
}

Eigen::MatrixXd activateSlope(Activation a, const Eigen::MatrixXd& z) {
  switch (a) {
    case Activation::Relu: return z.unaryExpr([](double v) { return v > 0 ? 1.0 : 0.0; });
    case Activation::LeakyRelu: return z.unaryExpr([](double v) { return v > 0 ? 1.0 : kLeakySlope; });
    case Activation::Tanh: return (1.0 - z.array().tanh().square()).matrix();
  }
  return z;
}

Eigen::MatrixXd activateCurvature(Activation a, const Eigen::MatrixXd& z) {
  if (a != Activation::Tanh) return Eigen::MatrixXd::Zero(z.rows(), z.cols());
  const Eigen::ArrayXXd t = z.array().tanh();
  return (-2.0 * t * (1.0 - t.square())).matrix();
}

MlpParams MlpParams::zerosLike() const {
  MlpParams z;
  for (const auto& m : w) z.w.push_back(Eigen::MatrixXd::Zero(m.rows(), m.cols()));
  for (const auto& v : b) z.b.push_back(Eigen::VectorXd::Zero(v.size()));
  return z;
}

bool MlpParams::sameShape(const MlpParams& o) const {
  if (w.size() != o.w.size() || b.size() != o.b.size()) return false;
  for (std::size_t l = 0; l < w.size(); ++l)
    if (w[l].rows() != o.w[l].rows() || w[l].cols() != o.w[l].cols() || b[l].size() != o.b[l].size())
      return false;
  return true;
}

Eigen::Index MlpParams::count() const {
  Eigen::Index n = 0;
  for (std::size_t l = 0; l < w.size(); ++l) n += w[l].size() + b[l].size();
  return n;
}

void MlpParams::addScaled(const MlpParams& o, double s) {
  for (std::size_t l = 0; l < w.size(); ++l) {
    w[l] += s * o.w[l];
    b[l] += s * o.b[l];
  }
}

MlpParams initParams(const MlpShape& shape, std::uint64_t seed) {
  RandomStream rng(seed);
  MlpParams p;
  int in = 2;
  for (int l = 0; l <= shape.hidden; ++l) {
    const int out = l == shape.hidden ? 1 : shape.width;
    const double bound = 1.0 / std::sqrt(double(in));
    Eigen::MatrixXd w(out, in);
    for (Eigen::Index i = 0; i < w.size(); ++i) w.data()[i] = rng.uniform(-bound, bound);
    Eigen::VectorXd b(out);
    for (Eigen::Index i = 0; i < b.size(); ++i) b[i] = rng.uniform(-bound, bound);
    p.w.push_back(std::move(w));
    p.b.push_back(std::move(b));
    in = out;
  }
  return p;
}

ForwardCache forward(const MlpParams& p, Activation act, const Eigen::MatrixXd& x) {
  ForwardCache c;
  c.h.push_back(x);
  for (int l = 0; l < p.layers(); ++l) {
    Eigen::MatrixXd z = p.w[l] * c.h.back();
    z.colwise() += p.b[l];
    if (l + 1 < p.layers()) c.h.push_back(activate(act, z));
    c.z.push_back(std::move(z));
  }
  return c;
}

Eigen::RowVectorXd evaluate(const MlpParams& p, Activation act, const Eigen::MatrixXd& x) {
  Eigen::MatrixXd h = x;
  for (int l = 0; l < p.layers(); ++l) {
    Eigen::MatrixXd z = p.w[l] * h;
    z.colwise() += p.b[l];
    h = l + 1 < p.layers() ? activate(act, z) : std::move(z);
  }
  return h.row(0);
}

}  // namespace barrow::critic
