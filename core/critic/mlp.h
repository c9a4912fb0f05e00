// A small multilayer perceptron f: R² → R, the critic of the Lipschitz checks.
// Layers l = 0..L−1: z_l = W_l h_l + b_l, h_0 = x, h_{l+1} = σ(z_l) for l < L−1, f = z_{L−1}.
// Batches are column-major: a batch of n inputs is a 2 × n matrix, layer outputs d_l × n.
// Initialisation: W, b uniform in ±1/√fan_in, the usual default of a linear layer [CP] (mem).
#pragma once

#include <Eigen/Core>
#include <cstdint>
#include <string>
#include <vector>

namespace barrow::critic {

/// Hidden activations. All are 1-Lipschitz, so the product of the layers' spectral norms
/// bounds the network's Lipschitz constant [D].
enum class Activation { Relu, LeakyRelu, Tanh };

const char* activationName(Activation a);
/// "relu", "leaky_relu", "tanh"; false for another word.
bool parseActivation(const std::string& word, Activation* out);

/// σ, σ' and σ'' elementwise (σ'' is 0 almost everywhere for the piecewise-linear ones).
Eigen::MatrixXd activate(Activation a, const Eigen::MatrixXd& z);
Eigen::MatrixXd activateSlope(Activation a, const Eigen::MatrixXd& z);
Eigen::MatrixXd activateCurvature(Activation a, const Eigen::MatrixXd& z);
/// Slope of leaky_relu for z < 0.
inline constexpr double kLeakySlope = 0.2;

/// Weights and biases of every layer (also used for gradients and optimiser moments).
struct MlpParams {
  std::vector<Eigen::MatrixXd> w;  // w[l]: d_{l+1} × d_l
  std::vector<Eigen::VectorXd> b;  // b[l]: d_{l+1}

  int layers() const { return int(w.size()); }
  /// Same shapes, all zero.
  MlpParams zerosLike() const;
  bool sameShape(const MlpParams& o) const;
  Eigen::Index count() const;
  /// this += s·o (same shapes).
  void addScaled(const MlpParams& o, double s);
};

/// Shape of the network: `hidden` layers of `width` units between the input (2) and output (1).
struct MlpShape {
  int width = 64;
  int hidden = 2;
  Activation activation = Activation::Relu;
};

MlpParams initParams(const MlpShape& shape, std::uint64_t seed);

/// One forward pass over a batch, with what the backward passes need.
struct ForwardCache {
  std::vector<Eigen::MatrixXd> h;  // h[l]: input of layer l (h[0] = x), d_l × n
  std::vector<Eigen::MatrixXd> z;  // z[l]: pre-activation of layer l, d_{l+1} × n
  Eigen::RowVectorXd out() const { return z.back().row(0); }
};

ForwardCache forward(const MlpParams& p, Activation act, const Eigen::MatrixXd& x);
/// f at each column of x (no cache kept beyond the call).
Eigen::RowVectorXd evaluate(const MlpParams& p, Activation act, const Eigen::MatrixXd& x);

}  // namespace barrow::critic
