// A transport plan as CSV, the one format the CLI (`plan`) and the window's export share:
//   i,j,mass,ax,ay,bx,by,cost
// one nonzero per line, sorted by (i, j): i, j the 0-based data rows of A and B, mass under
// the normalised weights (summing to 1), both endpoints, and cost = |x_i − y_j|^p. Numbers
// in the shortest text that reads back to the same double.
#pragma once

#include <optional>
#include <string>
#include <vector>

#include "base/plan_entry.h"
#include "cloud/cloud.h"
#include "io/atomic_write.h"
#include "io/load_error.h"

namespace barrow {

struct PlanRow {
  int i = 0;
  int j = 0;
  double mass = 0.0;
  double ax = 0.0, ay = 0.0, bx = 0.0, by = 0.0;
  double cost = 0.0;
};

/// Entries outside the clouds are left out. p: the cost exponent (1 for w1, 2 for w2).
std::string formatPlanCsv(const Cloud& a, const Cloud& b, const std::vector<PlanEntry>& plan, double p);
/// Atomic write; returns the reason on failure.
std::optional<std::string> writePlanCsv(const std::string& path, const Cloud& a, const Cloud& b,
                                        const std::vector<PlanEntry>& plan, double p,
                                        const WriteFault* fault = nullptr);

/// Reads what formatPlanCsv writes; errors name the file, the line and the field.
Loaded<std::vector<PlanRow>> parsePlanCsv(const std::string& text, const std::string& file);
Loaded<std::vector<PlanRow>> readPlanCsv(const std::string& path);

}  // namespace barrow
