// Seeded generators for common cloud shapes (the GUI's generator menu, samples, tests).
#pragma once

#include <Eigen/Core>
#include <cstdint>
#include <string>
#include <vector>

#include "cloud/cloud.h"

namespace barrow {

struct ShapeSpec {
  std::string shape = "gaussian";  // gaussian|mixture|ring|segment|square|arcs
  int count = 200;                 // points, >= 1
  Eigen::Vector2d center{0.0, 0.0};
  double spread = 1.0;             // scale of the shape (sd, radius, half-length, half-side)
  double angle = 0.0;              // orientation in radians (segment, arcs)
  double noise = 0.0;              // extra Gaussian jitter (ring, segment, arcs), same units
  std::uint64_t seed = 1;
};

/// The shapes generate() knows, in menu order.
const std::vector<std::string>& shapeNames();

/// Uniform weights. Deterministic for a given spec on a given standard library.
/// Pre: shape is one of shapeNames(), count >= 1.
Cloud generate(const ShapeSpec& spec, const std::string& name);

}  // namespace barrow
