// A sweep as CSV: `#` comment lines recording every setting (family, range, steps, reference,
// frozen parameters, seed, threads, refinement, each column's unit as `# unit.<id>=length`), then the header
//   theta,<id>,...,d_<id>,...
// (values, then dD/dθ) and one row per θ in increasing order. A non-finite value is written
// `inf`; a failed one is left empty (its slope too). Common tools read it with comment='#'
// (pandas.read_csv, numpy.genfromtxt); an empty cell reads as NaN there.
#pragma once

#include <optional>
#include <string>
#include <vector>

#include "io/load_error.h"
#include "sweep/sweep_result.h"

namespace barrow {

/// The table part of the CSV as cells: the header, then one row per θ, each cell exactly as
/// the CSV writes it ("inf" for +∞, "" where failed). The report reuses it.
struct SweepTable {
  std::vector<std::string> columns;
  std::vector<std::vector<std::string>> rows;
};
SweepTable sweepTable(const SweepResult& r);

std::string formatSweepCsv(const SweepResult& r);
/// Atomic write; returns the reason on failure.
std::optional<std::string> writeSweepCsv(const std::string& path, const SweepResult& r);

/// Reads what formatSweepCsv writes (and any CSV with that header). Values come back with
/// status ok / infinite / invalid-input (empty cell); settings from the comment lines when
/// present. Errors name the file, the line and the field.
Loaded<SweepResult> parseSweepCsv(const std::string& text, const std::string& file);
Loaded<SweepResult> readSweepCsv(const std::string& path);

}  // namespace barrow
