// The warm-start slot: solver state kept between calls on slightly moved clouds.
#pragma once

namespace barrow {

/// Solver state a measure may keep between calls on clouds of the same sizes (the network
/// simplex basis, Sinkhorn potentials). Each solver or measure defines its own subclass and
/// checks that a state it finds still fits before using it.
struct WarmState {
  virtual ~WarmState() = default;
};

}  // namespace barrow
