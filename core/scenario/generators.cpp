#include "scenario/generators.h"

#include <cmath>
#include <random>
#include <stdexcept>

namespace barrow {

const std::vector<std::string>& shapeNames() {
  static const std::vector<std::string> names = {"gaussian", "mixture", "ring",
                                                 "segment",  "square",  "arcs"};
  return names;
}

Cloud generate(const ShapeSpec& s, const std::string& name) {
  if (s.count < 1) throw std::invalid_argument("generator needs at least one point");
  std::mt19937_64 rng(s.seed);
  std::normal_distribution<double> gauss(0.0, 1.0);
  std::uniform_real_distribution<double> unif(0.0, 1.0);
  const double c = std::cos(s.angle), sn = std::sin(s.angle);
  auto rotate = [&](double x, double y) { return Eigen::Vector2d(c * x - sn * y, sn * x + c * y); };

  Eigen::MatrixX2d p(s.count, 2);
  for (int i = 0; i < s.count; ++i) {
    Eigen::Vector2d q;
    if (s.shape == "gaussian") {
      q = {s.spread * gauss(rng), s.spread * gauss(rng)};
    } else if (s.shape == "mixture") {
      // Three equal modes on a triangle of circumradius 2*spread, each of sd spread/3.
      const int k = i % 3;
      const double t = 2.0 * M_PI * k / 3.0 + s.angle;
      q = {2 * s.spread * std::cos(t) + s.spread / 3 * gauss(rng),
           2 * s.spread * std::sin(t) + s.spread / 3 * gauss(rng)};
    } else if (s.shape == "ring") {
      const double t = 2.0 * M_PI * unif(rng);
      q = {s.spread * std::cos(t), s.spread * std::sin(t)};
    } else if (s.shape == "segment") {
      q = rotate(s.spread * (2 * unif(rng) - 1), 0.0);
    } else if (s.shape == "square") {
      q = {s.spread * (2 * unif(rng) - 1), s.spread * (2 * unif(rng) - 1)};
    } else if (s.shape == "arcs") {
      // Two interleaved half-circles of radius spread, the second shifted and flipped.
      const double t = M_PI * unif(rng);
      q = (i % 2 == 0) ? rotate(s.spread * std::cos(t), s.spread * std::sin(t))
                       : rotate(s.spread * (1 - std::cos(t)), s.spread * (0.5 - std::sin(t)));
    } else {
      throw std::invalid_argument("unknown shape '" + s.shape + "'");
    }
    if (s.noise > 0 && s.shape != "gaussian" && s.shape != "mixture" && s.shape != "square")
      q += Eigen::Vector2d(s.noise * gauss(rng), s.noise * gauss(rng));
    p.row(i) = (q + s.center).transpose();
  }
  return Cloud(name, std::move(p));
}

}  // namespace barrow
