// Outcome of one evaluation, shared by every measure, the CLI and the GUI.
#pragma once

#include <string>

namespace barrow {

enum class Status {
  Ok,            // value is a finite number
  Infinite,      // value is +inf and that is the right answer (e.g. KL with disjoint support)
  NotConverged,  // iteration budget ran out; value is the last iterate, see the message
  InvalidInput,  // clouds or parameters rejected; the message says why
  Cancelled,     // the caller asked to stop
  Bracketed,     // the true value lies in the certified [low, high]; value is a point inside
                 // (Result::low/high; the measure's details say which point and by what rule)
};

/// The contract's spelling: "ok", "infinite", "not-converged", "invalid-input", "cancelled",
/// "bracketed".
const char* statusName(Status s);

/// True when the value means something (ok, infinite, the last iterate of a solver that
/// ran out of iterations, or a point of a certified bracket): the test every table, plot and file writer applies.
inline bool usable(Status s) {
  return s == Status::Ok || s == Status::Infinite || s == Status::NotConverged || s == Status::Bracketed;
}

}  // namespace barrow
